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

/**
 * The schema check (which reads the catalog) runs until it has once found every migration of this
 * build applied: they are applied before a server starts and are never undone under it, so after
 * that each check is one `select 1`, cheap enough for a load balancer asking every few seconds.
 */
const g = globalThis as typeof globalThis & { __emberlineSchemaCurrent?: boolean };

async function check() {
  const down = (reason: string) => {
    console.error(`health: not ok: ${reason}`);
    return NextResponse.json({ ok: false }, { status: 503, headers: { 'Cache-Control': 'no-store' } });
  };
  try {
    const orm = await getOrm();
    await orm.em.getConnection().execute('select 1');
    if (!g.__emberlineSchemaCurrent) {
      const pending = await orm.getMigrator().getPendingMigrations();
      if (pending.length) return down(`${pending.length} migration(s) not applied: ${pending.map((m) => m.name).join(', ')}`);
      g.__emberlineSchemaCurrent = true;
    }
    return NextResponse.json({ ok: true }, { headers: { 'Cache-Control': 'no-store' } });
  } catch (e) {
    return down(e instanceof Error ? e.message.split('\n')[0] : 'unknown error');
  }
}
