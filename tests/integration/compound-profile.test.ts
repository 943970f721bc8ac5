// A compound's profile across plates and screens on the real database: every fit with its plate's
// state, approved plates preferred for the potency per target, selectivity with bounds, and the forecast.
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { getCompoundProfile, getCompoundProfilePage } from '@/lib/compounds/profile';
import { db } from '@/lib/db';
import { getCompoundForecast } from '@/lib/forecasts/compound-forecast';
import { closeForecastPool } from '@/lib/compute/forecast-pool';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { importDemoPlate } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';

describe('compound profile', () => {
  let reader: Actor;
  const plates: Record<string, string> = {};
  const idOf = async (identifier: string) =>
    (
      await db().query<{ id: string }>('select id from compounds where identifier = :identifier', {
        type: QueryTypes.SELECT,
        replacements: { identifier },
      })
    )[0]!.id;

  beforeAll(async () => {
    await resetDatabase();
    const screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    const biologist = await makeActor(['biologist']);
    reader = await makeActor(['chemist']);
    for (const file of ['nav-96-plate-01.xlsx', 'kv-96-plate-01.csv', 'nav-96-plate-03-noisy.xlsx']) {
      plates[file] = await importDemoPlate(biologist, screens, file);
    }
    // Approval belongs to the sign-off workflow; here the state is set directly to test what the profile makes of it.
    await db().query("update plates set state = 'approved' where id = :id", {
      replacements: { id: plates['kv-96-plate-01.csv'] },
    });
  });
  afterAll(async () => {
    await closeForecastPool();
    await db().close();
  });

  test('every fit across plates and screens, approved plates marked and listed first', async () => {
    const profile = await getCompoundProfile(reader, await idOf('GW-0001'));
    expect(profile.fits.map((f) => [f.plateLabel, f.screenName, f.target, f.approved, f.status])).toEqual([
      ['KV-P01', 'Potassium counter-screen', 'Kv7.2', true, 'above_range'],
      ['NAV-P01', 'Pain sodium screen', 'Nav1.7', false, 'fitted'],
    ]);
    expect(profile.screens.map((s) => [s.name, s.hasApproved])).toEqual([
      ['Pain sodium screen', false],
      ['Potassium counter-screen', true],
    ]);
  });

  test('a page of the profile holds its share of the fits; potencies and selectivity still come from every fit', async () => {
    const id = await idOf('GW-0001');
    const whole = await getCompoundProfile(reader, id);
    const second = await getCompoundProfilePage(reader, id, 2, 1);
    expect(second).toMatchObject({ fitCount: 2, approvedCount: 1, page: 2, pages: 2 });
    expect(second.fits.map((f) => f.plateLabel)).toEqual(['NAV-P01']);
    expect(second.potencies.map((p) => p.plateLabel)).toEqual(['KV-P01', 'NAV-P01']);
    expect(second.selectivity).toEqual(whole.selectivity);
    // A page past the last shows the last; the default page size holds both fits on one page.
    expect((await getCompoundProfilePage(reader, id, 9, 1)).fits.map((f) => f.plateLabel)).toEqual([
      'NAV-P01',
    ]);
    expect(await getCompoundProfilePage(reader, id, 1)).toMatchObject({ page: 1, pages: 1, fitCount: 2 });
    expect((await getCompoundProfilePage(reader, id, 1)).fits).toHaveLength(2);
  });

  test('selectivity: an IC50 above the tested range gives a bound, not a number', async () => {
    const profile = await getCompoundProfile(reader, await idOf('GW-0001'));
    const nav = profile.potencies.find((p) => p.target === 'Nav1.7')!;
    const [ratio] = profile.selectivity;
    expect(ratio).toMatchObject({
      numerator: 'Kv7.2',
      denominator: 'Nav1.7',
      relation: '>',
      approved: false,
    });
    expect(ratio!.ratio).toBeCloseTo(30 / nav.ic50_uM!, 9);
    expect(ratio!.text).toBe(`Kv7.2 ÷ Nav1.7 > ${Number((30 / nav.ic50_uM!).toPrecision(3))}`);
    expect(ratio!.meaning).toMatch(/^at least \d+-fold more potent on Nav1\.7$/);
  });

  test('a compound with both IC50s fitted gets an exact ratio', async () => {
    const profile = await getCompoundProfile(reader, await idOf('GW-0003'));
    const [nav, kv] = ['Nav1.7', 'Kv7.2'].map((t) => profile.potencies.find((p) => p.target === t)!);
    expect(profile.selectivity).toEqual([
      expect.objectContaining({
        relation: '=',
        numerator: 'Kv7.2',
        denominator: 'Nav1.7',
        ratio: kv!.ic50_uM! / nav!.ic50_uM!,
      }),
    ]);
  });

  test('a compound never tested has an empty profile and no forecast', async () => {
    const id = await idOf('GW-0011');
    expect(await getCompoundProfile(reader, id)).toMatchObject({
      fits: [],
      potencies: [],
      selectivity: [],
      screens: [],
    });
    await expect(getCompoundForecast(reader, id)).rejects.toMatchObject({
      code: 'not_found',
      message: 'GW-0011 has no fits yet, so there is nothing to forecast.',
    });
  });

  test('the forecast at exposure combines targets of both screens, is stored without a plate and reused', async () => {
    const id = await idOf('GW-0003');
    const first = await getCompoundForecast(reader, id);
    // The default screen is the first by name with an approved fit.
    expect(first.screen.name).toBe('Potassium counter-screen');
    expect(first.targets.map((t) => [t.target, t.conductance, t.use, t.plate?.label])).toEqual([
      ['Kv7.2', 'gM', 'used', 'KV-P01'],
      ['Nav1.7', 'gNa', 'used', 'NAV-P01'],
    ]);
    expect(Object.keys(first.forecast!.conditions[0]!.block).sort()).toEqual(['gK', 'gM', 'gNa']);
    expect(first.forecast!.conditions.every((c) => c.block.gNa! > 0 && c.block.gM! > 0)).toBe(true);
    const again = await getCompoundForecast(reader, id);
    expect(again.forecast!.reused).toBe(true);
    const rows = await db().query<{ plateId: string | null }>(
      'select plate_id as "plateId" from forecasts where compound_id = :id',
      { type: QueryTypes.SELECT, replacements: { id } },
    );
    expect(rows).toEqual([{ plateId: null }]);
  });

  test('a screen the compound was not tested in is refused', async () => {
    const sodiumOnly = await idOf('GW-0002');
    const kvScreen = (await getCompoundProfile(reader, await idOf('GW-0001'))).screens.find(
      (s) => s.name === 'Potassium counter-screen',
    )!;
    await expect(getCompoundForecast(reader, sodiumOnly, { screenId: kvScreen.id })).rejects.toMatchObject({
      code: 'not_found',
      message: 'GW-0002 has no fits in that screen.',
    });
  });
});
