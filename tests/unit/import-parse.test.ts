import { describe, expect, test } from 'vitest';
import XLSX from 'xlsx';
import { parseSpreadsheet, type ParseSpreadsheetOptions } from '@/lib/imports/parse-spreadsheet';
import type { SpreadsheetErrorCode } from '@/lib/imports/spreadsheet-types';
import { makeRandom } from '@/scripts/demo-plates/random';
import { workbookWithCells, zip, zipBombXlsx } from '../fixtures/bad-input/build-corpus';

const text = (value: string) => new TextEncoder().encode(value);

function workbookBytes(sheets: Record<string, XLSX.WorkSheet>, bookType: XLSX.BookType = 'xlsx'): Uint8Array {
  const book = XLSX.utils.book_new();
  for (const [name, sheet] of Object.entries(sheets)) XLSX.utils.book_append_sheet(book, sheet, name);
  return new Uint8Array(XLSX.write(book, { type: 'array', bookType }) as ArrayBuffer);
}

describe('parseSpreadsheet reads workbooks into plain cells', () => {
  test('xlsx: text, numbers, booleans, dates, cached formula values and errors, at their spreadsheet positions', async () => {
    const sheet = XLSX.utils.sheet_add_aoa(
      {},
      [
        ['Well', 'Conc (nM)'],
        ['A01', 100],
        ['B01', true],
      ],
      { origin: 'B2' },
    );
    sheet['D3'] = { t: 'n', v: 3, f: 'C3*3' };
    sheet['D4'] = { t: 'e', v: 7 };
    sheet['E4'] = { t: 'd', v: new Date('2024-03-05T00:00:00.000Z') };
    sheet['!ref'] = 'B2:E4';
    const result = await parseSpreadsheet(
      workbookBytes({ Readouts: sheet, Notes: XLSX.utils.aoa_to_sheet([]) }),
      'plate.xlsx',
    );
    expect(result).toEqual({
      ok: true,
      format: 'xlsx',
      sheets: [
        {
          name: 'Readouts',
          decimalComma: false,
          rows: [
            [],
            [null, 'Well', 'Conc (nM)'],
            [null, 'A01', 100, 3],
            [null, 'B01', true, '#DIV/0!', '2024-03-05T00:00:00.000Z'],
          ],
        },
        { name: 'Notes', decimalComma: false, rows: [] },
      ],
    });
  });

  test('xls (compound file) reads the same way', async () => {
    const result = await parseSpreadsheet(
      workbookBytes({ Readouts: XLSX.utils.aoa_to_sheet([['Well'], ['A01']]) }, 'biff8'),
      'plate.xls',
    );
    expect(result).toEqual({
      ok: true,
      format: 'xls',
      sheets: [{ name: 'Readouts', decimalComma: false, rows: [['Well'], ['A01']] }],
    });
  });
});

describe('parseSpreadsheet reads delimited text', () => {
  test.each([
    [
      'comma, byte-order mark, CRLF, quotes, blank line',
      '\ufeffWell,Compound\r\n"A01","GW, 1"\r\n\r\nB01,"say ""hi"""\r\n',
      ',',
      [['Well', 'Compound'], ['A01', 'GW, 1'], [], ['B01', 'say "hi"']],
    ],
    [
      'semicolon with decimal commas',
      'Well;I (pA)\nA01;-812,5\n',
      ';',
      [
        ['Well', 'I (pA)'],
        ['A01', '-812,5'],
      ],
    ],
    [
      'tab',
      'Well\tConc\nA01\t\n',
      '\t',
      [
        ['Well', 'Conc'],
        ['A01', null],
      ],
    ],
    [
      'a sep= hint',
      'sep=;\nWell;Conc, nM\nA01;3\n',
      ';',
      [
        ['Well', 'Conc, nM'],
        ['A01', '3'],
      ],
    ],
    [
      'a quoted line break',
      'Well,Note\nA01,"two\nlines"\n',
      ',',
      [
        ['Well', 'Note'],
        ['A01', 'two\nlines'],
      ],
    ],
  ])('%s', async (_name, csv, delimiter, rows) => {
    const result = await parseSpreadsheet(text(csv), 'kv-plate.csv');
    expect(result).toEqual({
      ok: true,
      format: 'csv',
      sheets: [{ name: 'kv-plate', rows, decimalComma: delimiter === ';' }],
    });
  });

  test('a CSV saved under an .xlsx name is read as the CSV it is', async () => {
    const result = await parseSpreadsheet(
      text('Run 7\nWell,Conc,Target\nA01,3,Kv7.2\nA02,1,Kv7.2\n'),
      'kv-plate.xlsx',
    );
    expect(result).toEqual({
      ok: true,
      format: 'csv',
      sheets: [
        {
          name: 'kv-plate',
          rows: [['Run 7'], ['Well', 'Conc', 'Target'], ['A01', '3', 'Kv7.2'], ['A02', '1', 'Kv7.2']],
          decimalComma: false,
        },
      ],
    });
  });

  test('UTF-16 text with a byte-order mark', async () => {
    const bytes = new Uint8Array(Buffer.from('\ufeffWell\tRseal (GΩ)\nA01\t1.2\n', 'utf16le'));
    const result = await parseSpreadsheet(bytes, 'export.txt');
    expect(result).toMatchObject({
      ok: true,
      sheets: [
        {
          rows: [
            ['Well', 'Rseal (GΩ)'],
            ['A01', '1.2'],
          ],
        },
      ],
    });
  });
});

