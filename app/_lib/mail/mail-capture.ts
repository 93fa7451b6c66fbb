import 'server-only';
import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { config } from '../server/config';

export interface CapturedMail {
  id: string;
  date: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** `X-Emberline-Kind` of the message (see MailTags in mail.ts) */
  kind: string;
  /** `X-Emberline-Lab`: the lab that caused the message, or '' for account mail */
  labId: string;
}

/** Messages the local SMTP fake stored (scripts/smtp-fake.mjs), newest first. Demo mode only. */
export async function readCapturedMail(limit = 100): Promise<CapturedMail[]> {
  if (!config.mailCaptureDir) return [];
  let files: string[];
  try {
    files = (await readdir(config.mailCaptureDir)).filter((f) => f.endsWith('.json'));
  } catch {
    return [];
  }
  files.sort().reverse();
  const out: CapturedMail[] = [];
  for (const f of files.slice(0, limit)) {
    try {
      const m = JSON.parse(await readFile(path.join(config.mailCaptureDir, f), 'utf8')) as Partial<CapturedMail>;
      out.push({ ...(m as CapturedMail), kind: m.kind ?? '', labId: m.labId ?? '' });
    } catch {
      /* a message being written right now */
    }
  }
  return out;
}
