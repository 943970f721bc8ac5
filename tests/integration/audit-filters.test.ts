import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { changeText } from '@/lib/audit/field-labels';
import { auditFilterChoices, auditFilterSuggestions, searchAudit } from '@/lib/audit/search';
import type { Actor } from '@/lib/auth/roles';
import { addBatch, createCompound, updateCompound } from '@/lib/compounds/service';
import { db } from '@/lib/db';
import { auditExport } from '@/lib/exports/audit-export';
import { setWellExclusion } from '@/lib/plates/review';
import { Well } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { importDemoPlate } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';

// The audit trail's filters by plate, compound and kind of event, and the names it shows, on the real
// database: events written by Gatewell's own services (a demo plate import, a well exclusion, a compound's
// registration, change and batch).

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;

let admin: Actor;
let chemist: Actor;
let biologist: Actor;
let wellPosition: string;

describe('the audit trail filtered by plate, compound and kind of event', () => {
  beforeAll(async () => {
    await resetDatabase();
    admin = await makeActor(['admin']);
    chemist = await makeActor(['chemist']);
    biologist = await makeActor(['biologist']);
    const screens = await makeDemoScreens(admin, chemist);
    const plateId = await importDemoPlate(biologist, screens, 'nav-96-plate-01.xlsx');
    const well = await Well.findOne({ where: { plateId, position: 'H12' }, rejectOnEmpty: true });
    wellPosition = well.position;
    await setWellExclusion(biologist, plateId, { wellIds: [well.id], excluded: true, reason: 'seal lost' });
    const compound = await createCompound(chemist, {
      identifier: 'GW-AUDIT-7',
      name: 'Audit probe',
      smiles: '',
      molecularWeight: 300,
    });
    await updateCompound(chemist, compound.id, {
      identifier: 'GW-AUDIT-7',
      name: 'Audit probe',
      smiles: '',
      molecularWeight: 312.5,
    });
    await addBatch(chemist, compound.id, {
      lot: 'L-9',
      purity_percent: 98,
      stockConcentration_mM: 10,
      solvent: 'DMSO',
    });
  }, 120_000);
  afterAll(async () => {
    await db().close();
  });

  test('a plate by its label (any case) holds its import and the exclusion of its well, named in words', async () => {
    const page = await searchAudit(admin, { plate: 'nav-p01' });
    expect(page.rows.map((row) => row.action)).toEqual(['exclude_well', 'import']);
    expect(page.rows.map((row) => row.objectName)).toEqual([`${wellPosition} on NAV-P01`, 'NAV-P01']);
    expect(page.rows[0]).toMatchObject({
      actorName: biologist.name,
      actorRoles: 'biologist',
      reason: 'seal lost',
    });
    // The import's screen is named, not shown by its id; internal references are left out.
    const importRow = page.rows[1]!;
    const text = changeText(importRow.before, importRow.after, page.names);
    expect(text).toContain('Screen: Pain sodium screen');
    expect(text).toContain('Plate label: NAV-P01');
    expect(text).not.toMatch(UUID);
    expect(text).not.toMatch(/[0-9a-f]{40}/);
    const exclusion = changeText(page.rows[0]!.before, page.rows[0]!.after, page.names);
    expect(exclusion).toContain('Excluded: no → yes');
    expect(exclusion).toContain('Reason for exclusion: — → seal lost');
  });

  test('a compound by identifier holds its registration, its change and its batch', async () => {
    const page = await searchAudit(admin, { compound: 'gw-audit-7' });
    expect(page.rows.map((row) => [row.action, row.entityType, row.objectName])).toEqual([
      ['create', 'batch', 'GW-AUDIT-7 lot L-9'],
      ['update', 'compound', 'GW-AUDIT-7'],
      ['create', 'compound', 'GW-AUDIT-7'],
    ]);
    expect(changeText(page.rows[1]!.before, page.rows[1]!.after, page.names)).toBe(
      'Molecular weight (g/mol): 300 → 312.5',
    );
    expect(changeText(page.rows[0]!.before, page.rows[0]!.after, page.names)).toContain('Purity (%): 98');
  });

  test.each<[Record<string, string>, number]>([
    [{ plate: 'NO-SUCH-PLATE' }, 0],
    [{ compound: 'GW-NONE' }, 0],
    [{ action: 'exclude_well' }, 1],
    [{ action: 'update', compound: 'GW-AUDIT-7' }, 1],
    [{ action: 'import', plate: 'NAV-P01' }, 1],
    [{ entityType: 'well', plate: 'NAV-P01' }, 1],
  ])('the filter %o matches %i events', async (filter, expected) => {
    const page = await searchAudit(admin, filter);
    expect(page.total).toBe(expected);
    expect(page.rows).toHaveLength(expected);
  });

  test('filters combine with the person: the chemist did everything to the compound, the biologist nothing', async () => {
    expect((await searchAudit(admin, { compound: 'GW-AUDIT-7', userId: chemist.id })).total).toBe(3);
    expect((await searchAudit(admin, { compound: 'GW-AUDIT-7', userId: biologist.id })).total).toBe(0);
  });

  test('the export holds what the filter shows, with words for people beside the recorded values', async () => {
    const document = await auditExport(admin, { compound: 'GW-AUDIT-7' });
    const [table] = document.tables;
    expect(table!.rows).toHaveLength(3);
    const column = (name: string) => table!.columns.indexOf(name);
    expect(table!.rows.map((row) => row[column('What happened')])).toEqual(['Created', 'Changed', 'Created']);
    expect(table!.rows.map((row) => row[column('Kind of object')])).toEqual([
      'Batch',
      'Compound',
      'Compound',
    ]);
    expect(table!.rows[1]![column('Changes')]).toBe('Molecular weight (g/mol): 300 → 312.5');
    expect(table!.rows[1]![column('Person')]).toBe(chemist.name);
    expect(table!.rows[1]![column('Roles now')]).toBe('chemist');
    expect(document.about).toEqual(expect.arrayContaining([['Filter', 'compound GW-AUDIT-7']]));
  });

  test('the filter offers the kinds of event; plate labels and compound identifiers are suggested as typed', async () => {
    const choices = await auditFilterChoices(admin);
    expect(choices.actions).toEqual(expect.arrayContaining(['create', 'exclude_well', 'import', 'update']));
    expect(choices).not.toHaveProperty('plates');
    expect(choices).not.toHaveProperty('compounds');
    expect(await auditFilterSuggestions(admin, { kind: 'plate', q: 'nav-p' })).toEqual(['NAV-P01']);
    expect(await auditFilterSuggestions(admin, {})).toEqual(['NAV-P01']);
    expect(await auditFilterSuggestions(admin, { kind: 'plate', q: 'KV' })).toEqual([]);
    expect(await auditFilterSuggestions(admin, { kind: 'compound', q: 'audit-7' })).toEqual(['GW-AUDIT-7']);
    // A wildcard of LIKE is only a character here.
    expect(await auditFilterSuggestions(admin, { kind: 'compound', q: '%' })).toEqual([]);
    await expect(auditFilterSuggestions(admin, { kind: 'screen' })).rejects.toMatchObject({
      code: 'invalid',
    });
    await expect(auditFilterSuggestions(admin, { q: 'x'.repeat(101) })).rejects.toMatchObject({
      code: 'invalid',
    });
    await expect(auditFilterSuggestions(chemist, { q: 'NAV' })).rejects.toMatchObject({ code: 'forbidden' });
  });
});
