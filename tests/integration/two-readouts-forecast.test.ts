// A plate read at two moments (tests/fixtures/two-readouts: tonic at the first pulse, use-dependent at the
// tenth) through to the forecast, the compound profile and the exports: the tonic fit gives Kr and the
// use-dependent fit Ki of the modulated receptor (Bean, Cohen & Tsien 1983, J Gen Physiol 81:613; from
// memory), forecast beside tonic block only. The expected values are the fits stored for the plate (read
// from the database, not from the forecast) and the physiology the paper predicts: a blocker with Ki below
// Kr lowers a firing cell's rate further than its tonic block alone (sign only, no published number).
import { QueryTypes } from 'sequelize';
import * as XLSX from 'xlsx';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { getCompoundProfile } from '@/lib/compounds/profile';
import { closeForecastPool } from '@/lib/compute/forecast-pool';
import { db } from '@/lib/db';
import { compoundExport } from '@/lib/exports/compound-export';
import { workbookBytes } from '@/lib/exports/document';
import { BLOCK_MODE_WORDS } from '@/lib/exports/forecast-rows';
import { plateExport } from '@/lib/exports/plate-export';
import { getPlateForecast } from '@/lib/forecasts/plate-forecast';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { FORECAST_CAUTION } from '@/lib/science/forecast/assemble';
import { addTarget, createScreen } from '@/lib/screens/service';
import { screenSchema } from '@/lib/validation/screens';
import { TWO_READOUT_MAPPING, twoReadoutExport } from '../fixtures/two-readouts/two-readout-export';
import { makeActor } from '../support/actors';
import { DEMO_SCREEN_SETTINGS, demoScreensSetup } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';

const sheetRows = (bytes: Buffer, name: string) =>
  XLSX.utils.sheet_to_json<unknown[]>(XLSX.read(bytes).Sheets[name]!, { header: 1, defval: null });

let biologist: Actor;
let plateId: string;
let compoundId: string;
/** GW-0001's stored fits on the plate, by target and readout. */
let fits: { target: string; readout: string; ic50: number }[];

beforeAll(async () => {
  const setup = await demoScreensSetup();
  biologist = setup.biologist;
  const admin = await makeActor(['admin']);
  // The fast-spiking preset, whose rate at the reference drive falls under Na inactivation shifts (the
  // regular-spiking one's rises a little: lib/science/neuron/README.md). Its gK has no inactivation gate.
  const screen = await createScreen(
    admin,
    screenSchema.parse({
      ...DEMO_SCREEN_SETTINGS,
      name: 'Use-dependence screen',
      neuronPreset: 'wang-buzsaki-1996',
      exposures_uM: '0.3, 1',
    }),
  );
  for (const [name, conductance] of [
    ['Nav1.7', 'gNa'],
    ['Kv7.2', 'gK'],
  ] as const)
    await addTarget(admin, screen.id, {
      name,
      conductance,
      description: '',
      tonicReadoutName: 'first pulse',
      useDependentReadoutName: '10th pulse',
    });
  const file = twoReadoutExport();
  const inspection = await inspectUpload(biologist, {
    screenId: screen.id,
    bytes: file.bytes,
    filename: file.filename,
    mediaType: 'text/csv',
  });
  const sheet = inspection.sheets[0]!.name;
  await previewImport(biologist, { draftId: inspection.draftId!, sheet, mapping: TWO_READOUT_MAPPING });
  ({ plateId } = await commitImport(biologist, {
    draftId: inspection.draftId!,
    sheet,
    mapping: TWO_READOUT_MAPPING,
    label: 'GWX-0201',
  }));
  await fitsCurrent(plateId);
  const [compound] = await db().query<{ id: string }>(
    `select id from compounds where identifier = 'GW-0001'`,
    { type: QueryTypes.SELECT },
  );
  compoundId = compound!.id;
  fits = await db().query(
    `select t.name as target, f.readout, f.ic50_um as ic50 from fits f join targets t on t.id = f.target_id
      where f.plate_id = :plateId and f.compound_id = :compoundId and f.status = 'fitted'`,
    { replacements: { plateId, compoundId }, type: QueryTypes.SELECT },
  );
});
afterAll(async () => {
  await closeForecastPool();
  await db().close();
});

const ic50 = (target: string, readout: string) =>
  fits.find((f) => f.target === target && f.readout === readout)!.ic50;

