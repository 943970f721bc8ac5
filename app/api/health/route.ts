import { readdir } from 'node:fs/promises';
import path from 'node:path';
import { NextResponse } from 'next/server';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';

export const dynamic = 'force-dynamic';

/** Database connectivity and migration state, for operators and start-up scripts. No sign-in needed. */
export async function GET() {
  const started = performance.now();
  try {
    const rows = await db().query<{ name: string }>('select name from "SequelizeMeta" order by name', { type: QueryTypes.SELECT });
    const latencyMs = Math.round((performance.now() - started) * 10) / 10;
    const applied = new Set(rows.map((row) => row.name));
    const files = (await readdir(path.join(process.cwd(), 'migrations'))).filter((name) => name.endsWith('.js')).sort();
    const pending = files.filter((name) => !applied.has(name));
    const ok = pending.length === 0;
    return NextResponse.json(
      {
        status: ok ? 'ok' : 'migrations_pending',
        database: { connected: true, latencyMs },
        migrations: { applied: applied.size, pending, latest: rows.at(-1)?.name ?? null },
      },
      { status: ok ? 200 : 503 },
    );
  } catch (error) {
    console.error('health check failed', error);
    return NextResponse.json(
      { status: 'database_unreachable', database: { connected: false }, migrations: null },
      { status: 503 },
    );
  }
}
