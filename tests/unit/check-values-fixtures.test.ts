// The outside check values in tests/fixtures/check-values: each file names its source, the README lists
// every file, and no test cites a values file that is not in the repository.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { describe, expect, test } from 'vitest';

const root = resolve(__dirname, '../..');
const folder = join(root, 'tests', 'fixtures', 'check-values');
const files = readdirSync(folder)
  .filter((name) => name !== 'README.md')
  .sort();

const STATUSES = [
  'published',
  'certified',
  'computed',
  'widely reproduced, no single source',
  'from memory',
  'common practice, no source',
];

async function sourceOf(name: string): Promise<unknown> {
  if (name.endsWith('.json'))
    return (JSON.parse(readFileSync(join(folder, name), 'utf8')) as { source?: unknown }).source;
  return ((await import(join(folder, name))) as { source?: unknown }).source;
}

describe('check-value fixtures', () => {
  test('the folder holds fixture files, JSON or TypeScript only', () => {
    expect(files.length).toBeGreaterThan(0);
    expect(files.filter((name) => !/\.(json|ts)$/.test(name))).toEqual([]);
  });

  test.each(files)('%s has a source with a status and a citation', async (name) => {
    const source = await sourceOf(name);
    expect(source).toMatchObject({ status: expect.any(String), citation: expect.any(String) });
    const { status, citation } = source as { status: string; citation: string };
    expect(STATUSES).toContain(status);
    expect(citation.trim().length).toBeGreaterThan(20);
  });

  test('the README lists every file, and only those', () => {
    const readme = readFileSync(join(folder, 'README.md'), 'utf8');
    const listed = [...readme.matchAll(/^\| `([^`]+)`\s*\|/gm)].map((m) => m[1]).sort();
    expect(listed).toEqual(files);
  });
});

test('no file under tests/ cites a check-values file outside the repository', () => {
  // The outside file's name in capitals (the fixture folder is in lower case); split so that this file
  // does not find itself.
  const outsideName = ['CHECK', 'VALUES'].join('-');
  const walk = (dir: string): string[] =>
    readdirSync(dir).flatMap((name) => {
      const path = join(dir, name);
      return statSync(path).isDirectory() ? walk(path) : [path];
    });
  const citing = walk(join(root, 'tests'))
    .filter((path) => /\.(ts|tsx|mts|js|mjs|json|md)$/.test(path))
    .filter((path) => readFileSync(path, 'utf8').includes(outsideName))
    .map((path) => relative(root, path));
  expect(citing).toEqual([]);
});
