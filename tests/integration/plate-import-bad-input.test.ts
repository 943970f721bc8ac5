import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { commitImport, inspectUpload } from '@/lib/plates/import-service';
import { importRowCounts } from '../support/import-counts';
import { potassiumImportSetup } from '../support/demo-scenario';

const HEADER = 'Well,Compound,Conc (uM),Target,I control (pA),I compound (pA),Rseal (GOhm),Rs (MOhm),Cm (pF)';
const GOOD = [
  'A01,DMSO,,Kv7.2,900,880,1.5,4,18',
  'A02,GW-0001,30,Kv7.2,800,450,1.8,4,18',
  'A03,GW-0001,10,Kv7.2,820,600,1.8,4,18',
  'A04,GW-0001,3,Kv7.2,810,700,1.8,4,18',
];
const csv = (...lines: string[]) => new TextEncoder().encode(`${lines.join('\n')}\n`);

describe('bad plate exports are refused with a clear message, and nothing is written', () => {
  let biologist: Actor;
  let screenId: string;

  beforeAll(async () => {
    ({ biologist, screenId } = await potassiumImportSetup());
  });
  afterAll(() => db().close());

  async function attempt(bytes: Uint8Array, filename = 'bad.csv') {
    const upload = { screenId, bytes, filename, mediaType: 'text/csv' };
    const inspection = await inspectUpload(biologist, upload);
    const sheet = inspection.sheets[0]!;
    return commitImport(biologist, {
      draftId: inspection.draftId!,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
      label: 'BAD',
    });
  }

  test.each([
    [
      'garbage bytes named .xlsx',
      new Uint8Array([0x50, 0x4b, 0x03, 0x04, 1, 2, 3, 4, 5, 6, 7, 8]),
      'bad.xlsx',
      /bad\.xlsx/,
    ],
    ['an empty file', new Uint8Array(), 'empty.csv', /empty\.csv is empty/],
    [
      'a missing required column',
      csv('Well,Compound,Target,I control (pA),I compound (pA)', 'A01,DMSO,Kv7.2,900,880'),
      'bad.csv',
      /concentration/,
    ],
    [
      'a non-numeric current',
      csv(HEADER, ...GOOD, 'A05,GW-0001,1,Kv7.2,lots,700,1.8,4,18'),
      'bad.csv',
      /row 6, column E "I control \(pA\)"/,
    ],
    [
      'a negative concentration',
      csv(HEADER, ...GOOD, 'A05,GW-0001,-1,Kv7.2,800,700,1.8,4,18'),
      'bad.csv',
      /row 6, column C "Conc \(uM\)"/,
    ],
    [
      'a zero control current',
      csv(HEADER, ...GOOD, 'A05,GW-0001,1,Kv7.2,0,700,1.8,4,18'),
      'bad.csv',
      /row 6, column E .*control current is 0/,
    ],
    [
      'an unknown compound',
      csv(HEADER, ...GOOD, 'A05,GW-9999,1,Kv7.2,800,700,1.8,4,18'),
      'bad.csv',
      /row 6, column B "Compound".*GW-9999/,
    ],
    [
      'an unknown target',
      csv(HEADER, ...GOOD, 'A05,GW-0001,1,Kv9.9,800,700,1.8,4,18'),
      'bad.csv',
      /row 6, column D "Target".*Kv9\.9/,
    ],
    [
      'a duplicate well and target',
      csv(HEADER, ...GOOD, 'A04,GW-0001,3,Kv7.2,810,700,1.8,4,18'),
      'bad.csv',
      /row 6/,
    ],
    [
      'a well outside the plate',
      csv(HEADER, ...GOOD, 'A99,GW-0001,1,Kv7.2,800,700,1.8,4,18'),
      'bad.csv',
      /row 6, column A "Well"/,
    ],
  ])('%s', async (_name, bytes, filename, message) => {
    const before = await importRowCounts();
    await expect(attempt(bytes, filename)).rejects.toMatchObject({ message: expect.stringMatching(message) });
    expect(await importRowCounts()).toEqual(before);
  });
});
