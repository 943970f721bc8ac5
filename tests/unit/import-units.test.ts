import si from '../fixtures/check-values/si-prefixes-bipm-2019.json';
import { describe, expect, test } from 'vitest';
import { readQuantity, readText } from '@/lib/imports/read-cell';
import { fromCanonical, parseUnit, toCanonical, type QuantityKind, type Unit } from '@/lib/imports/units';

// Unit factors are SI prefixes (BIPM SI Brochure, 9th edition, table 7; si-prefixes-bipm-2019.json in
// tests/fixtures/check-values): p = 1e-12, n = 1e-9, µ = 1e-6, m = 1e-3, M = 1e6, G = 1e9.
describe('toCanonical', () => {
  const cases: [number, Unit, QuantityKind, number][] = [
    [1000, 'nM', 'concentration', 1],
    [300, 'nM', 'concentration', 0.3],
    [0.3, 'nM', 'concentration', 0.0003],
    [500, 'pM', 'concentration', 0.0005],
    [2.5, 'uM', 'concentration', 2.5],
    [1, 'mM', 'concentration', 1000],
    [1, 'M', 'concentration', 1_000_000],
    [-2.3456, 'nA', 'current', -2345.6],
    [-812.4, 'pA', 'current', -812.4],
    [1500, 'MOhm', 'sealResistance', 1.5],
    [1.2, 'GOhm', 'sealResistance', 1.2],
    [0.012, 'GOhm', 'seriesResistance', 12],
    [7.5, 'MOhm', 'seriesResistance', 7.5],
    [0.018, 'nF', 'capacitance', 18],
    [18, 'pF', 'capacitance', 18],
  ];
  test.each(cases)('%d %s of %s is %d in the canonical unit', (value, unit, kind, expected) => {
    expect(toCanonical(value, unit, kind)).toBe(expected);
  });

  test('the expected values above follow from the SI prefixes', () => {
    // Canonical units: µM, pA, GΩ (seal), MΩ (series), pF. Each unit's prefix, and each kind's canonical prefix.
    const prefix: Record<Unit, keyof typeof si.prefixFactors> = {
      pM: 'p',
      nM: 'n',
      uM: 'µ',
      mM: 'm',
      M: '',
      pA: 'p',
      nA: 'n',
      MOhm: 'M',
      GOhm: 'G',
      pF: 'p',
      nF: 'n',
    };
    const canonical: Record<QuantityKind, keyof typeof si.prefixFactors> = {
      concentration: 'µ',
      current: 'p',
      sealResistance: 'G',
      seriesResistance: 'M',
      capacitance: 'p',
    };
    for (const [value, unit, kind, expected] of cases) {
      const fromPrefixes = (value * si.prefixFactors[prefix[unit]]) / si.prefixFactors[canonical[kind]];
      expect(Math.abs(expected - fromPrefixes)).toBeLessThanOrEqual(1e-12 * Math.abs(expected));
    }
  });

  test('fromCanonical undoes toCanonical', () => {
    expect(fromCanonical(0.3, 'nM', 'concentration')).toBe(300);
    expect(fromCanonical(-2345.6, 'nA', 'current')).toBe(-2.3456);
    expect(toCanonical(fromCanonical(1.234, 'MOhm', 'sealResistance'), 'MOhm', 'sealResistance')).toBe(1.234);
  });
});

describe('parseUnit', () => {
  test.each<[string, QuantityKind, Unit | null]>([
    ['nM', 'concentration', 'nM'],
    ['µM', 'concentration', 'uM'],
    ['μM', 'concentration', 'uM'],
    ['uM', 'concentration', 'uM'],
    ['umol/L', 'concentration', 'uM'],
    ['(mM)', 'concentration', 'mM'],
    ['M', 'concentration', 'M'],
    ['[pA]', 'current', 'pA'],
    ['nA', 'current', 'nA'],
    ['GΩ', 'sealResistance', 'GOhm'],
    ['MOhm', 'seriesResistance', 'MOhm'],
    ['Mohms', 'sealResistance', 'MOhm'],
    ['pF', 'capacitance', 'pF'],
    ['pA', 'concentration', null],
    ['kg', 'capacitance', null],
  ])('"%s" as a %s unit is %s', (text, kind, expected) => {
    expect(parseUnit(text, kind)).toBe(expected);
  });
});

describe('readQuantity', () => {
  test.each<[string | number | boolean | null, number | null]>([
    [1000, 1],
    ['1000', 1],
    [' 1e3 ', 1],
    ['300 nM', 0.3],
    ['2 µM', 2],
    ['', null],
    [null, null],
    ['NA', null],
    ['n/a', null],
    ['-', null],
    ['#N/A', null],
  ])('%j in a nM column reads as %j µM', (cell, expected) => {
    expect(readQuantity(cell, 'concentration', 'nM')).toEqual({ ok: true, value: expected });
  });

  test.each<[string | boolean, string, string]>([
    ['NaN', 'not_finite', '"NaN" is not a finite number'],
    ['Infinity', 'not_finite', '"Infinity" is not a finite number'],
    ['-inf', 'not_finite', '"-inf" is not a finite number'],
    ['1e400', 'not_finite', '"1e400" is not a finite number'],
    ['abc', 'not_numeric', '"abc" is not a number'],
    ['<0.1', 'not_numeric', '"<0.1" is not a number'],
    ['1.2.3', 'not_numeric', '"1.2.3" is not a number'],
    ['#DIV/0!', 'not_numeric', '"#DIV/0!" is not a number'],
    [true, 'not_numeric', 'TRUE is not a number'],
    ['5 pA', 'unknown_unit', '"5 pA" has the unit "pA", which is not one of pM, nM, µM, mM, M'],
  ])('%j is refused as %s', (cell, code, detail) => {
    expect(readQuantity(cell, 'concentration', 'nM')).toEqual({ ok: false, code, detail });
  });

  test('a decimal comma is read only where the sheet uses one', () => {
    expect(readQuantity('1,5', 'current', 'nA', true)).toEqual({ ok: true, value: 1500 });
    expect(readQuantity('1,5', 'current', 'nA', false)).toMatchObject({ ok: false, code: 'not_numeric' });
  });

  test('readText trims, writes numbers out and treats missing markers as empty', () => {
    expect(readText('  GW-0001 ')).toBe('GW-0001');
    expect(readText(12345)).toBe('12345');
    expect(readText('N/A')).toBeNull();
    expect(readText(undefined)).toBeNull();
  });
});
