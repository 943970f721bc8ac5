import pg from 'pg';

// Forces the interleaving of a race: a transaction on a connection of its own (the app's role, as the
// requests) takes a lock the racing requests need, the test starts them, waits until PostgreSQL shows each
// of them waiting on a lock (pg_stat_activity, pg_blocking_pids), and only then releases.

export interface LockWaiter {
  pid: number;
  /** pg_stat_activity.wait_event: 'transactionid' or 'tuple' for a row lock, 'advisory', 'relation'. */
  waitEvent: string;
  /** The sessions holding what it waits for. */
  blockedBy: number[];
}

export interface LockHolder {
  /** The holder's own backend pid. */
  pid: number;
  /** Waits until `count` other sessions of this database wait on a lock (`timeoutMs`, 10 s unless given, else throws). */
  waiters(count: number, timeoutMs?: number): Promise<LockWaiter[]>;
  /** Ends the holding transaction (commit), letting the waiters through. */
  release(): Promise<void>;
}

/** Opens a transaction as the app's role and runs `statements` in it; the locks they take are held. */
export async function holdLocks(statements: { sql: string; params?: unknown[] }[]): Promise<LockHolder> {
  const client = new pg.Client({
    connectionString: process.env.DATABASE_URL,
    application_name: 'gatewell-test-lock-holder',
  });
  await client.connect();
  const pid = (await client.query<{ pid: number }>('select pg_backend_pid() as pid')).rows[0]!.pid;
  await client.query('begin');
  for (const { sql, params } of statements) await client.query(sql, params);
  let released = false;
  return {
    pid,
    async waiters(count, timeoutMs = 10_000) {
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        // Inside a transaction PostgreSQL keeps one snapshot of pg_stat_activity: drop it for a fresh view.
        await client.query('select pg_stat_clear_snapshot()');
        const { rows } = await client.query<LockWaiter>(
          `select pid, wait_event as "waitEvent", pg_blocking_pids(pid) as "blockedBy"
             from pg_stat_activity
            where datname = current_database() and wait_event_type = 'Lock' and pid <> pg_backend_pid()
            order by pid`,
        );
        if (rows.length >= count) return rows;
        if (Date.now() > deadline) {
          await client.query('select pg_stat_clear_snapshot()');
          const activity = await client.query(
            `select pid, state, wait_event_type, wait_event, left(query, 80) as query from pg_stat_activity where datname = current_database()`,
          );
          throw new Error(
            `expected ${count} sessions waiting on a lock, saw ${rows.length}: ${JSON.stringify(activity.rows)}`,
          );
        }
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
    },
    async release() {
      if (released) return;
      released = true;
      try {
        await client.query('commit');
      } finally {
        await client.end();
      }
    },
  };
}
