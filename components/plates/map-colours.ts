// The plate map's colourings: pure functions from a well's facts to a fill, and each colouring's legend.
// Colours are Gatewell's own choice unless a line says otherwise. No React here, so unit tests import it.
import { scaleLinear } from 'd3-scale';

/** The ways the plate map colours its wells, in Gatewell's words. */
export const MAP_MODES = ['block', 'qc', 'compound', 'concentration', 'role', 'excluded'] as const;
export type MapMode = (typeof MAP_MODES)[number];

export const MAP_MODE_LABEL: Record<MapMode, string> = {
  block: 'Fractional block',
  qc: 'QC status',
  compound: 'Compound',
  concentration: 'Concentration',
  role: 'Role',
  excluded: 'Excluded wells',
};

/** What the colourings read of a well (a subset of the wells answer, so tests build it by hand). */
export interface MapWell {
  role: 'vehicle' | 'reference' | 'test';
  compound: string | null;
  concentration_uM: number | null;
  fractionalBlock: number | null;
  excluded: boolean;
  qcReasons: readonly { code: string; message: string }[];
}

export const EMPTY_FILL = '#ffffff';
export const NO_VALUE_FILL = '#eef1f4';

const blockRamp = scaleLinear<string>()
  .domain([0, 0.5, 1])
  .range(['#f1efe6', '#5fb3b0', '#0b3f4a'])
  .clamp(true);

/** QC: blue passed, orange failed, grey excluded (blue against orange stays apart for red–green colour blindness, common practice, no source). */
export const QC_FILL = { pass: '#3d86c6', fail: '#e0851b', excluded: '#a7b3bf' } as const;

export const ROLE_FILL = { vehicle: '#e6dcc4', reference: '#6b4596', test: '#4f9fc9' } as const;
export const ROLE_LABEL = {
  vehicle: 'Vehicle',
  reference: 'Reference blocker',
  test: 'Test compound',
} as const;

export const EXCLUDED_FILL = { excluded: '#33414f', kept: '#dfe7ee' } as const;

/**
 * Seven colours for the first compounds: the colour-blind-safe set of Okabe and Ito, "Color Universal
 * Design" (2008), without its black (hex values from memory). Further compounds get hues a golden angle
 * apart at two lightnesses, told apart by the legend and the well's facts rather than by colour alone.
 */
const COMPOUND_FILLS = ['#e69f00', '#56b4e9', '#009e73', '#f0e442', '#0072b2', '#d55e00', '#cc79a7'];

export function compoundFill(index: number): string {
  if (index < COMPOUND_FILLS.length) return COMPOUND_FILLS[index]!;
  const k = index - COMPOUND_FILLS.length;
  return `hsl(${Math.round((k * 137.508) % 360)} 55% ${k % 2 ? 36 : 68}%)`;
}

/**
 * Concentration ramp of our own, light to dark with lightness falling at every stop, so that order reads
 * without telling hues apart.
 */
export const CONCENTRATION_RAMP = ['#fbf1c3', '#a6d8a0', '#3fa29c', '#2f5f93', '#2a1c5a'] as const;
const concentrationRamp = scaleLinear<string>()
  .domain(CONCENTRATION_RAMP.map((_, i) => i / (CONCENTRATION_RAMP.length - 1)))
  .range([...CONCENTRATION_RAMP])
  .clamp(true);

/**
 * Where a concentration sits between the lowest and highest of the plate on a log10 scale, 0 to 1
 * (clamped); equal ends put every concentration in the middle. Null for a missing or non-positive one.
 */
export function logPosition(concentration_uM: number | null, lo_uM: number, hi_uM: number): number | null {
  if (concentration_uM === null || !(concentration_uM > 0) || !(lo_uM > 0) || !(hi_uM > 0)) return null;
  if (hi_uM <= lo_uM) return 0.5;
  const t = (Math.log10(concentration_uM) - Math.log10(lo_uM)) / (Math.log10(hi_uM) - Math.log10(lo_uM));
  return Math.min(1, Math.max(0, t));
}

/** The colour of a position 0–1 on the concentration ramp. */
export const concentrationFill = (t: number): string => concentrationRamp(t);

/** Facts of the whole map a colouring needs: the compounds in order and the concentration range. */
export interface MapContext {
  compounds: string[];
  concentrations_uM: number[];
}

