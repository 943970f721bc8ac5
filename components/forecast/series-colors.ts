import { scaleLinear } from 'd3-scale';

/** Control is drawn in ink; exposures from the lowest (lagoon) to the highest (amber). */
export const CONTROL_COLOR = '#12202f';

/** A colour per exposure, lowest to highest concentration. */
export function exposureColors(count: number): string[] {
  if (count <= 1) return ['#0f7479'];
  const scale = scaleLinear<string>()
    .domain([0, count - 1])
    .range(['#168f94', '#9a5b00']);
  return Array.from({ length: count }, (_, i) => scale(i));
}

/** Concentrations in µM as people write them (no trailing zeros). */
export function umText(value: number): string {
  return `${Number(value.toPrecision(3))} µM`;
}
