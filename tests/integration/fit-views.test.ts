// The fits tab's curves on the real database: the fits answer carries each fit's curve basis (estimates and
// the tested range read from the plate's wells), from which the browser draws the curve over 121
// log-spaced points from a decade below its compound's lowest tested concentration to a decade above its
// highest; a fit without a fitted estimate has no basis and no curve.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { listPlateWells } from '@/lib/plates/detail';
import { listFitViews } from '@/lib/plates/fit-views';
import { fitCurve } from '@/lib/science/fit/hill-band';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { importDemoPlate } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';

describe('fit views', () => {
  let biologist: Actor;
  let plateId: string;

  beforeAll(async () => {
    await resetDatabase();
    const screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    biologist = await makeActor(['biologist']);
    plateId = await importDemoPlate(biologist, screens, 'nav-384-plate-02.xlsx');
  });
  afterAll(() => db().close());

  test('each fitted curve spans a decade either side of its compound’s tested concentrations', async () => {
    const wells = await listPlateWells(biologist, plateId);
    const tested = new Map<string, number[]>();
    for (const well of wells) {
      if (well.compoundId && well.concentration_uM && well.concentration_uM > 0)
        tested.set(well.compoundId, [...(tested.get(well.compoundId) ?? []), well.concentration_uM]);
    }
    const views = await listFitViews(biologist, plateId);
    const drawn = views.filter((v) => v.curveBasis !== null);
    expect(drawn.length).toBeGreaterThanOrEqual(5);
    for (const view of views) {
      if (view.status !== 'fitted' && view.status !== 'above_range') {
        expect(view.curveBasis).toBeNull();
        expect(fitCurve(view.model, view.curveBasis)).toEqual([]);
      }
    }
    for (const view of drawn) {
      const concentrations = tested.get(view.compoundId)!;
      expect(view.curveBasis!.lowest_uM).toBe(Math.min(...concentrations));
      expect(view.curveBasis!.highest_uM).toBe(Math.max(...concentrations));
      const curve = fitCurve(view.model, view.curveBasis);
      expect(curve).toHaveLength(121);
      expect(curve[0]!.concentration_uM).toBeCloseTo(Math.min(...concentrations) / 10, 9);
      expect(curve.at(-1)!.concentration_uM).toBeCloseTo(Math.max(...concentrations) * 10, 6);
    }
  });
});
