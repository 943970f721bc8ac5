import { createHash } from 'node:crypto';
import { describe, expect, test } from 'vitest';
import { canonicalJson, contentSha256 } from '@/lib/auth/canonical-json';

describe('canonical JSON of signed content', () => {
  test.each([
    [{ b: 1, a: [3, { d: true, c: null }] }, '{"a":[3,{"c":null,"d":true}],"b":1}'],
    [{ z: 'é', y: undefined, x: [undefined, 1.5] }, '{"x":[null,1.5],"z":"é"}'],
    [{ when: new Date('2026-12-01T09:30:00Z') }, '{"when":"2026-12-01T09:30:00.000Z"}'],
    [[], '[]'],
    ['plain text', '"plain text"'],
  ])('%o is written as %s', (value, expected) => {
    expect(canonicalJson(value)).toBe(expected);
  });

  test('key order does not change the hash; a changed value does', () => {
    const one = contentSha256({ plate: 'P-1', wells: [{ id: 'A1', excluded: false }], ic50_uM: 1.2 });
    const same = contentSha256({ ic50_uM: 1.2, wells: [{ excluded: false, id: 'A1' }], plate: 'P-1' });
    const changed = contentSha256({ plate: 'P-1', wells: [{ id: 'A1', excluded: true }], ic50_uM: 1.2 });
    expect(same).toBe(one);
    expect(changed).not.toBe(one);
  });

  test('the hash is the SHA-256 of the canonical text, in lower-case hex', () => {
    // Computed independently with Node's crypto over the canonical text written out by hand.
    const expected = createHash('sha256').update('{"a":1,"b":[true,"x"]}', 'utf8').digest('hex');
    expect(contentSha256({ b: [true, 'x'], a: 1 })).toBe(expected);
  });

  test.each([[Number.NaN], [Number.POSITIVE_INFINITY], [{ n: 10n }], [undefined]])('refuses %o', (value) => {
    expect(() => canonicalJson(value)).toThrow(TypeError);
  });
});