export function mapContext(wells: readonly MapWell[]): MapContext {
  const compounds = [
    ...new Set(wells.filter((w) => w.role === 'test' && w.compound).map((w) => w.compound!)),
  ].sort();
  const concentrations_uM = [
    ...new Set(wells.map((w) => w.concentration_uM).filter((c): c is number => c !== null && c > 0)),
  ].sort((a, b) => a - b);
  return { compounds, concentrations_uM };
}

/** A well's fill under a colouring. */
export function wellFill(w: MapWell | undefined, mode: MapMode, context: MapContext): string {
  if (!w) return EMPTY_FILL;
  switch (mode) {
    case 'qc':
      return w.excluded ? QC_FILL.excluded : w.qcReasons.length ? QC_FILL.fail : QC_FILL.pass;
    case 'compound': {
      if (w.role !== 'test') return ROLE_FILL[w.role];
      const index = w.compound ? context.compounds.indexOf(w.compound) : -1;
      return index < 0 ? NO_VALUE_FILL : compoundFill(index);
    }
    case 'concentration': {
      const t = logPosition(
        w.concentration_uM,
        context.concentrations_uM[0] ?? 0,
        context.concentrations_uM.at(-1) ?? 0,
      );
      return t === null ? NO_VALUE_FILL : concentrationFill(t);
    }
    case 'role':
      return ROLE_FILL[w.role];
    case 'excluded':
      return w.excluded ? EXCLUDED_FILL.excluded : EXCLUDED_FILL.kept;
    case 'block':
      return w.fractionalBlock === null ? NO_VALUE_FILL : blockRamp(w.fractionalBlock);
  }
}

/** Whether dark text reads on a fill (a light fill); for the V and R marks drawn on control wells. */
export function isDarkFill(fill: string): boolean {
  const hex = /^#([0-9a-f]{6})$/i.exec(fill)?.[1];
  if (!hex) return /hsl\(.* 36%\)/.test(fill);
  const [r, g, b] = [0, 2, 4].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255) as [number, number, number];
  // Relative luminance weights of sRGB (ITU-R BT.709), without the gamma step: enough to pick a text colour.
  return 0.2126 * r + 0.7152 * g + 0.0722 * b < 0.5;
}

export interface LegendItem {
  fill: string;
  label: string;
  /** Drawn struck through, as excluded wells are on the map. */
  struck?: boolean;
}

const concentrationText = (c: number) => `${Number(c.toPrecision(3))} µM`;

/**
 * The legend of a colouring: every compound by identifier, every concentration of the plate (or, beyond
 * twelve, the ends and decades between), and the fixed colours of the other colourings.
 */
export function mapLegend(mode: MapMode, context: MapContext): LegendItem[] {
  switch (mode) {
    case 'qc':
      return [
        { fill: QC_FILL.pass, label: 'QC passed' },
        { fill: QC_FILL.fail, label: 'QC failed' },
        { fill: QC_FILL.excluded, label: 'Excluded', struck: true },
      ];
    case 'compound':
      return [
        ...context.compounds.map((c, i) => ({ fill: compoundFill(i), label: c })),
        { fill: ROLE_FILL.vehicle, label: ROLE_LABEL.vehicle },
        { fill: ROLE_FILL.reference, label: ROLE_LABEL.reference },
      ];
    case 'concentration': {
      const all = context.concentrations_uM;
      const lo = all[0];
      const hi = all.at(-1);
      if (lo === undefined || hi === undefined) return [{ fill: NO_VALUE_FILL, label: 'No concentration' }];
      let shown = all;
      if (all.length > 12) {
        const decades: number[] = [];
        for (let e = Math.ceil(Math.log10(lo)); 10 ** e < hi; e += 1) if (10 ** e > lo) decades.push(10 ** e);
        shown = [lo, ...decades, hi];
      }
      return [
        ...shown.map((c) => ({
          fill: concentrationFill(logPosition(c, lo, hi)!),
          label: concentrationText(c),
        })),
        { fill: NO_VALUE_FILL, label: 'No concentration (vehicle)' },
      ];
    }
    case 'role':
      return (['vehicle', 'reference', 'test'] as const).map((r) => ({
        fill: ROLE_FILL[r],
        label: ROLE_LABEL[r],
      }));
    case 'excluded':
      return [
        { fill: EXCLUDED_FILL.kept, label: 'Kept' },
        { fill: EXCLUDED_FILL.excluded, label: 'Excluded', struck: true },
      ];
    case 'block':
      return [
        { fill: blockRamp(0), label: '0 % block' },
        { fill: blockRamp(0.5), label: '50 %' },
        { fill: blockRamp(1), label: '100 %' },
        { fill: NO_VALUE_FILL, label: 'No value' },
      ];
  }
}
