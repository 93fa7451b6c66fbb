import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from './config';

export interface MailContent {
  subject: string;
  /** Paragraphs of plain text; the HTML part is built from the same words. */
  paragraphs: string[];
  action?: { label: string; url: string };
  footnote?: string;
}

let transport: Transporter | undefined;
function transporter(): Transporter {
  if (!config.smtpUrl) throw new Error('SMTP_URL is not set: e-mail cannot be sent');
  transport ??= nodemailer.createTransport(config.smtpUrl);
  return transport;
}

const escape = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** Renders the text and HTML parts in the product's style: warm paper, charcoal ink, an ember button. */
export function renderMail(c: MailContent): { subject: string; text: string; html: string } {
  const text = [
    ...c.paragraphs,
    ...(c.action ? [`${c.action.label}: ${c.action.url}`] : []),
    ...(c.footnote ? [c.footnote] : []),
    '— Emberline, the heater test workbench',
  ].join('\n\n');
  const html = `<!doctype html><html><body style="margin:0;background:#FBF7F1;font-family:Inter,Segoe UI,Arial,sans-serif;color:#1F1A17">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:#FBF7F1;padding:24px 0"><tr><td align="center">
<table role="presentation" width="560" cellpadding="0" cellspacing="0" style="max-width:560px;width:100%;background:#ffffff;border:1px solid #E4D9CB;border-radius:12px">
<tr><td style="background:#241E1B;border-radius:12px 12px 0 0;padding:16px 24px;color:#ffffff;font-size:18px;font-weight:600">
<span style="color:#F07F35">&#9679;</span> Emberline</td></tr>
<tr><td style="padding:24px">
<h1 style="margin:0 0 16px;font-size:20px;line-height:28px">${escape(c.subject)}</h1>
${c.paragraphs.map((p) => `<p style="margin:0 0 14px;font-size:15px;line-height:23px;color:#4A403A">${escape(p)}</p>`).join('\n')}
${c.action ? `<p style="margin:20px 0"><a href="${escape(c.action.url)}" style="display:inline-block;background:#B84E0C;color:#ffffff;text-decoration:none;font-weight:600;padding:10px 18px;border-radius:8px">${escape(c.action.label)}</a></p><p style="margin:0 0 14px;font-size:12px;color:#6B5E55;word-break:break-all">${escape(c.action.url)}</p>` : ''}
${c.footnote ? `<p style="margin:16px 0 0;font-size:12px;line-height:18px;color:#6B5E55">${escape(c.footnote)}</p>` : ''}
</td></tr></table>
<p style="font-size:12px;color:#6B5E55">Emberline, the heater test workbench</p>
</td></tr></table></body></html>`;
  return { subject: c.subject, text, html };
}

/** The header naming the lab a message is about; the demo mailbox of a lab shows only its own. */
export const LAB_HEADER = 'X-Emberline-Lab';

/**
 * Sends one message. `labId`: the lab the message is about (an invitation, a review notice), so
 * that the lab's demo mailbox shows it; account mail (reset links, sign-up) names no lab and is
 * shown in no lab's mailbox.
 */
export async function sendMail(to: string, content: MailContent, opts: { labId?: string } = {}): Promise<void> {
  const { subject, text, html } = renderMail(content);
  await transporter().sendMail({ from: config.mailFrom, to, subject, text, html, headers: opts.labId ? { [LAB_HEADER]: opts.labId } : {} });
}

/** The base URL for links in e-mail. */
export function linkBase(fallbackOrigin: string): string {
  return config.appUrl || fallbackOrigin;
}
