import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, test } from 'vitest';
import { guessMapping } from '@/lib/imports/guess-mapping';
import { parseSpreadsheet } from '@/lib/imports/parse-spreadsheet';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';
import { DEMO_COMPOUNDS, DEMO_TARGETS } from '@/scripts/demo-plates/demo-compounds';
import { makeDemoPlate } from '@/scripts/demo-plates/make-demo-plate';
import { PLATE_PLANS } from '@/scripts/demo-plates/plate-plans';

const DATA = path.join(process.cwd(), 'seeders', 'data', 'demo-plates');
const OPTIONS = {
  knownCompounds: DEMO_COMPOUNDS.map((c) => c.identifier),
  knownTargets: Object.keys(DEMO_TARGETS),
};

// Generate → write → parse in the worker → guess the mapping → validate: every well comes back with the generator's values.
describe.each(PLATE_PLANS.map((plan) => [plan.file, plan] as const))('demo plate %s', (file, plan) => {
  const demo = makeDemoPlate(plan);

  test('round-trips every well and readout', async () => {
    const parsed = await parseSpreadsheet(demo.bytes, file);
    if (!parsed.ok) throw new Error(parsed.error.message);
    const sheet = parsed.sheets.find((s) => s.name === demo.manifest.dataSheet);
    expect(sheet).toBeDefined();
    const preview = validatePlateSheet(sheet!, guessMapping(sheet!).mapping, OPTIONS);
    expect(preview.issues).toEqual([]);
    expect(preview.ok).toBe(true);
    expect(preview.plate).toMatchObject({
      format: plan.format,
      formatSource: 'inferred',
      targets: [plan.target],
    });
    expect(preview.plate?.wells).toEqual(
      demo.wells.map((well) => ({
        position: well.position,
        rowIndex: well.rowIndex,
        columnIndex: well.columnIndex,
        role: well.role,
        compound: well.compound,
        concentration_uM: well.concentration_uM,
        sealResistance_GOhm: well.sealResistance_GOhm,
        seriesResistance_MOhm: well.seriesResistance_MOhm,
        capacitance_pF: well.capacitance_pF,
        readouts: [
          {
            target: well.target,
            controlCurrent_pA: well.controlCurrent_pA,
            compoundCurrent_pA: well.compoundCurrent_pA,
            row: expect.any(Number),
          },
        ],
      })),
    );
  });

  test('has vehicle, reference and the planned failing wells', () => {
    const roles = new Set(demo.wells.map((well) => well.role));
    expect(roles).toEqual(new Set(['vehicle', 'reference', 'test']));
    expect(
      demo.wells
        .filter((well) => well.failure)
        .map((well) => well.position)
        .sort(),
    ).toEqual(plan.failures.map((f) => f.well).sort());
    expect(demo.manifest.truth.map((t) => t.compound)).toEqual(plan.compounds);
  });

  test('the committed file and manifest match the generator', () => {
    expect(
      Buffer.compare(readFileSync(path.join(DATA, file)), demo.bytes),
      'regenerate with npx tsx scripts/make-demo-plates.ts',
    ).toBe(0);
    expect(JSON.parse(readFileSync(path.join(DATA, `${file}.manifest.json`), 'utf8'))).toEqual(demo.manifest);
  });
});

test('the same seed gives the same plate; failing wells fail as planned', () => {
  const [plan] = PLATE_PLANS;
  const first = makeDemoPlate(plan!);
  expect(makeDemoPlate(plan!).bytes).toEqual(first.bytes);
  const byWell = new Map(first.wells.map((well) => [well.position, well]));
  // Thresholds the demo aims past: seal 0.5 GΩ, |control| 200 pA, series 25 MΩ (lib/science/qc/qc-thresholds.ts defaults).
  expect(byWell.get('B03')!.sealResistance_GOhm).toBeLessThan(0.5);
  expect(Math.abs(byWell.get('E05')!.controlCurrent_pA!)).toBeLessThan(200);
  expect(byWell.get('G08')!.seriesResistance_MOhm).toBeGreaterThan(25);
  expect(byWell.get('C10')!.capacitance_pF).toBeNull();
  const healthy = first.wells.filter((well) => !well.failure);
  expect(Math.min(...healthy.map((well) => well.sealResistance_GOhm!))).toBeGreaterThanOrEqual(0.5);
  expect(Math.min(...healthy.map((well) => Math.abs(well.controlCurrent_pA!)))).toBeGreaterThanOrEqual(200);
  expect(Math.max(...healthy.map((well) => well.seriesResistance_MOhm!))).toBeLessThanOrEqual(25);
});
