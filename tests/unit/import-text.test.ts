import utf8 from '../fixtures/check-values/utf8-well-formed-unicode.json';
import { describe, expect, test } from 'vitest';
import { sniffUpload } from '@/lib/imports/sniff-upload';
import { decodeText, firstInvalidUtf8 } from '@/lib/imports/text-decoding';

// Well-formed UTF-8 byte sequences: RFC 3629 section 4 and the Unicode Standard, table 3-7
// (utf8-well-formed-unicode.json in tests/fixtures/check-values).
describe('firstInvalidUtf8', () => {
  const cases: [string, number[], number][] = [
    ['ASCII', [0x41, 0x42], 2],
    ['µ (C2 B5)', [0x41, 0xc2, 0xb5], 3],
    ['Ω (E2 84 A6)', [0xe2, 0x84, 0xa6], 3],
    ['a four-byte code point (F0 9F 98 80)', [0xf0, 0x9f, 0x98, 0x80], 4],
    ['a lone Latin-1 byte', [0x41, 0xb5, 0x41], 1],
    ['an overlong two-byte form (C0 AF)', [0xc0, 0xaf], 0],
    ['an overlong three-byte form (E0 80 AF)', [0x41, 0xe0, 0x80, 0xaf], 1],
    ['a surrogate (ED A0 80)', [0xed, 0xa0, 0x80], 0],
    ['above U+10FFFF (F4 90 80 80)', [0xf4, 0x90, 0x80, 0x80], 0],
    ['a truncated sequence at the end', [0x41, 0xe2, 0x84], 1],
  ];
  test.each(cases)('%s', (_name, bytes, expected) => {
    expect(firstInvalidUtf8(new Uint8Array(bytes))).toBe(expected);
  });

  test('the expected offsets above agree with a plain reading of table 3-7', () => {
    // Each row of the table: the allowed range of each byte ("C2..DF", or one byte "E0").
    const rows = utf8.wellFormedSequences.map((row) =>
      row.bytes.map((range) => {
        const [lo, hi = lo] = range.split('..').map((hex) => parseInt(hex, 16));
        return [lo!, hi!] as const;
      }),
    );
    const firstIllFormed = (bytes: number[]) => {
      let i = 0;
      while (i < bytes.length) {
        const at = i;
        const row = rows.find((r) =>
          r.every(([lo, hi], k) => at + k < bytes.length && bytes[at + k]! >= lo && bytes[at + k]! <= hi),
        );
        if (!row) return i;
        i += row.length;
      }
      return i;
    };
    for (const [, bytes, expected] of cases) expect(firstIllFormed(bytes)).toBe(expected);
  });
});

describe('decodeText', () => {
  test('drops a UTF-8 byte-order mark and reports where bad bytes are, counting lines', () => {
    expect(decodeText(new Uint8Array([0xef, 0xbb, 0xbf, 0x41]))).toEqual({ ok: true, text: 'A' });
    expect(decodeText(new Uint8Array([0xef, 0xbb, 0xbf, 0x41, 0x0a, 0x42, 0xff]))).toEqual({
      ok: false,
      offset: 6,
      line: 2,
      byte: 0xff,
    });
  });
});

describe('sniffUpload', () => {
  const bytes = (...values: number[]) => new Uint8Array(values);
  test.each<[string, Uint8Array, string, string]>([
    ['a ZIP is an xlsx workbook', bytes(0x50, 0x4b, 0x03, 0x04, 0), 'plate.csv', 'workbook'],
    [
      'a compound file is an xls workbook',
      bytes(0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1),
      'plate.xlsx',
      'workbook',
    ],
    ['a PDF is refused', bytes(0x25, 0x50, 0x44, 0x46, 0x2d), 'plate.xlsx', 'refused'],
    [
      'text with commas is delimited text, whatever its name',
      new TextEncoder().encode('Well,Conc\n'),
      'plate.xlsx',
      'delimited',
    ],
    [
      'a CSV with a title row named .xlsx is delimited text',
      new TextEncoder().encode('Instrument run 12\n\nWell,Compound,Conc\nA01,DMSO,\nA02,GW-1,3\n'),
      'plate.xlsx',
      'delimited',
    ],
    [
      'tab-separated text named .ods is delimited text',
      new TextEncoder().encode('Well\tConc\tTarget\nA01\t3\tKv7.2\n'),
      'plate.ods',
      'delimited',
    ],
    [
      'semicolons after a sep= hint, named without an extension',
      new TextEncoder().encode('sep=;\nWell;Conc;Target\nA01;3,5;Kv7.2\n'),
      'plate',
      'delimited',
    ],
    [
      'a free-text comment column does not hide the table',
      new TextEncoder().encode(
        'Well,Conc,Comment\nA01,3,seal was lost after the second addition of compound\nA02,1,fine\n',
      ),
      'plate.xlsx',
      'delimited',
    ],
    [
      'prose whose lines hold commas is refused, whatever its name',
      new TextEncoder().encode(
        'Dear team, the run on rig 2 failed this morning.\nThe seal was poor, and we stopped.\nRegards, Ann\n',
      ),
      'plate.xlsx',
      'refused',
    ],
    ['one line of words is refused', new TextEncoder().encode('hello there\n'), 'plate.xls', 'refused'],
    [
      'a table page named .xlsx is markup',
      new TextEncoder().encode('<html><body><table><tr><td>Well</td></tr></table></body></html>'),
      'plate.xlsx',
      'markup',
    ],
    [
      'prose named .csv is taken at its name (the check step then finds no header row)',
      new TextEncoder().encode('hello there\n'),
      'plate.csv',
      'delimited',
    ],
    [
      'a table page named .xls is markup',
      new TextEncoder().encode('<table><tr><td>Well</td></tr></table>'),
      'plate.xls',
      'markup',
    ],
  ])('%s', (_name, input, filename, kind) => {
    expect(sniffUpload(input, filename).kind).toBe(kind);
  });
});
