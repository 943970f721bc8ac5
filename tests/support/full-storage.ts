import { execFileSync } from 'node:child_process';
import { closeSync, mkdirSync, openSync, rmdirSync, rmSync, writeSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';

// A real full disk under chosen tables of the test database: a small tmpfs is mounted (this needs root,
// as the test machines run), PostgreSQL gets a tablespace on it, the tables move there, and a filler
// file takes every free byte. PostgreSQL then meets ENOSPC when it extends those tables' files and
// refuses the statement with SQLSTATE 53100 (disk_full), as on a real disk that has filled up.

export interface FullStorage {
  /** Takes every free byte of the small file system. */
  fill(): void;
  /** Frees it again (removes the filler). */
  free(): void;
  /** Moves the given tables (and their TOAST tables) onto the small file system. */
  place(tables: string[]): Promise<void>;
  /** Moves every table back, drops the tablespace and unmounts. */
  remove(): Promise<void>;
}

/** The cluster's superuser over its socket (scripts/pg.sh: local connections are trusted). */
async function superuser(): Promise<pg.Client> {
  const url = new URL(process.env.DATABASE_URL!);
  const client = new pg.Client({
    host: path.join(process.cwd(), '.pgrun'),
    port: Number(url.port),
    user: 'postgres',
    database: url.pathname.slice(1),
  });
  await client.connect();
  return client;
}

export async function mountFullStorage(sizeKb = 1024): Promise<FullStorage> {
  const name = `gatewell_full_${new URL(process.env.DATABASE_URL!).port}`;
  const dir = path.join('/tmp', name);
  mkdirSync(dir, { recursive: true });
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', `size=${sizeKb}k,mode=700`, name, dir], { stdio: 'pipe' });
  } catch (error) {
    throw new Error(
      `could not mount a tmpfs at ${dir} (this test needs root): ${String((error as { stderr?: Buffer }).stderr ?? error)}`,
    );
  }
  execFileSync('chown', ['postgres:postgres', dir]);
  const filler = path.join(dir, 'filler');
  const admin = await superuser();
  const moved = new Set<string>();
  try {
    await admin.query(`create tablespace ${name} location '${dir}'`);
  } catch (error) {
    await admin.end();
    execFileSync('umount', [dir]);
    throw error;
  }
  return {
    fill() {
      const fd = openSync(filler, 'a');
      try {
        for (const size of [64 * 1024, 4096, 512, 1]) {
          const block = Buffer.alloc(size, 0x5a);
          for (;;) {
            try {
              if (writeSync(fd, block) < size) break;
            } catch (error) {
              if ((error as NodeJS.ErrnoException).code === 'ENOSPC') break;
              throw error;
            }
          }
        }
      } finally {
        closeSync(fd);
      }
    },
    free() {
      rmSync(filler, { force: true });
    },
    async place(tables) {
      for (const table of tables) {
        await admin.query(`alter table ${table} set tablespace ${name}`);
        moved.add(table);
      }
    },
    async remove() {
      rmSync(filler, { force: true });
      try {
        for (const table of moved) await admin.query(`alter table ${table} set tablespace pg_default`);
        await admin.query(`drop tablespace if exists ${name}`);
      } finally {
        await admin.end();
        execFileSync('umount', [dir]);
        rmdirSync(dir);
      }
    },
  };
}
