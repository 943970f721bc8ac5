// scripts/import-plate.ts (and Gatewell's other tsx scripts) as a child process, as a user runs them:
// a fresh Node process with the app's conditions, in the repository, with this test's environment.
import { spawnSync } from 'node:child_process';
import { join, resolve } from 'node:path';

export const ROOT = resolve(__dirname, '../..');

/** Each run is a fresh Node process that compiles its TypeScript: several seconds on a busy machine. */
export const SCRIPT_TIMEOUT_MS = 120_000;

export interface ScriptRun {
  code: number | null;
  stdout: string;
  stderr: string;
}

/**
 * Runs `scripts/NAME.ts` with `args` and waits for it. `offline`: no database settings in its environment
 * (DATABASE_URL and DATABASE_OWNER_URL removed), so a run that needs the database cannot reach it.
 */
export function runScript(
  args: readonly string[],
  options: { script?: string; offline?: boolean; timeoutMs?: number } = {},
): ScriptRun {
  const env = { ...process.env };
  if (options.offline) {
    delete env.DATABASE_URL;
    delete env.DATABASE_OWNER_URL;
  }
  const out = spawnSync(
    process.execPath,
    [
      '--conditions=react-server',
      '--import',
      'tsx',
      join(ROOT, 'scripts', `${options.script ?? 'import-plate'}.ts`),
      ...args,
    ],
    { encoding: 'utf8', cwd: ROOT, env, timeout: options.timeoutMs ?? SCRIPT_TIMEOUT_MS },
  );
  return { code: out.status, stdout: out.stdout, stderr: out.stderr };
}