describe('parseSpreadsheet refuses what it cannot read, and says why', () => {
  const garbage = new Uint8Array(4096).map(
    (
      (random) => () =>
        Math.floor(random.next() * 256)
    )(makeRandom(7)),
  );
  const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);
  const latin1 = new Uint8Array([...text('Well,Conc (\n'), 0xb5, ...text('M)\n')]);

  test.each<[string, Uint8Array, string, ParseSpreadsheetOptions, SpreadsheetErrorCode, string | RegExp]>([
    [
      'an empty file',
      new Uint8Array(0),
      'plate.xlsx',
      {},
      'empty_file',
      'plate.xlsx is empty (0 bytes): the file holds nothing to import. Export the plate from the instrument again and upload that file.',
    ],
    [
      'random bytes named .xlsx',
      garbage,
      'plate.xlsx',
      {},
      'not_spreadsheet',
      'plate.xlsx holds binary data that is not a spreadsheet Gatewell can read. Upload an xlsx, xls or csv file.',
    ],
    [
      'a PNG named .xlsx',
      png,
      'plate.xlsx',
      {},
      'not_spreadsheet',
      'plate.xlsx is a PNG image, not a spreadsheet. Upload an xlsx, xls or csv file.',
    ],
    [
      'plain words named .xlsx',
      text('hello there\n'),
      'plate.xlsx',
      {},
      'not_spreadsheet',
      'plate.xlsx is text, not a spreadsheet: its lines are not split into columns by commas, semicolons or tabs. Upload the export the instrument wrote (xlsx, xls or csv).',
    ],
    [
      'prose with commas named .xlsx',
      text(
        'Run notes, rig 2\nThe seal was lost on row B after the second addition, so those wells are suspect.\nAll other wells looked fine to me.\n',
      ),
      'plate.xlsx',
      {},
      'not_spreadsheet',
      'plate.xlsx is text, not a spreadsheet: its lines are not split into columns by commas, semicolons or tabs. Upload the export the instrument wrote (xlsx, xls or csv).',
    ],
    [
      'a csv that is not UTF-8',
      latin1,
      'plate.csv',
      {},
      'not_utf8',
      'plate.csv is not valid UTF-8 text: byte 0xB5 at offset 12 (line 2) cannot be read. Save the file as CSV with UTF-8 encoding and upload it again.',
    ],
    [
      'a ZIP without a workbook',
      new Uint8Array(zip([{ name: 'notes/readme.txt', data: Buffer.from('hello') }])),
      'plate.xlsx',
      {},
      'not_spreadsheet',
      'plate.xlsx holds no readable workbook: it is not an xlsx or xls spreadsheet, or it is damaged.',
    ],
    [
      'a damaged compound file',
      new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, ...new Array<number>(600).fill(7)]),
      'plate.xls',
      {},
      'unreadable',
      /^plate\.xls looks like an xls file but could not be read/,
    ],
    [
      'an unclosed quote',
      text('Well,Note\nA01,"open\n'),
      'plate.csv',
      {},
      'unreadable',
      'plate.csv could not be read as CSV: a quoted field that starts on row 2 is never closed.',
    ],
    [
      'a file over the size limit',
      text('Well\nA01\n'.repeat(20)),
      'plate.csv',
      { maxBytes: 100 },
      'too_large',
      'plate.csv is 180 bytes; Gatewell reads files up to 100 bytes.',
    ],
    [
      'too many rows of text',
      text('Well\nA01\nA02\nA03\n'),
      'plate.csv',
      { maxRows: 3 },
      'too_many_rows',
      'plate.csv is too big to import: it has more than 3 rows.',
    ],
    [
      'too many columns of text',
      text('a,b,c,d\n'),
      'plate.csv',
      { maxColumns: 3 },
      'too_many_columns',
      'plate.csv is too big to import: row 1 has more than 3 columns.',
    ],
  ])('%s', async (_name, bytes, filename, options, code, message) => {
    const result = await parseSpreadsheet(bytes, filename, options);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.error.code).toBe(code);
    if (typeof message === 'string') expect(result.error.message).toBe(message);
    else expect(result.error.message).toMatch(message);
  });

  test('workbook limits: rows, time and memory', async () => {
    const bytes = workbookBytes({ Readouts: XLSX.utils.aoa_to_sheet([['Well'], ['A01'], ['A02'], ['A03']]) });
    const rows = await parseSpreadsheet(bytes, 'plate.xlsx', { maxRows: 3 });
    expect(rows).toEqual({
      ok: false,
      error: {
        code: 'too_many_rows',
        message: 'plate.xlsx is too big to import: sheet "Readouts" has more than 3 rows.',
      },
    });
    // A workbook cut off after 300 bytes sends the workbook library into a loop that never ends (seen to run
    // 40 s, the whole deadline given): the deadline is what stops it, however fast the machine.
    const torn = workbookWithCells([['Well'], ['A01']]).subarray(0, 300);
    const endless = await parseSpreadsheet(torn, 'torn.xlsx', { timeoutMs: 2000 });
    expect(endless).toEqual({
      ok: false,
      error: {
        code: 'timed_out',
        message:
          'torn.xlsx took longer than 2 s to read and was stopped. Remove extra sheets or rows and upload it again.',
      },
    });
    const small = await parseSpreadsheet(bytes, 'plate.xlsx', { maxMemoryMb: 2 });
    expect(small).toMatchObject({ ok: false, error: { code: 'too_complex' } });
  });

  // The unpacked-size limit of zip workbooks (parse-worker.mjs): a 3 MB bomb is refused under a 2 MB limit
  // and read under a 4 MB one, so the refusal is the limit's and not some other failure; a lying size in
  // the zip's headers is caught by inflating under the cap. Fails if the check is missing or trusts headers.
  test('zip workbooks: what they unpack to is limited, whatever sizes their headers declare', async () => {
    const MB = 1024 * 1024;
    const refusal = {
      ok: false,
      error: {
        code: 'too_large',
        message:
          'bomb.xlsx unpacks to more than 2 MB; Gatewell reads workbooks that unpack to at most 2 MB. Remove extra sheets or rows and upload it again.',
      },
    };
    const honest = await zipBombXlsx(3);
    expect(await parseSpreadsheet(honest, 'bomb.xlsx', { maxInflatedBytes: 2 * MB })).toEqual(refusal);
    const lying = await zipBombXlsx(3, 1000);
    expect(await parseSpreadsheet(lying, 'bomb.xlsx', { maxInflatedBytes: 2 * MB })).toEqual(refusal);
    const read = await parseSpreadsheet(honest, 'bomb.xlsx', { maxInflatedBytes: 4 * MB });
    expect(read).toMatchObject({ ok: true, sheets: [{ name: 'Plate', rows: [['Well']] }] });
  });

  test('the default size limit is 10 MB', async () => {
    const result = await parseSpreadsheet(new Uint8Array(10 * 1024 * 1024 + 1), 'huge.csv');
    expect(result).toEqual({
      ok: false,
      error: { code: 'too_large', message: 'huge.csv is 10.0 MB; Gatewell reads files up to 10 MB.' },
    });
  });

  test('options are checked', async () => {
    await expect(parseSpreadsheet(text('a'), 'a.csv', { timeoutMs: 0 })).rejects.toThrow(
      'parseSpreadsheet: timeoutMs must be a positive integer',
    );
  });
});
