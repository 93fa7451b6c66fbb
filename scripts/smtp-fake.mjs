#!/usr/bin/env node
// A local SMTP fake for demo mode and tests: accepts every message on 127.0.0.1 and stores it
// as JSON (from, to, subject, text, html, and the app's X-Emberline-Kind / X-Emberline-Lab tags)
// in MAIL_CAPTURE_DIR. Never relays anything. Prints {"ready":true,"port":N} on stdout once it
// listens; with MAIL_ECHO=1 it also prints each message's recipient, subject and links on stderr,
// so whoever runs `npm start` can follow a sign-up or reset link sent to an address of theirs.
import { mkdirSync, writeFileSync, renameSync } from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

const dir = process.env.MAIL_CAPTURE_DIR;
if (!dir) {
  console.error('MAIL_CAPTURE_DIR is not set');
  process.exit(2);
}
mkdirSync(dir, { recursive: true });
const port = Number(process.env.SMTP_FAKE_PORT ?? 0);

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  size: 10 * 1024 * 1024,
  logger: false,
  onData(stream, session, done) {
    simpleParser(stream)
      .then((mail) => {
        const id = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomUUID().slice(0, 8)}`;
        const record = {
          id,
          date: new Date().toISOString(),
          from: mail.from?.text ?? session.envelope.mailFrom?.address ?? '',
          to: session.envelope.rcptTo.map((r) => r.address),
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          html: typeof mail.html === 'string' ? mail.html : '',
          kind: String(mail.headers.get('x-emberline-kind') ?? ''),
          labId: String(mail.headers.get('x-emberline-lab') ?? ''),
        };
        const tmp = path.join(dir, `.${id}.tmp`);
        writeFileSync(tmp, JSON.stringify(record, null, 2));
        renameSync(tmp, path.join(dir, `${id}.json`));
        if (process.env.MAIL_ECHO === '1') {
          const links = (record.text.match(/https?:\/\/\S+/g) ?? []).join(' ');
          console.error(`\x1b[2mmail to ${record.to.join(', ')}: ${record.subject}${links ? ` — ${links}` : ''}\x1b[0m`);
        }
        done();
      })
      .catch((e) => done(e));
  },
});
server.on('error', (e) => {
  console.error(`smtp fake: ${e.message}`);
  process.exit(1);
});
server.listen(port, '127.0.0.1', () => {
  console.log(JSON.stringify({ ready: true, port: server.server.address().port }));
});
const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
