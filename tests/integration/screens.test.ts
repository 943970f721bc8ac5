import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { getScreen } from '@/lib/screens/list';
import { addTarget, createScreen, setTargetMapping, updateScreen } from '@/lib/screens/service';
import { PRESET_NAMES } from '@/lib/science/neuron/presets';
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

  test('each target keeps a conductance per preset: switching presets maps it, and switching back restores it', async () => {
    const admin = await makeActor(['admin']);
    const { id } = await createScreen(admin, screenSchema.parse({ ...form, neuronPreset: 'hh-squid-1952' }));
    // Mapped by hand in HH to gK although its name says sodium: the hand mapping wins in HH only.
    await addTarget(admin, id, { name: 'hNav1.5 late', conductance: 'gK', description: '' });
    await addTarget(admin, id, { name: 'Kv2.1', conductance: 'gK', description: '' });
    const created = await Target.findOne({ where: { name: 'hNav1.5 late' } });
    // Stored at creation: the chosen conductance in HH, the defaults for its name in the other presets.
    expect(created!.conductanceByPreset).toEqual({
      'hh-squid-1952': 'gK',
      'pospischil-rs-2008': 'gNa',
      'wang-buzsaki-1996': 'gNa',
    });
    const audits = await AuditEvent.count({ where: { entityType: 'target' } });

    await updateScreen(admin, id, screenSchema.parse({ ...form, neuronPreset: 'wang-buzsaki-1996' }));
    let screen = await getScreen(admin, id);
    expect(screen.neuronPreset).toBe('wang-buzsaki-1996');
    expect(Object.fromEntries(screen.targets.map((t) => [t.name, t.conductance]))).toEqual({
      'hNav1.5 late': 'gNa',
      'Kv2.1': 'gK',
    });
    // Every remapped target is audited (two targets).
    expect(await AuditEvent.count({ where: { entityType: 'target' } })).toBe(audits + 2);

    await updateScreen(admin, id, screenSchema.parse({ ...form, neuronPreset: 'hh-squid-1952' }));
    screen = await getScreen(admin, id);
    expect(screen.targets.find((t) => t.name === 'hNav1.5 late')!.conductance).toBe('gK');
    expect(screen.targets.find((t) => t.name === 'hNav1.5 late')!.byPreset).toEqual([
      { preset: 'hh-squid-1952', conductance: 'gK' },
      { preset: 'pospischil-rs-2008', conductance: 'gNa' },
      { preset: 'wang-buzsaki-1996', conductance: 'gNa' },
      // A generic sodium name has no default in the DRG preset (its sodium is split by subtype).
      { preset: 'xie-drg-2024', conductance: null },
    ]);
  });

  test('a refused preset change names the unmapped target and writes nothing', async () => {
    const admin = await makeActor(['admin']);
    const { id } = await createScreen(admin, screenSchema.parse(form));
    await addTarget(admin, id, { name: 'Nav1.7', conductance: 'gNa', description: '' });
    await addTarget(admin, id, { name: 'Kv7.2/7.3', conductance: 'gM', description: '' });
    const audits = await AuditEvent.count();
    await expect(
      updateScreen(admin, id, screenSchema.parse({ ...form, neuronPreset: 'wang-buzsaki-1996' })),
    ).rejects.toMatchObject({
      code: 'invalid',
      message:
        'Target Kv7.2/7.3 (gM in pospischil-rs-2008) has no conductance in wang-buzsaki-1996; it has gNa, gK.',
    });
    const screen = await getScreen(admin, id);
    expect(screen.neuronPreset).toBe('pospischil-rs-2008');
    expect(screen.targets.map((t) => t.conductance).sort()).toEqual(['gM', 'gNa']);
    expect(await AuditEvent.count()).toBe(audits);
  });

  test('an admin sets a target’s mapping in another preset; the switch then uses it', async () => {
    const admin = await makeActor(['admin']);
    const { id } = await createScreen(admin, screenSchema.parse(form));
    const { id: targetId } = await addTarget(admin, id, {
      name: 'Kv7.2/7.3',
      conductance: 'gM',
      description: '',
    });
    // Bad input names its field and writes nothing: the leak, the screen's current preset.
    await expect(
      setTargetMapping(admin, targetId, { preset: 'wang-buzsaki-1996', conductance: 'gL' }),
    ).rejects.toMatchObject({
      code: 'invalid',
      message: 'wang-buzsaki-1996 has no blockable conductance gL; choose one of gNa, gK.',
    });
    await expect(
      setTargetMapping(admin, targetId, { preset: 'pospischil-rs-2008', conductance: 'gK' }),
    ).rejects.toMatchObject({ code: 'invalid' });
    expect((await Target.findByPk(targetId))!.conductanceByPreset).toEqual({
      'pospischil-rs-2008': 'gM',
      'xie-drg-2024': 'gM',
    });
    await expect(
      setTargetMapping(await makeActor(['biologist']), targetId, {
        preset: 'wang-buzsaki-1996',
        conductance: 'gK',
      }),
    ).rejects.toMatchObject({ code: 'forbidden' });

    await setTargetMapping(admin, targetId, { preset: 'wang-buzsaki-1996', conductance: 'gK' });
    await updateScreen(admin, id, screenSchema.parse({ ...form, neuronPreset: 'wang-buzsaki-1996' }));
    expect((await getScreen(admin, id)).targets[0]!.conductance).toBe('gK');
  });

  test('only an admin manages screens', async () => {
    const biologist = await makeActor(['biologist']);
    await expect(createScreen(biologist, screenSchema.parse(form))).rejects.toMatchObject({
      code: 'forbidden',
    });
  });

  test.each([
    [{ neuronPreset: 'frog' }, 'neuronPreset', `Choose a preset: ${PRESET_NAMES.join(', ')}.`],
    [{ capacitanceMax_pF: '0.5' }, 'capacitanceMax_pF', 'Must be above the minimum capacitance.'],
    [{ exposures_uM: '1, -2' }, 'exposures_uM', 'Exposures must be above 0 µM.'],
    [{ zPrimeMin: 'high' }, 'zPrimeMin', 'Enter Z′ as a number.'],
  ])('bad screen input %j names %s', (change, field, message) => {
    const result = screenSchema.safeParse({ ...form, ...change });
    expect(result.error?.issues.find((issue) => issue.path[0] === field)?.message).toBe(message);
  });
});
