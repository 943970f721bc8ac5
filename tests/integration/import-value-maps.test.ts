import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { deleteTemplate, listTemplates, saveTemplate } from '@/lib/plates/templates';
import type { Cell } from '@/lib/imports/spreadsheet-types';
import { AuditEvent, ImportTemplate, Plate, TargetAlias, Well } from '@/models';
import { writeExport } from '@/scripts/demo-plates/write-export';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { makeDemoScreens } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';

const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
const HEADERS = [
  'Pos',
  'Sample ID',
  'Dose (nM)',
  'Assay',
  'I pre (pA)',
  'I post (pA)',
  'Rseal (GOhm)',
  'Well type',
];

/**
 * A 96-well export in its own words: column 1 "Ctrl -" (DMSO), column 2 "Ctrl +" (a reference blocker),
 * H12 "unused", every other well "STD" (GW-0001…GW-0005 in a 1:3 series from 10 µM); target "hNav1.7 peak";
 * a run-info sheet with the barcode as "Plate barcode: …" and the operator beside its key.
 */
function exportFile(barcode: string, scale = 1): Uint8Array {
  const rows: Cell[][] = [['Rig 4 · automated patch clamp export'], [], HEADERS];
  for (let r = 0; r < 8; r++) {
    for (let c = 1; c <= 12; c++) {
      const well = `${'ABCDEFGH'[r]}${String(c).padStart(2, '0')}`;
      const control = -2000 * scale - 10 * r;
      if (c === 1) rows.push([well, 'DMSO', 0, 'hNav1.7 peak', control, control * 0.98, 1.5, 'Ctrl -']);
      else if (c === 2)
        rows.push([well, 'REF-TTX', 1000, 'hNav1.7 peak', control, control * 0.05, 1.5, 'Ctrl +']);
      else if (r === 7 && c === 12) rows.push([well, null, null, 'hNav1.7 peak', null, null, null, 'unused']);
      else {
        const compound = `GW-000${((c - 3) % 5) + 1}`;
        const dose_nM = 10000 / 3 ** r;
        const block = 1 / (1 + 1000 / dose_nM);
        rows.push([well, compound, dose_nM, 'hNav1.7 peak', control, control * (1 - block), 1.5, 'STD']);
      }
    }
  }
  return writeExport(`${barcode}.xlsx`, {
    dataSheet: 'Data',
    sheets: [
      {
        name: 'Run info',
        rows: [['Run information'], ['Plate barcode: ' + barcode], ['Operator', 'R. Okafor']],
      },
      { name: 'Data', rows },
    ],
  } as never);
}

afterAll(() => db().close());

