// The input side of Gatewell's JSON command-line tools (fit, forecast): one FILE.json argument, read,
// parsed and checked with a zod schema, with faults named by their path. Exit codes: 1 invalid, 2 usage.
// readJsonFile serves other JSON inputs (scripts/import-plate.ts --mapping FILE.json).
import { readFileSync } from 'node:fs';
import type { z } from 'zod';

export type CliInput<T> = { ok: true; data: T } | { ok: false; exitCode: number };

/** A zod issue path as the user wrote it, e.g. points[3].block, block.gNa, or (top level). */
export function issuePath(path: readonly PropertyKey[]): string {
  if (path.length === 0) return '(top level)';
  return path
    .map((key, i) => (typeof key === 'number' ? `[${key}]` : `${i > 0 ? '.' : ''}${String(key)}`))
    .join('');
}

/** A JSON file read and checked with a zod schema; on a fault, why (the faults named by their path). */
export function readJsonFile<Schema extends z.ZodType>(
  file: string,
  schema: Schema,
  what = 'input',
): { ok: true; data: z.infer<Schema> } | { ok: false; message: string } {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    return {
      ok: false,
      message: `cannot read ${file}: ${(error as NodeJS.ErrnoException).code ?? String(error)}`,
    };
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return { ok: false, message: `${file} is not valid JSON: ${(error as Error).message}` };
  }
  const parsed = schema.safeParse(json);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issuePath(issue.path)}: ${issue.message}`);
    return { ok: false, message: `invalid ${what} in ${file}:\n${lines.join('\n')}` };
  }
  return { ok: true, data: parsed.data };
}

/**
 * Reads the one FILE.json argument of tool `name` and checks it; on a fault writes why to stderr.
 * `usageDetail` (lines) follows the usage line on wrong usage.
 */
export function readCliInput<Schema extends z.ZodType>(
  name: string,
  argv: readonly string[],
  schema: Schema,
  usageDetail?: string,
): CliInput<z.infer<Schema>> {
  if (argv.length !== 1) {
    process.stderr.write(
      `usage: npx tsx scripts/${name}.ts FILE.json${usageDetail ? `\n${usageDetail}` : ''}\n`,
    );
    return { ok: false, exitCode: 2 };
  }
  const read = readJsonFile(argv[0]!, schema);
  if (read.ok) return read;
  process.stderr.write(`${name}: ${read.message}\n`);
  return { ok: false, exitCode: 1 };
}
