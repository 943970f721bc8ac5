import { db } from '@/lib/db';
import { asSchemaOwner } from './schema-owner';

export { asSchemaOwner, ownerUrl } from './schema-owner';

/**
 * Empties every domain table of the test database and the waiting jobs, as the schema's owner: the app's
 * role may not truncate, and the audit trail only with its guard lifted.
 */
export async function resetDatabase(): Promise<void> {
  db(); // the app's connection and models, set up before the test uses them
  // A job of the previous test may still be writing (a fit, an import's stage) while the truncate takes its
  // locks table by table; PostgreSQL then ends one side with a deadlock (40P01). When the truncate is that
  // side, it is tried again once the job has had a moment to finish; any other error stops the test.
  for (let attempt = 1; ; attempt++) {
    try {
      return await truncateAll();
    } catch (error) {
      if ((error as { code?: string }).code !== '40P01' || attempt >= 3) throw error;
      await new Promise((resolve) => setTimeout(resolve, 200 * attempt));
    }
  }
}

/** One try at emptying every domain table and the waiting jobs, in one transaction. */
async function truncateAll(): Promise<void> {
  await asSchemaOwner(async (client) => {
    const tables = (
      await client.query<{ tablename: string }>(
        `select tablename from pg_tables where schemaname = 'public' and tablename not in ('SequelizeMeta', 'sequelize_seeds')`,
      )
    ).rows;
    await client.query('begin');
    try {
      await client.query('alter table audit_events disable trigger audit_events_no_truncate');
      await client.query(
        `truncate ${tables.map((t) => `"${t.tablename}"`).join(', ')} restart identity cascade`,
      );
      await client.query('alter table audit_events enable trigger audit_events_no_truncate');
      // Jobs still waiting on the queue belong to the rows just removed.
      const queue = await client.query<{ present: boolean }>(
        "select to_regclass('pgboss.job') is not null as present",
      );
      if (queue.rows[0]?.present)
        await client.query("delete from pgboss.job where state in ('created', 'retry')");
      await client.query('commit');
    } catch (error) {
      await client.query('rollback');
      throw error;
    }
  });
}
