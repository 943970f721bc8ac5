import 'server-only';
import { readdir } from 'node:fs/promises';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';

/** What the health check reports: database connectivity and migration state. */
export type HealthReport =
  | {
      status: 'ok' | 'migrations_pending';
      database: { connected: true; latencyMs: number };
      migrations: { applied: number; pending: string[]; latest: string | null };
    }
  | { status: 'database_unreachable'; database: { connected: false }; migrations: null };

// SQL: SequelizeMeta is sequelize-cli's own table of applied migrations, with no model of Gatewell's.
async function appliedMigrations(): Promise<string[]> {
  const rows = await db().query<{ name: string }>('select name from "SequelizeMeta" order by name', {
    type: QueryTypes.SELECT,
  });
  return rows.map((row) => row.name);
}

/** Whether the database answers (and how fast) and which migration files it has not applied yet. */
export async function checkHealth(): Promise<HealthReport> {
  const started = performance.now();
  try {
    const names = await appliedMigrations();
    const latencyMs = Math.round((performance.now() - started) * 10) / 10;
    const applied = new Set(names);
    const files = (await readdir(path.join(process.cwd(), 'migrations')))
      .filter((name) => name.endsWith('.js'))
      .sort();
    const pending = files.filter((name) => !applied.has(name));
    return {
      status: pending.length === 0 ? 'ok' : 'migrations_pending',
      database: { connected: true, latencyMs },
      migrations: { applied: applied.size, pending, latest: names.at(-1) ?? null },
    };
  } catch (error) {
    console.error('health check failed', error);
    return { status: 'database_unreachable', database: { connected: false }, migrations: null };
  }
}
