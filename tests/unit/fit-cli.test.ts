// scripts/fit.ts end to end: valid input prints the fit as JSON, invalid input names the fault.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';

const root = resolve(__dirname, '../..');
const tsx = join(root, 'node_modules', '.bin', 'tsx');
const dir = mkdtempSync(join(tmpdir(), 'gatewell-fit-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(content: string | null, name = 'input.json') {
  const file = join(dir, name);
  if (content !== null) writeFileSync(file, content);
  const out = spawnSync(tsx, [join(root, 'scripts', 'fit.ts'), file], { encoding: 'utf8', cwd: root });
  return { code: out.status, stdout: out.stdout, stderr: out.stderr };
}

const KEYS = [
  'status',
  'ic50_uM',
  'ic50_ci95_uM',
  'log10_ic50_se',
  'hill',
  'top',
  'bottom',
  'r2',
  'n',
  'message',
];

describe('fit CLI', () => {
  test('fits a curve and prints every field', () => {
    // Block = 1/(1 + 2/C), i.e. IC50 2 µM and Hill slope 1 (Hill equation, computed by hand).
    const points = [0.5, 1, 2, 4, 8, 16].map((c) => ({ concentration_uM: c, block: 1 / (1 + 2 / c) }));
    const { code, stdout } = run(JSON.stringify({ model: 'hill2', points }));
    expect(code).toBe(0);
    const result = JSON.parse(stdout);
    expect(Object.keys(result)).toEqual(KEYS);
    expect(result).toMatchObject({ status: 'fitted', top: 1, bottom: 0, n: 6 });
    expect(result.ic50_uM).toBeCloseTo(2, 6);
    expect(result.hill).toBeCloseTo(1, 6);
  });

  test('a curve with no fit prints nulls and the reason', () => {
    const { code, stdout } = run(
      JSON.stringify({
        points: [
          { concentration_uM: 1, block: 0.2 },
          { concentration_uM: 10, block: 0.7 },
        ],
      }),
    );
    expect(code).toBe(0);
    expect(JSON.parse(stdout)).toEqual({
      status: 'insufficient',
      ic50_uM: null,
      ic50_ci95_uM: null,
      log10_ic50_se: null,
      hill: null,
      top: null,
      bottom: null,
      r2: null,
      n: 2,
      message: '2 distinct concentrations in use; a hill2 fit needs at least 3.',
    });
  });

  test.each([
    ['not JSON', '{"model": "hill2",', 'is not valid JSON'],
    [
      'unknown model',
      '{"model":"hill3","points":[{"concentration_uM":1,"block":0.5}]}',
      "model: must be 'hill2' or 'hill4'",
    ],
    ['points missing', '{"model":"hill2"}', 'points: must be a list of points'],
    ['no points', '{"points":[]}', 'points: must hold at least one point'],
    [
      'text concentration',
      '{"points":[{"concentration_uM":1,"block":0.1},{"concentration_uM":"3","block":0.4}]}',
      'points[1].concentration_uM: must be a number (µM)',
    ],
    [
      'negative concentration',
      '{"points":[{"concentration_uM":-1,"block":0.1}]}',
      'points[0].concentration_uM: must be ≥ 0 µM',
    ],
    [
      'null block',
      '{"points":[{"concentration_uM":1,"block":0.1},{"concentration_uM":2,"block":0.2},{"concentration_uM":3,"block":null}]}',
      'points[2].block: must be a number (fractional block)',
    ],
    [
      'extra field',
      '{"points":[{"concentration_uM":1,"block":0.1,"well":"A1"}]}',
      'points[0]: Unrecognized key: "well"',
    ],
    ['top level is a list', '[1, 2]', '(top level):'],
  ])('%s: exit 1 and names the fault', (_case, content, message) => {
    const { code, stdout, stderr } = run(content);
    expect(code).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toContain(message);
  });

  test('a missing file: exit 1 and says it cannot be read', () => {
    const { code, stderr } = run(null, 'absent.json');
    expect(code).toBe(1);
    expect(stderr).toContain('cannot read');
    expect(stderr).toContain('ENOENT');
  });
});
