import type { ConditionView } from '@/lib/validation/forecasts';

/** A number to a few significant digits, or a dash. */
export const sig = (v: number | null, digits = 3) =>
  v === null ? '—' : Number(v.toPrecision(digits)).toString();

/** A fraction as a percentage with one decimal. */
export const percent = (v: number) => `${(v * 100).toFixed(1)} %`;

/** A signed relative change ("+12.3 %"), or nothing when there is none. */
export function relativeText(v: number | null): string {
  if (v === null || Math.abs(v) < 0.0005) return '';
  const p = v * 100;
  return `${p > 0 ? '+' : p < 0 ? '−' : '±'}${Math.abs(p).toFixed(1)} %`;
}

/** A signed difference in the measure's own unit ("+1.2 mV"). */
export function deltaText(v: number | null, unit: string): string {
  if (v === null || Math.abs(v) < 0.05) return '';
  return `${v > 0 ? '+' : v < 0 ? '−' : '±'}${Math.abs(v).toFixed(1)} ${unit}`;
}

const FLAG_TEXT: Record<string, string> = {
  'loss-of-firing': 'Loss of firing',
  'depolarisation-block': 'Depolarisation block',
  'firing-stops': 'Firing stops during the step',
  'spontaneous-firing': 'Fires at rest',
  'no-stable-rest': 'No stable rest',
};

/** The forecast's flags in words. */
export function flagText(flags: string[]): string {
  return flags.length ? flags.map((f) => FLAG_TEXT[f] ?? f).join(', ') : 'None';
}

/** Blocked conductances of a condition, e.g. "gNa 69.0 %, gM 1.2 %". */
export function blockText(c: ConditionView): string {
  const parts = Object.entries(c.block)
    .filter(([, b]) => b > 0)
    .map(([g, b]) => `${g} ${percent(b)}`);
  return parts.length ? parts.join(', ') : 'none';
}
