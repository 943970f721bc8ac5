import 'server-only';
import pg from 'pg';
import { Sequelize } from 'sequelize';
import { backgroundPriority, lowerBackendPriority } from '@/lib/jobs/background-priority';
import { initModels } from '@/models';
import { env } from './env';

// Numeric and bigint columns come back as JavaScript numbers (ids of audit rows stay far below 2^53).
pg.types.setTypeParser(pg.types.builtins.INT8, (value: string) => Number(value));

const globalForDb = globalThis as unknown as { gatewellSequelize?: Sequelize };
let modelsReady = false;

function connect(): Sequelize {
  return new Sequelize(env().DATABASE_URL, {
    dialect: 'postgres',
    dialectModule: pg,
    logging: false,
    // No JIT compilation: it adds tens of ms to the pages' short queries (PostgreSQL 15 manual, 32.2 "When to JIT?").
    dialectOptions: { options: '-c jit=off' },
    pool: { max: 10, min: 0, idle: 10_000, acquire: 30_000 },
    define: { underscored: true },
    // A job worker at a background priority puts its database sessions there too (lib/jobs/background-priority.ts).
    hooks: {
      afterConnect: async (connection) => {
        const priority = backgroundPriority();
        if (priority !== null) await lowerBackendPriority(connection as pg.Client, priority);
      },
    },
  });
}

/**
 * The one Sequelize instance, kept on globalThis so that hot reload and Next's separate server bundles
 * share one pool. Each bundle has its own copy of the model classes, so each copy is registered here.
 */
export function db(): Sequelize {
  globalForDb.gatewellSequelize ??= connect();
  if (!modelsReady) {
    initModels(globalForDb.gatewellSequelize);
    modelsReady = true;
  }
  return globalForDb.gatewellSequelize;
}