describe('imports with the file’s own words, mapped once', () => {
  let biologist: Actor;
  let screens: Record<string, string>;

  beforeEach(async () => {
    await resetDatabase();
    screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    biologist = await makeActor(['biologist']);
  });

  const upload = (barcode: string, scale = 1) => ({
    screenId: screens['Nav1.7']!,
    bytes: exportFile(barcode, scale),
    filename: `export-${barcode}.xlsx`,
    mediaType: XLSX,
  });

  test('role words and target name mapped once; the barcode labels the plate; the next file needs no mapping', async () => {
    const first = await inspectUpload(biologist, upload('XYZ123'));
    expect(first.recognised).toBeNull();
    const data = first.sheets.find((s) => s.name === 'Data')!;
    expect(data.guess.mapping.headerRow).toBe(3);
    expect(data.guess.mapping.columns.role).toBe('Well type');
    expect(data.values[7]).toEqual(['Ctrl -', 'Ctrl +', 'STD', 'unused']);
    expect(data.guess.mapping.facts.barcode).toEqual({
      kind: 'key',
      sheet: 'Run info',
      key: 'Plate barcode',
    });
    expect(data.facts).toEqual({ barcode: 'XYZ123', operator: 'R. Okafor' });

    // Unmapped: "STD" is no word Gatewell knows; the whole file is refused, naming it.
    const refused = await previewImport(biologist, {
      draftId: first.draftId!,
      sheet: 'Data',
      mapping: data.guess.mapping,
    });
    expect(refused.ok).toBe(false);
    expect(refused.issues.map((i) => i.code)).toEqual(['unknown_role']);
    expect(refused.issues[0]!.message).toContain('"STD"');

    const mapping = {
      ...data.guess.mapping,
      roleValues: { STD: 'test' as const },
      targetValues: { 'hNav1.7 peak': 'Nav1.7' },
    };
    const preview = await previewImport(biologist, { draftId: first.draftId!, sheet: 'Data', mapping });
    expect(preview.issues).toEqual([]);
    expect(preview.ok).toBe(true);
    expect(preview.emptyWells).toBe(1);
    expect(preview.facts).toEqual({ barcode: 'XYZ123', operator: 'R. Okafor' });

    const stored = await commitImport(biologist, {
      draftId: first.draftId!,
      sheet: 'Data',
      mapping,
      label: preview.facts.barcode!,
      templateName: 'Rig 4 export',
    });
    await fitsCurrent(stored.plateId);
    const plate = (await Plate.findByPk(stored.plateId))!;
    expect(plate.label).toBe('XYZ123');
    expect(plate.facts).toEqual({ barcode: 'XYZ123', operator: 'R. Okafor' });
    const wells = await Well.findAll({ where: { plateId: stored.plateId } });
    const count = (role: string) => wells.filter((w) => w.role === role).length;
    expect([wells.length, count('vehicle'), count('reference'), count('test')]).toEqual([95, 8, 8, 79]);
    expect(wells.find((w) => w.position === 'H12')).toBeUndefined();
    const aliases = await TargetAlias.findAll({ where: { screenId: screens['Nav1.7']! } });
    expect(aliases.map((a) => [a.alias, a.aliasKey])).toEqual([['hNav1.7 peak', 'hnav17peak']]);

    // The second file of the layout: recognised by its headers, its template applied, no mapping changed.
    const second = await inspectUpload(biologist, upload('XYZ124', 1.1));
    expect(second.recognised).toMatchObject({
      name: 'Rig 4 export',
      sheet: 'Data',
      facts: { barcode: 'XYZ124' },
    });
    expect(second.targetAliases).toEqual({ 'hNav1.7 peak': 'Nav1.7' });
    const again = await commitImport(biologist, {
      draftId: second.draftId!,
      sheet: second.recognised!.sheet,
      mapping: second.recognised!.mapping,
      label: second.recognised!.facts.barcode!,
    });
    const plate2 = (await Plate.findByPk(again.plateId))!;
    expect(plate2.label).toBe('XYZ124');
    expect(plate2.importTemplateId).toBeNull();
    expect(await Well.count({ where: { plateId: again.plateId, role: 'vehicle' } })).toBe(8);
  });

  test('the screen remembers a target alias: a later mapping without target values still maps it', async () => {
    const first = await inspectUpload(biologist, upload('P-1'));
    const data = first.sheets.find((s) => s.name === 'Data')!;
    const base = { ...data.guess.mapping, roleValues: { STD: 'test' as const } };
    const before = await previewImport(biologist, { draftId: first.draftId!, sheet: 'Data', mapping: base });
    expect(before.unknownTargets.map((t) => t.name)).toEqual(['hNav1.7 peak']);
    await commitImport(biologist, {
      draftId: first.draftId!,
      sheet: 'Data',
      mapping: { ...base, targetValues: { 'hNav1.7 peak': 'Nav1.7' } },
      label: 'P-1',
    });
    const second = await inspectUpload(biologist, upload('P-2', 0.9));
    const after = await previewImport(biologist, { draftId: second.draftId!, sheet: 'Data', mapping: base });
    expect(after.unknownTargets).toEqual([]);
    expect(after.ok).toBe(true);
    // Aliases are per screen: the potassium screen has none.
    expect(await TargetAlias.count({ where: { screenId: screens['Kv7.2']! } })).toBe(0);
  });
});

