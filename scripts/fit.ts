// Gatewell fit CLI: `npx tsx scripts/fit.ts FILE.json` fits one concentration–block curve and prints JSON.
// Input: {"model": "hill2" | "hill4" (default hill2), "points": [{"concentration_uM": number ≥ 0, "block": number}]}.
// Exit 0 with the fit (whatever its status), 1 for input that cannot be read or is invalid, 2 for wrong usage.
import { z } from 'zod';
import { readCliInput } from './cli-input';
import { fitHill, type HillFitResult } from '../lib/science/fit/hill-fit';

const pointSchema = z.strictObject({
  concentration_uM: z.number({ error: 'must be a number (µM)' }).nonnegative({ error: 'must be ≥ 0 µM' }),
  block: z.number({ error: 'must be a number (fractional block)' }),
});

const inputSchema = z.strictObject({
  model: z.enum(['hill2', 'hill4'], { error: "must be 'hill2' or 'hill4'" }).default('hill2'),
  points: z
    .array(pointSchema, { error: 'must be a list of points' })
    .min(1, { error: 'must hold at least one point' }),
});

function main(argv: readonly string[]): number {
  const parsed = readCliInput('fit', argv, inputSchema);
  if (!parsed.ok) return parsed.exitCode;
  const { model, points } = parsed.data;
  const result = fitHill(
    { concentration_uM: points.map((p) => p.concentration_uM), block: points.map((p) => p.block) },
    { model },
  );
  process.stdout.write(`${JSON.stringify(toOutput(result), null, 2)}\n`);
  return 0;
}

/** The CLI's output format (snake_case keys, null where a value does not exist). */
function toOutput(result: HillFitResult) {
  return {
    status: result.status,
    ic50_uM: result.ic50_uM,
    ic50_ci95_uM: result.ic50Ci95_uM,
    log10_ic50_se: result.log10Ic50Se,
    hill: result.hillSlope,
    top: result.top,
    bottom: result.bottom,
    r2: result.r2,
    n: result.n,
    message: [result.message, ...result.flags.map((f) => f.message)].join(' '),
  };
}

process.exitCode = main(process.argv.slice(2));
