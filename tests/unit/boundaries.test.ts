// The layering rules of DEVELOPERS.md (Boundaries), proved to fire: each ESLint boundary rule refuses a
// deliberate violation written as scratch code in the folder it guards, the cycle and server-only checks
// find a scratch cycle and a scratch server module without the marker, and the real tree passes both.
import { mkdtempSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { ESLint } from 'eslint';
import { afterAll, describe, expect, test } from 'vitest';
import { findCycles, modulesMissingServerOnly, readImportGraph } from '@/scripts/import-graph';

const eslint = new ESLint({ cwd: process.cwd() });

async function lintScratch(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.resolve(filePath) });
  return (result?.messages ?? []).map((message) => `${message.ruleId}: ${message.message}`);
}

describe('ESLint boundary rules fire on scratch violations', () => {
  test.each([
    [
      'science imports app code by alias',
      'lib/science/scratch.ts',
      "import { db } from '@/lib/db';\nexport const x = db;\n",
      'import/no-restricted-paths',
    ],
    [
      'science imports app code by a relative path',
      'lib/science/scratch.ts',
      "import { db } from '../db';\nexport const x = db;\n",
      'import/no-restricted-paths',
    ],
    [
      'science imports a Node module',
      'lib/science/scratch.ts',
      "import { cpus } from 'node:os';\nexport const x = cpus;\n",
      'no-restricted-imports',
    ],
    [
      'science imports an unlisted package',
      'lib/science/scratch.ts',
      "import { Sequelize } from 'sequelize';\nexport const x = Sequelize;\n",
      'no-restricted-imports',
    ],
    [
      'a component imports a model',
      'components/scratch.tsx',
      "import { Plate } from '@/models';\nexport const x = Plate;\n",
      'import/no-restricted-paths',
    ],
    [
      'a component imports the database',
      'components/scratch.tsx',
      "import { db } from '@/lib/db';\nexport const x = db;\n",
      'import/no-restricted-paths',
    ],
    [
      'a component imports app code',
      'components/scratch.tsx',
      "import { signOutAction } from '@/app/(auth)/sign-in/actions';\nexport const x = signOutAction;\n",
      'import/no-restricted-paths',
    ],
    [
      'app code imports a model',
      'app/scratch.ts',
      "import { Plate } from '@/models';\nexport const x = Plate;\n",
      'import/no-restricted-paths',
    ],
    [
      'app code imports sequelize',
      'app/scratch.ts',
      "import { QueryTypes } from 'sequelize';\nexport const x = QueryTypes;\n",
      'no-restricted-imports',
    ],
    [
      'app code imports the database',
      'app/scratch.ts',
      "import { db } from '@/lib/db';\nexport const x = db;\n",
      'import/no-restricted-paths',
    ],
  ])('%s', async (_label, filePath, code, rule) => {
    const messages = await lintScratch(filePath, code);
    expect(messages.filter((message) => message.startsWith(`${rule}:`))).toHaveLength(1);
  });

  test('the same imports pass where they are allowed', async () => {
    expect(
      await lintScratch(
        'lib/plates/scratch.ts',
        "import 'server-only';\nimport { db } from '@/lib/db';\nexport const x = db;\n",
      ),
    ).toEqual([]);
    expect(
      await lintScratch(
        'lib/science/scratch.ts',
        "import { mean } from 'simple-statistics';\nexport const x = mean;\n",
      ),
    ).toEqual([]);
  });
});

describe('import graph checks', () => {
  const scratch = mkdtempSync(path.join(tmpdir(), 'gatewell-graph-'));
  afterAll(() => rmSync(scratch, { recursive: true, force: true }));

  test('a scratch cycle through a type import is found', async () => {
    mkdirSync(path.join(scratch, 'lib'), { recursive: true });
    writeFileSync(
      path.join(scratch, 'tsconfig.json'),
      JSON.stringify({ compilerOptions: { paths: { '@/*': ['./*'] } } }),
    );
    writeFileSync(
      path.join(scratch, 'lib/worker.ts'),
      "import { run } from './handler';\nexport type Progress = () => void;\nexport const go = run;\n",
    );
    writeFileSync(
      path.join(scratch, 'lib/handler.ts'),
      "import type { Progress } from '@/lib/worker';\nexport const run = (p: Progress) => p();\n",
    );
    const { tree } = await readImportGraph(scratch, ['lib/**/*.ts']);
    expect(findCycles(tree).map((cycle) => [...cycle].sort())).toEqual([['lib/handler.ts', 'lib/worker.ts']]);
  });

  test('a scratch server module without the marker is found', () => {
    const graph = new Map([
      ['lib/db.ts', []],
      ['lib/reader.ts', ['lib/db.ts']],
      ['lib/marked.ts', ['lib/reader.ts']],
      ['lib/pure.ts', []],
    ]);
    const sources: Record<string, string> = {
      'lib/db.ts': "import 'server-only';",
      'lib/reader.ts': 'export {};',
      'lib/marked.ts': "import 'server-only';",
      'lib/pure.ts': '',
    };
    expect(modulesMissingServerOnly(graph, (file: string) => sources[file]!)).toEqual(['lib/reader.ts']);
  });

  test('the tree has no import cycle and every server module is marked', async () => {
    const { tree, graph } = await readImportGraph();
    expect(graph.size).toBeGreaterThan(300);
    expect(findCycles(tree)).toEqual([]);
    expect(modulesMissingServerOnly(graph, (file: string) => readFileSync(file, 'utf8'))).toEqual([]);
  }, 180_000);
});