describe('templates: save, list, apply, delete', () => {
  let biologist: Actor;
  beforeEach(async () => {
    await resetDatabase();
    biologist = await makeActor(['biologist']);
  });

  const mapping = {
    headerRow: 3,
    wellSheet: 'Data',
    columns: {
      well: 'Pos',
      compound: 'Sample ID',
      concentration: 'Dose (nM)',
      target: 'Assay',
      controlCurrent: 'I pre (pA)',
      compoundCurrent: 'I post (pA)',
      role: 'Well type',
    },
    roleValues: { STD: 'test' as const, 'Ctrl -': 'vehicle' as const },
    targetValues: { 'hNav1.7 peak': 'Nav1.7' },
    facts: {
      barcode: { kind: 'key' as const, sheet: 'Run info', key: 'Plate barcode' },
      runDate: { kind: 'cell' as const, sheet: 'Run info', address: 'b4' },
    },
  };

  test('a saved template lists with its value maps, facts and fingerprint, is replaced by name, and is deleted', async () => {
    const saved = await saveTemplate(biologist, { name: 'Rig 4 export', mapping, headerCells: HEADERS });
    expect(saved.fingerprint).toBe('pos|sampleid|dosenm|assay|iprepa|ipostpa|rsealgohm|welltype');
    const [listed] = await listTemplates(biologist);
    expect(listed!.name).toBe('Rig 4 export');
    expect(listed!.mapping.roleValues).toEqual({ STD: 'test', 'Ctrl -': 'vehicle' });
    expect(listed!.mapping.targetValues).toEqual({ 'hNav1.7 peak': 'Nav1.7' });
    expect(listed!.mapping.facts.barcode).toEqual({ kind: 'key', sheet: 'Run info', key: 'Plate barcode' });
    expect(listed!.mapping.facts.runDate).toEqual({ kind: 'cell', sheet: 'Run info', address: 'B4' });
    expect(listed!.mapping.wellSheet).toBe('Data');

    const replaced = await saveTemplate(biologist, {
      name: 'RIG 4 EXPORT',
      mapping: { ...mapping, roleValues: { STD: 'empty' as const } },
      headerCells: null,
    });
    expect(replaced.id).toBe(saved.id);
    expect(replaced.fingerprint).toBe(saved.fingerprint);
    expect((await listTemplates(biologist)).map((t) => t.mapping.roleValues)).toEqual([{ STD: 'empty' }]);

    await deleteTemplate(biologist, saved.id);
    expect(await listTemplates(biologist)).toEqual([]);
    await expect(deleteTemplate(biologist, saved.id)).rejects.toMatchObject({ code: 'not_found' });
    const actions = (
      await AuditEvent.findAll({ where: { entityType: 'import_template' }, order: [['id', 'ASC']] })
    ).map((e) => e.action);
    expect(actions).toEqual(['create', 'update', 'delete']);
  });

  test('an incomplete mapping is refused; a chemist may not save templates', async () => {
    await expect(
      saveTemplate(biologist, { name: 'Half', mapping: { columns: { well: 'Pos' } }, headerCells: HEADERS }),
    ).rejects.toThrow(/compound identifier/);
    const chemist = await makeActor(['chemist']);
    await expect(
      saveTemplate(chemist, { name: 'Rig 4', mapping, headerCells: HEADERS }),
    ).rejects.toMatchObject({ code: 'forbidden' });
    expect(await ImportTemplate.count()).toBe(0);
  });

  test('a template of version 1 still lists and applies, its markers upgraded', async () => {
    await ImportTemplate.create({
      name: 'Old layout',
      createdBy: biologist.id,
      mapping: {
        version: 1,
        headerRow: 1,
        columns: { ...mapping.columns },
        markers: { vehicle: ['VEH', 'BUFFER'], reference: ['REF'], test: ['STD'] },
      },
    });
    const [old] = await listTemplates(biologist);
    expect(old!.mapping.version).toBe(2);
    expect(old!.mapping.roleValues).toEqual({ BUFFER: 'vehicle', STD: 'test' });
    expect(old!.mapping.controls.negative).toEqual(['BUFFER']);
    expect(old!.fingerprint).toBeNull();
  });
});
