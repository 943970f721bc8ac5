import { describe, expect, test } from 'vitest';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import {
  describeFormat,
  fitsFormat,
  inferPlateFormat,
  parseWellPosition,
  wellLabel,
} from '@/lib/imports/plate-format';
import { columnLetter } from '@/lib/imports/normalise-text';

describe('parseWellPosition', () => {
  test.each([
    ['A1', 'A01', 0, 0],
    ['A01', 'A01', 0, 0],
    ['a01', 'A01', 0, 0],
    [' b7 ', 'B07', 1, 6],
    ['B-7', 'B07', 1, 6],
    ['H12', 'H12', 7, 11],
    ['P24', 'P24', 15, 23],
    ['AA1', 'AA01', 26, 0],
    ['AF48', 'AF48', 31, 47],
  ])('%j is well %s (row %d, column %d)', (text, label, rowIndex, columnIndex) => {
    expect(parseWellPosition(text)).toEqual({ rowIndex, columnIndex, label });
  });

  test.each(['', '1', '17', 'A', 'A0', 'A00', '1A', 'ABC1', 'A1B', 'well 3'])(
    '%j is not a well position',
    (text) => {
      expect(parseWellPosition(text)).toBeNull();
    },
  );

  test('A1, A01 and a01 are the same well', () => {
    const labels = ['A1', 'A01', 'a01', 'a1'].map((text) => parseWellPosition(text)?.label);
    expect(new Set(labels)).toEqual(new Set(['A01']));
  });

  test('labels and column letters', () => {
    expect(wellLabel(31, 47)).toBe('AF48');
    expect([0, 25, 26, 51, 52].map(columnLetter)).toEqual(['A', 'Z', 'AA', 'AZ', 'BA']);
  });
});

describe('plate formats', () => {
  const at = (...labels: string[]) => labels.map((label) => parseWellPosition(label)!);

  test.each<[string[], PlateFormat | null]>([
    [['A01', 'H12'], 96],
    [['A01', 'H13'], 384],
    [['I01'], 384],
    [['P24'], 384],
    [['Q01'], 1536],
    [['A25'], 1536],
    [['AF48'], 1536],
    [['AG01'], null],
    [['A49'], null],
  ])('highest positions %j give format %s', (labels, format) => {
    expect(inferPlateFormat(at(...labels))).toBe(format);
  });

  test('positions outside a chosen format do not fit', () => {
    expect(fitsFormat(at('H12')[0]!, 96)).toBe(true);
    expect(fitsFormat(at('I01')[0]!, 96)).toBe(false);
    expect(fitsFormat(at('P25')[0]!, 384)).toBe(false);
  });

  test('formats are described with their rows and columns', () => {
    expect(describeFormat(96)).toBe('a 96-well plate (rows A–H, columns 1–12)');
    expect(describeFormat(384)).toBe('a 384-well plate (rows A–P, columns 1–24)');
    expect(describeFormat(1536)).toBe('a 1536-well plate (rows A–AF, columns 1–48)');
  });
});
