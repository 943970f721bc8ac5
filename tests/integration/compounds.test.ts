import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { addBatch, createCompound, getCompound, updateCompound } from '@/lib/compounds/service';
import { db } from '@/lib/db';
import { compoundSchema } from '@/lib/validation/compounds';
import { AuditEvent, Compound } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';

const aspirinLike = {
  identifier: 'GW-0001',
  name: 'Test compound',
  smiles: 'CC(=O)Oc1ccccc1C(=O)O',
  molecularWeight: 180.16,
};

describe('compound registry on the real database', () => {
  beforeEach(resetDatabase);
  afterAll(() => db().close());

  test('a chemist registers a compound and a batch; both are audited', async () => {
    const chemist = await makeActor(['chemist']);
    const compound = await createCompound(chemist, aspirinLike);
    const batch = await addBatch(chemist, compound.id, {
      lot: 'L-01',
      purity_percent: 99.1,
      stockConcentration_mM: 10,
      solvent: 'DMSO',
    });
    expect((await getCompound(chemist, compound.id)).batches).toEqual([batch]);
    expect(
      await AuditEvent.count({ where: { entityType: 'compound', action: 'create', actorId: chemist.id } }),
    ).toBe(1);
    expect(await AuditEvent.count({ where: { entityType: 'batch', action: 'create' } })).toBe(1);
  });

  test('identifiers are unique regardless of case, with a message on the field', async () => {
    const chemist = await makeActor(['chemist']);
    await createCompound(chemist, aspirinLike);
    await expect(createCompound(chemist, { ...aspirinLike, identifier: 'gw-0001' })).rejects.toMatchObject({
      code: 'conflict',
      message: 'A compound with identifier gw-0001 is already registered.',
    });
    expect(await Compound.count()).toBe(1);
    expect(await AuditEvent.count({ where: { entityType: 'compound' } })).toBe(1);
  });

  test('a biologist may read but not register or edit', async () => {
    const chemist = await makeActor(['chemist']);
    const biologist = await makeActor(['biologist']);
    const compound = await createCompound(chemist, aspirinLike);
    await expect(createCompound(biologist, { ...aspirinLike, identifier: 'GW-0002' })).rejects.toMatchObject({
      code: 'forbidden',
    });
    await expect(updateCompound(biologist, compound.id, { ...aspirinLike, name: 'x' })).rejects.toMatchObject(
      { code: 'forbidden' },
    );
    expect((await getCompound(biologist, compound.id)).name).toBe('Test compound');
  });

  test('an edit keeps before and after in the audit trail', async () => {
    const chemist = await makeActor(['chemist']);
    const compound = await createCompound(chemist, aspirinLike);
    await updateCompound(chemist, compound.id, { ...aspirinLike, name: 'Renamed' });
    const event = await AuditEvent.findOne({ where: { action: 'update', entityId: compound.id } });
    expect(event?.before).toMatchObject({ name: 'Test compound' });
    expect(event?.after).toMatchObject({ name: 'Renamed' });
  });

  test.each([
    [{ identifier: '' }, 'identifier', 'Enter the compound identifier.'],
    [
      { identifier: 'GW 1' },
      'identifier',
      'Use letters, digits, dot, dash or underscore, starting with a letter or digit.',
    ],
    [{ identifier: 'GW-1', molecularWeight: '-5' }, 'molecularWeight', 'Molecular weight must be above 0.'],
    [{ identifier: 'GW-1', molecularWeight: 'heavy' }, 'molecularWeight', 'Enter a number.'],
    [
      { identifier: 'GW-1', smiles: '<script>' },
      'smiles',
      'SMILES may hold only atom, bond, ring and branch characters.',
    ],
  ])('bad input %j is refused on %s', (input, field, message) => {
    const result = compoundSchema.safeParse(input);
    expect(result.success).toBe(false);
    expect(result.error?.issues.find((issue) => issue.path[0] === field)?.message).toBe(message);
  });
});
