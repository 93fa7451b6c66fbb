import 'server-only';
import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { config } from './config';

export interface CapturedMail {
  id: string;
  date: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** the lab the message is about (its X-Emberline-Lab header), or null for account mail */
  lab: string | null;
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
      out.push(JSON.parse(await readFile(path.join(config.mailCaptureDir, f), 'utf8')) as CapturedMail);
    } catch {
      /* a message being written right now */
    }
  }
  return out;
}
