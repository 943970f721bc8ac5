import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';

/** Empties every domain table of the test database (the audit trail only by TRUNCATE with its guard lifted) and the waiting jobs. */
export async function resetDatabase(): Promise<void> {
  const sequelize = db();
  const tables = await sequelize.query<{ tablename: string }>(
    `select tablename from pg_tables where schemaname = 'public' and tablename not in ('SequelizeMeta', 'sequelize_seeds')`,
    { type: QueryTypes.SELECT },
  );
  await sequelize.transaction(async (transaction) => {
    await sequelize.query('alter table audit_events disable trigger audit_events_no_truncate', { transaction });
    await sequelize.query(`truncate ${tables.map((t) => `"${t.tablename}"`).join(', ')} restart identity cascade`, { transaction });
    await sequelize.query('alter table audit_events enable trigger audit_events_no_truncate', { transaction });
    // Jobs still waiting on the queue belong to the rows just removed.
    const [queue] = await sequelize.query<{ present: boolean }>("select to_regclass('pgboss.job') is not null as present", { type: QueryTypes.SELECT, transaction });
    if (queue?.present) await sequelize.query("delete from pgboss.job where state in ('created', 'retry')", { transaction });
  });
}
