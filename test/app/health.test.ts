import { describe, expect, test } from 'vitest';

const baseUrl = process.env.EMBERLINE_URL ?? 'http://127.0.0.1:3000';

describe('GET /api/health', () => {
  test('reports the database reachable and every migration applied', async () => {
    const res = await fetch(`${baseUrl}/api/health`);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ db: 'ok', migrations: 'current' });
  });
});
