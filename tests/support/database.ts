import { db } from '@/lib/db';
import { asSchemaOwner } from './schema-owner';

export { asSchemaOwner, ownerUrl } from './schema-owner';

/**
 * Empties every domain table of the test database and the waiting jobs, as the schema's owner: the app's
 * role may not truncate, and the audit trail only with its guard lifted.
 */
export async function resetDatabase(): Promise<void> {
  db(); // the app's connection and models, set up before the test uses them
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