describe('two block readouts through to the forecast', () => {
  test('the plate forecast: tonic only beside state-dependent, Ki from the use-dependent fit', async () => {
    const forecast = await getPlateForecast(biologist, plateId, compoundId);
    expect(forecast.caution).toBe(FORECAST_CAUTION);
    const nav = forecast.targets.find((t) => t.target === 'Nav1.7')!;
    const kv = forecast.targets.find((t) => t.target === 'Kv7.2')!;
    expect(nav.ic50_uM).toBe(ic50('Nav1.7', 'tonic'));
    expect(nav.stateDependence).toMatchObject({
      readoutName: '10th pulse',
      inactivatedIc50_uM: ic50('Nav1.7', 'use_dependent'),
    });
    // gK of the fast-spiking preset has no inactivation gate: its use-dependent IC50 does not enter.
    expect(kv.stateDependence).toMatchObject({ inactivatedIc50_uM: null });
    const tonic = forecast.forecast!;
    const state = forecast.stateDependent!;
    expect(state.inputSha256).not.toBe(tonic.inputSha256);
    expect(state.caution).toBe(FORECAST_CAUTION);
    const control = tonic.control.measures.referenceRate_Hz!;
    expect(control).toBeGreaterThan(0);
    expect(state.control.measures.referenceRate_Hz).toBe(control);
    for (const c of [0.3, 1]) {
      const at = (f: typeof tonic) => f.conditions.find((x) => x.exposure && x.concentration_uM === c)!;
      // The same tonic block at the same concentration; GW-0001's Ki is about a twelfth of its Kr.
      expect(at(state).block).toEqual(at(tonic).block);
      expect(control - at(state).measures.referenceRate_Hz!).toBeGreaterThan(
        control - at(tonic).measures.referenceRate_Hz!,
      );
    }
  });

  test('the compound profile pairs both readouts and gives their ratio', async () => {
    const profile = await getCompoundProfile(biologist, compoundId);
    const nav = profile.useDependence.find((u) => u.tonic.target === 'Nav1.7')!;
    expect(nav.ratio).toBeCloseTo(ic50('Nav1.7', 'tonic') / ic50('Nav1.7', 'use_dependent'), 12);
    expect(profile.useDependence.map((u) => u.tonic.target).sort()).toEqual(['Kv7.2', 'Nav1.7']);
  });

  test('the exports carry the readout of every well and fit, and the forecast in both block modes', async () => {
    const { document } = await plateExport(biologist, plateId);
    const bytes = workbookBytes(document);
    const wells = sheetRows(bytes, 'Wells');
    const readoutColumn = wells[0]!.indexOf('Readout');
    expect(readoutColumn).toBe(5);
    const counts = new Map<unknown, number>();
    for (const r of wells.slice(1)) counts.set(r[readoutColumn], (counts.get(r[readoutColumn]) ?? 0) + 1);
    // 80 wells × 2 targets, once per readout.
    expect(Object.fromEntries(counts)).toEqual({ tonic: 160, 'use-dependent': 160 });
    const fitRows = sheetRows(bytes, 'Fits').filter((r) => r[0] === 'GW-0001' && r[1] === 'Nav1.7');
    expect(fitRows.map((r) => [r[2], r[6]])).toEqual([
      ['tonic (first pulse)', ic50('Nav1.7', 'tonic')],
      ['use-dependent (10th pulse)', ic50('Nav1.7', 'use_dependent')],
    ]);
    const forecast = sheetRows(bytes, 'Forecast at exposures');
    expect(forecast[0]![0]).toBe(`Caution: ${FORECAST_CAUTION}`);
    const header = forecast[2]!;
    const mode = header.indexOf('Block mode');
    const gw1 = forecast.slice(3).filter((r) => r[0] === 'GW-0001');
    expect(gw1.map((r) => `${r[3]} ${r[4]} ${r[mode]}`)).toEqual([
      `Control 0 ${BLOCK_MODE_WORDS.tonic}`,
      `Exposure 0.3 ${BLOCK_MODE_WORDS.tonic}`,
      `Exposure 1 ${BLOCK_MODE_WORDS.tonic}`,
      `Control 0 ${BLOCK_MODE_WORDS.stateDependent}`,
      `Exposure 0.3 ${BLOCK_MODE_WORDS.stateDependent}`,
      `Exposure 1 ${BLOCK_MODE_WORDS.stateDependent}`,
    ]);
    const potency = sheetRows(
      workbookBytes((await compoundExport(biologist, compoundId)).document),
      'Potency across plates',
    );
    const ratioColumn = potency[2]!.indexOf('Tonic IC50 ÷ use-dependent IC50');
    const navRows = potency.filter((r) => r[4] === 'Nav1.7');
    expect(navRows.map((r) => r[ratioColumn])).toEqual([
      ic50('Nav1.7', 'tonic') / ic50('Nav1.7', 'use_dependent'),
      ic50('Nav1.7', 'tonic') / ic50('Nav1.7', 'use_dependent'),
    ]);
  }, 240_000); // every compound's two forecasts are computed for the export
});
