import { NextResponse } from 'next/server';
import { config } from '@/app/_lib/server/config';
import { getOrm } from '@/app/_lib/server/db';
import { setSecurityHeaders } from '@/app/_lib/server/security-headers';

export const dynamic = 'force-dynamic';

/**
 * Liveness and schema check for load balancers and the lifecycle scripts: 200 `{"ok":true}`, or
 * 503 `{"ok":false}` when the database cannot be reached or a migration is not applied. The
 * reason goes to the server log only: an anonymous caller learns nothing about the database.
 */
export async function GET() {
  const res = await check();
  setSecurityHeaders(res.headers, config.appUrl);
  return res;
}

async function check() {
  const down = (reason: string) => {
    console.error(`health: not ok: ${reason}`);
    return NextResponse.json({ ok: false }, { status: 503, headers: { 'Cache-Control': 'no-store' } });
  };
  try {
    const orm = await getOrm();
    await orm.em.getConnection().execute('select 1');
    const pending = await orm.getMigrator().getPendingMigrations();
    if (pending.length) return down(`${pending.length} migration(s) not applied: ${pending.map((m) => m.name).join(', ')}`);
    return NextResponse.json({ ok: true }, { headers: { 'Cache-Control': 'no-store' } });
  } catch (e) {
    return down(e instanceof Error ? e.message.split('\n')[0] : 'unknown error');
  }
}
