import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { getScreen } from '@/lib/screens/list';
import { addTarget, createScreen, updateScreen } from '@/lib/screens/service';
import { screenSchema } from '@/lib/validation/screens';
import { AuditEvent, Target } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';

const form = {
  name: 'Pain series',
  description: '',
  neuronPreset: 'pospischil-rs-2008',
  zPrimeMin: '0.5',
  sealResistanceMin_GOhm: '0.5',
  controlCurrentMin_pA: '200',
  seriesResistanceMax_MOhm: '25',
  capacitanceMin_pF: '1',
  capacitanceMax_pF: '100',
  vehicleRundownMax_percent: '20',
  exposures_uM: '0.1, 0.3 1',
};

describe('screens and targets on the real database', () => {
  beforeEach(resetDatabase);
  afterAll(() => db().close());

  test('an admin creates a screen from form values and maps targets to blockable conductances', async () => {
    const admin = await makeActor(['admin']);
    const input = screenSchema.parse(form);
    expect(input.exposures_uM).toEqual([0.1, 0.3, 1]);
    const { id } = await createScreen(admin, input);
    await addTarget(admin, id, { name: 'Nav peak', conductance: 'gNa', description: '' });
    await addTarget(admin, id, { name: 'Kv7 M-current', conductance: 'gM', description: '' });
    const screen = await getScreen(admin, id);
    expect(screen.vehicleRundownMax_fraction).toBeCloseTo(0.2, 12);
    expect(screen.targets.map((t) => t.conductance).sort()).toEqual(['gM', 'gNa']);
    expect(await AuditEvent.count({ where: { entityType: 'target' } })).toBe(2);
  });

  test('a target may not map to the leak or to a conductance the preset lacks', async () => {
    const admin = await makeActor(['admin']);
    const { id } = await createScreen(admin, screenSchema.parse({ ...form, neuronPreset: 'hh-squid-1952' }));
    await expect(
      addTarget(admin, id, { name: 'Leak', conductance: 'gL', description: '' }),
    ).rejects.toMatchObject({
      code: 'invalid',
      message: 'hh-squid-1952 has no blockable conductance gL; choose one of gNa, gK.',
    });
    await expect(
      addTarget(admin, id, { name: 'M', conductance: 'gM', description: '' }),
    ).rejects.toMatchObject({ code: 'invalid' });
    expect(await Target.count()).toBe(0);
  });

  test('changing the preset is refused while a target maps to a conductance the new preset lacks', async () => {
    const admin = await makeActor(['admin']);
    const { id } = await createScreen(admin, screenSchema.parse(form));
    await addTarget(admin, id, { name: 'Kv7', conductance: 'gM', description: '' });
    await expect(
      updateScreen(admin, id, screenSchema.parse({ ...form, neuronPreset: 'hh-squid-1952' })),
    ).rejects.toMatchObject({ code: 'invalid' });
    expect((await getScreen(admin, id)).neuronPreset).toBe('pospischil-rs-2008');
  });

  test('only an admin manages screens', async () => {
    const biologist = await makeActor(['biologist']);
    await expect(createScreen(biologist, screenSchema.parse(form))).rejects.toMatchObject({
      code: 'forbidden',
    });
  });

  test.each([
    [{ neuronPreset: 'frog' }, 'neuronPreset', 'Choose a preset: hh-squid-1952, pospischil-rs-2008.'],
    [{ capacitanceMax_pF: '0.5' }, 'capacitanceMax_pF', 'Must be above the minimum capacitance.'],
    [{ exposures_uM: '1, -2' }, 'exposures_uM', 'Exposures must be above 0 µM.'],
    [{ zPrimeMin: 'high' }, 'zPrimeMin', 'Enter Z′ as a number.'],
  ])('bad screen input %j names %s', (change, field, message) => {
    const result = screenSchema.safeParse({ ...form, ...change });
    expect(result.error?.issues.find((issue) => issue.path[0] === field)?.message).toBe(message);
  });
});
