import { describe, expect, test } from 'vitest';

const baseUrl = process.env.EMBERLINE_URL ?? 'http://127.0.0.1:3000';

describe('GET /api/health', () => {
  // OWASP ASVS 4.0.3 V7.4.1 / V14.3.2: an anonymous caller learns no internals (common practice).
  test('answers ok, and nothing about the database or its migrations', async () => {
    const res = await fetch(`${baseUrl}/api/health`);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ ok: true });
  });
});
