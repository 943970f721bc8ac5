import pg from 'pg';

// The schema owner's connection for test set-up the app's role may not do. No import of lib/ here:
// end-to-end helpers (tests/support/test-cluster.ts) use it too.

/** The schema owner's connection string (scripts/pg.sh owner-url), or the app's where one role does both. */
export function ownerUrl(): string {
  const url = process.env.DATABASE_OWNER_URL || process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_OWNER_URL or DATABASE_URL must be set for database tests');
  return url;
}

/** Runs work on a connection of its own as the schema's owner: test set-up that the app's role may not do. */
export async function asSchemaOwner<T>(work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: ownerUrl(), application_name: 'gatewell-test-owner' });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}
