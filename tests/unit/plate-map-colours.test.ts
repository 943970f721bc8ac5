import { describe, expect, test } from 'vitest';
import {
  CONCENTRATION_RAMP,
  MAP_MODES,
  compoundFill,
  concentrationFill,
  logPosition,
  mapContext,
  mapLegend,
  wellFill,
  type MapWell,
} from '@/components/plates/map-colours';

// Expected positions are log10 arithmetic worked by hand (no outside source needed): log10 of 0.01, 0.1,
// 1 and 100 are −2, −1, 0 and 2.
describe('log-scale position of a concentration on the plate map', () => {
  test('decades are equally spaced between the lowest and highest concentration', () => {
    expect(logPosition(0.01, 0.01, 100)).toBe(0);
    expect(logPosition(0.1, 0.01, 100)).toBeCloseTo(0.25, 12);
    expect(logPosition(1, 0.01, 100)).toBeCloseTo(0.5, 12);
    expect(logPosition(100, 0.01, 100)).toBe(1);
  });

  test('outside the range it is clamped; a missing, zero or negative concentration has none', () => {
    expect(logPosition(1000, 0.01, 100)).toBe(1);
    expect(logPosition(0.001, 0.01, 100)).toBe(0);
    expect(logPosition(null, 0.01, 100)).toBeNull();
    expect(logPosition(0, 0.01, 100)).toBeNull();
    expect(logPosition(-1, 0.01, 100)).toBeNull();
    // One concentration on the whole plate sits in the middle of the ramp.
    expect(logPosition(3, 3, 3)).toBe(0.5);
  });

  // Relative luminance as WCAG 2.1 defines it (W3C, "relative luminance", sRGB linearised).
  const luminance = (css: string) => {
    const [r, g, b] = (/rgb\((\d+), (\d+), (\d+)\)/.exec(css) ?? /#(..)(..)(..)/.exec(css))!
      .slice(1)
      .map((v) => (css.startsWith('#') ? parseInt(v, 16) : Number(v)) / 255)
      .map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4)) as [number, number, number];
    return 0.2126 * r + 0.7152 * g + 0.0722 * b;
  };

  test('the ramp runs from light to dark with no step back, so order reads without hue', () => {
    expect(concentrationFill(0)).toBe(toRgb(CONCENTRATION_RAMP[0]));
    expect(concentrationFill(1)).toBe(toRgb(CONCENTRATION_RAMP.at(-1)!));
    const steps = Array.from({ length: 21 }, (_, i) => luminance(concentrationFill(i / 20)));
    for (let i = 1; i < steps.length; i += 1) expect(steps[i]!).toBeLessThan(steps[i - 1]!);
  });
});

/** d3's interpolators answer in rgb(r, g, b). */
function toRgb(hex: string) {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
  return `rgb(${r}, ${g}, ${b})`;
}

const well = (over: Partial<MapWell>): MapWell => ({
  role: 'test',
  compound: 'GW-A',
  concentration_uM: 1,
  fractionalBlock: 0.5,
  excluded: false,
  qcReasons: [],
  ...over,
});

describe('plate map colourings', () => {
  // Invented wells: two compounds at two concentrations, a vehicle well, an excluded and a failed one.
  const wells = [
    well({ compound: 'GW-A', concentration_uM: 0.1 }),
    well({ compound: 'GW-B', concentration_uM: 10, excluded: true }),
    well({ compound: 'GW-A', concentration_uM: 10, qcReasons: [{ code: 'seal', message: 'Seal low' }] }),
    well({ role: 'vehicle', compound: null, concentration_uM: null, fractionalBlock: 0 }),
  ];
  const context = mapContext(wells);

  test('each colouring tells apart the wells whose facts differ', () => {
    const fills = (mode: (typeof MAP_MODES)[number]) => wells.map((w) => wellFill(w, mode, context));
    const [a01, b10, a10, vehicle] = [0, 1, 2, 3];
    const compound = fills('compound');
    expect(compound[a01]).toBe(compound[a10]);
    expect(new Set([compound[a01], compound[b10], compound[vehicle]]).size).toBe(3);
    const concentration = fills('concentration');
    expect(concentration[b10]).toBe(concentration[a10]);
    expect(concentration[a01]).not.toBe(concentration[a10]);
    const qc = fills('qc');
    expect(new Set([qc[a01], qc[b10], qc[a10]]).size).toBe(3);
    const role = fills('role');
    expect(role[a01]).not.toBe(role[vehicle]);
    const excluded = fills('excluded');
    expect(excluded[b10]).not.toBe(excluded[a01]);
    expect(excluded[a10]).toBe(excluded[a01]);
  });

  test('the compound legend names every compound by its identifier, in the colour of its wells', () => {
    const legend = mapLegend('compound', context);
    expect(legend.map((i) => i.label)).toEqual(['GW-A', 'GW-B', 'Vehicle', 'Reference blocker']);
    expect(legend[1]!.fill).toBe(wellFill(wells[1], 'compound', context));
  });

  test('the concentration legend lists the plate’s concentrations in µM, low to high', () => {
    expect(mapLegend('concentration', context).map((i) => i.label)).toEqual([
      '0.1 µM',
      '10 µM',
      'No concentration (vehicle)',
    ]);
  });

  test('twenty compounds get twenty different colours', () => {
    expect(new Set(Array.from({ length: 20 }, (_, i) => compoundFill(i))).size).toBe(20);
  });
});
