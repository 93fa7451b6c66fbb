import 'server-only';
import { createHash } from 'node:crypto';

/**
 * Server settings read from the environment once. In demo mode (`npm start` / `npm test`)
 * the lifecycle scripts supply every value; in production the operator does.
 */
export const config = {
  /** Demo mode: the in-app mail page exists and demo sign-ins are shown. */
  demo: process.env.EMBERLINE_DEMO === 'true',
  /** Public origin of the app, used in e-mail links and for the same-origin check. */
  appUrl: (process.env.APP_URL ?? '').replace(/\/$/, ''),
  smtpUrl: process.env.SMTP_URL ?? '',
  mailFrom: process.env.MAIL_FROM ?? 'Emberline <no-reply@emberline.invalid>',
  /** Folder where the local SMTP fake stores captured messages (demo mode only). */
  mailCaptureDir: process.env.MAIL_CAPTURE_DIR ?? '',
  /** Largest JSON body any route reads, in bytes. */
  maxJsonBytes: 64 * 1024,
  /** Trust the first X-Forwarded-For hop (behind a load balancer). */
  trustProxy: process.env.TRUST_PROXY !== 'false',
};

let secretKey: Uint8Array | undefined;

/** The HMAC key that signs session JWTs (SESSION_SECRET, at least 32 characters). */
export function sessionKey(): Uint8Array {
  if (secretKey) return secretKey;
  const secret = process.env.SESSION_SECRET ?? '';
  if (secret.length < 32) throw new Error('SESSION_SECRET must be set to at least 32 random characters');
  secretKey = new Uint8Array(createHash('sha256').update(secret).digest());
  return secretKey;
}
