import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { appOrigin, config } from '../server/config';

/**
 * What a message is, and for mail a lab caused, which lab: sent as headers (`X-Emberline-Kind`,
 * `X-Emberline-Lab`) so the demo mode's captured-mail page can show a lab only the mail it
 * caused itself. Account mail (`sign-up`, `account-exists`, `password-reset`) goes to a person,
 * never to a lab, and has no lab.
 */
export type MailTags = { kind: 'invitation' | 'review'; labId: string } | { kind: 'sign-up' | 'account-exists' | 'password-reset' };

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

export async function sendMail(to: string, content: MailContent, tags: MailTags): Promise<void> {
  const { subject, text, html } = renderMail(content);
  const headers: Record<string, string> = { 'X-Emberline-Kind': tags.kind };
  if ('labId' in tags) headers['X-Emberline-Lab'] = tags.labId;
  await transporter().sendMail({ from: config.mailFrom, to, subject, text, html, headers });
}

/**
 * Sends a message off the request path: the answer does not wait for the mail server (so it
 * takes the same time whether or not a message goes out) and a failure is logged, not shown.
 */
export function sendMailLater(to: string, content: MailContent, tags: MailTags): void {
  sendMail(to, content, tags).catch((e: unknown) => console.error(`mail (${tags.kind}) could not be sent:`, e instanceof Error ? e.message : e));
}

/** An absolute link into the app for e-mail: the configured origin, never a request header. */
export function appLink(pathAndQuery: string): string {
  return `${appOrigin()}${pathAndQuery}`;
}
