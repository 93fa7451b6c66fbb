import { NextResponse } from 'next/server';
import { config } from '@/app/_lib/config';
import { getOrm } from '@/app/_lib/db';
import { setSecurityHeaders } from '@/app/_lib/security-headers';

export const dynamic = 'force-dynamic';

/** Liveness and schema check: 200 {"db":"ok","migrations":"current"}, or 503 with the reason. */
export async function GET() {
  const res = await check();
  setSecurityHeaders(res.headers, config.appUrl);
  return res;
}

async function check() {
  try {
    const orm = await getOrm();
    await orm.em.getConnection().execute('select 1');
    const pending = await orm.getMigrator().getPendingMigrations();
    if (pending.length) {
      return NextResponse.json(
        { db: 'ok', migrations: 'pending', reason: `${pending.length} migration(s) not applied: ${pending.map((m) => m.name).join(', ')}` },
        { status: 503 },
      );
    }
    return NextResponse.json({ db: 'ok', migrations: 'current' });
  } catch (e) {
    const reason = e instanceof Error ? e.message.split('\n')[0] : 'unknown error';
    return NextResponse.json({ db: 'unavailable', reason }, { status: 503 });
  }
}
