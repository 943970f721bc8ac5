import * as XLSX from 'xlsx';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { registerCompoundsFromSheet } from '@/lib/compounds/bulk';
import { db } from '@/lib/db';
import { AuditEvent, Batch, Compound } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';

function workbook(rows: (string | number)[][]): Uint8Array {
  const book = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet(rows), 'Registry');
  return new Uint8Array(XLSX.write(book, { type: 'array', bookType: 'xlsx' }) as ArrayBuffer);
}

const HEADER = ['Identifier', 'Name', 'SMILES', 'MW', 'Lot', 'Purity', 'Stock (mM)', 'Solvent'];

describe('bulk compound registration on the real database', () => {
  beforeEach(resetDatabase);
  afterAll(() => db().close());

  test('a clean sheet previews without writing, then registers every compound and batch in one go', async () => {
    const chemist = await makeActor(['chemist']);
    const bytes = workbook([
      HEADER,
      ['GW-1001', 'First', 'CCO', 46.07, 'L1', 99, 10, 'DMSO'],
      ['GW-1002', 'Second', '', '', '', '', '', ''],
    ]);
    const preview = await registerCompoundsFromSheet(chemist, { bytes, filename: 'r.xlsx' }, false);
    expect(preview.ok).toBe(true);
    expect(await Compound.count()).toBe(0);
    const done = await registerCompoundsFromSheet(chemist, { bytes, filename: 'r.xlsx' }, true);
    expect(done.registered).toBe(2);
    expect(await Compound.count()).toBe(2);
    expect(await Batch.count()).toBe(1);
    expect(await AuditEvent.count({ where: { entityType: 'compound', action: 'create' } })).toBe(2);
  });

  test('one bad row stops the whole sheet, with sheet, row and column named', async () => {
    const chemist = await makeActor(['chemist']);
    const bytes = workbook([
      HEADER,
      ['GW-1001', 'ok', '', 300, '', '', '', ''],
      ['GW 1002', 'bad id', '', -4, '', '', '', ''],
      ['gw-1001', 'twice', '', '', '', '', '', ''],
    ]);
    const result = await registerCompoundsFromSheet(chemist, { bytes, filename: 'r.xlsx' }, true);
    expect(result.ok).toBe(false);
    expect(result.rows.flatMap((r) => r.errors)).toEqual([
      'Sheet "Registry", row 3, column A: Use letters, digits, dot, dash or underscore, starting with a letter or digit.',
      'Sheet "Registry", row 3, column D: Molecular weight must be above 0.',
      'Sheet "Registry", row 4, column A: gw-1001 is already on row 2 of this sheet.',
    ]);
    expect(await Compound.count()).toBe(0);
  });

  test('identifiers already registered are refused; a biologist may not register', async () => {
    const chemist = await makeActor(['chemist']);
    await registerCompoundsFromSheet(
      chemist,
      { bytes: workbook([HEADER, ['GW-1001', '', '', '', '', '', '', '']]), filename: 'a.xlsx' },
      true,
    );
    const again = await registerCompoundsFromSheet(
      chemist,
      { bytes: workbook([HEADER, ['GW-1001', '', '', '', '', '', '', '']]), filename: 'b.xlsx' },
      true,
    );
    expect(again.rows[0]!.errors).toEqual(['Sheet "Registry", row 2: GW-1001 is already registered.']);
    await expect(
      registerCompoundsFromSheet(
        await makeActor(['biologist']),
        { bytes: workbook([HEADER]), filename: 'c.xlsx' },
        false,
      ),
    ).rejects.toMatchObject({ code: 'forbidden' });
  });

  test('a sheet without an identifier column, and a file that is not a spreadsheet, are refused clearly', async () => {
    const chemist = await makeActor(['chemist']);
    const noId = await registerCompoundsFromSheet(
      chemist,
      {
        bytes: workbook([
          ['Name', 'MW'],
          ['x', 1],
        ]),
        filename: 'n.xlsx',
      },
      false,
    );
    expect(noId.problems[0]).toMatch(/^Sheet "Registry", row 1: no column names the compound identifier/);
    await expect(
      registerCompoundsFromSheet(
        chemist,
        { bytes: new TextEncoder().encode('\u0000\u0001garbage'), filename: 'g.xlsx' },
        false,
      ),
    ).rejects.toMatchObject({ code: 'invalid' });
  });
});
