import 'server-only';
import type { ProfileFit } from './profile-fits';

/** IC50 of one target over IC50 of another; a bound when one IC50 lies above the tested range. */
export interface SelectivityRatio {
  numerator: string;
  denominator: string;
  relation: '=' | '>' | 'undetermined';
  ratio: number | null;
  /** E.g. "Kv7.2 ÷ Nav1.7 > 667". */
  text: string;
  /** E.g. "at least 667-fold more potent on Nav1.7". */
  meaning: string;
  /** Both potencies come from approved plates. */
  approved: boolean;
}

const sig = (v: number) => Number(v.toPrecision(3)).toString();

/** The IC50 (exact) or its lower bound (above the tested range, or inactive) of a chosen fit. */
function potencyOf(fit: ProfileFit): { value: number; exact: boolean } | null {
  if (fit.status === 'fitted' && fit.ic50_uM !== null) return { value: fit.ic50_uM, exact: true };
  if ((fit.status === 'above_range' || fit.status === 'inactive') && fit.ic50LowerBound_uM !== null)
    return { value: fit.ic50LowerBound_uM, exact: false };
  return null;
}

function ratioOf(a: ProfileFit, b: ProfileFit): SelectivityRatio | null {
  const pa = potencyOf(a);
  const pb = potencyOf(b);
  if (!pa || !pb) return null;
  const approved = a.approved && b.approved;
  if (!pa.exact && !pb.exact) {
    return {
      numerator: b.target,
      denominator: a.target,
      relation: 'undetermined',
      ratio: null,
      text: `${b.target} ÷ ${a.target}: not determined`,
      meaning: 'Both IC50s lie above the tested range; no ratio can be given.',
      approved,
    };
  }
  // The more potent (or the only exact) target goes below the line, so that a ratio above 1 reads as selectivity for it.
  const [num, den, pn, pd] = !pa.exact || (pb.exact && pb.value < pa.value) ? [a, b, pa, pb] : [b, a, pb, pa];
  const ratio = pn.value / pd.value;
  const relation = pn.exact ? '=' : '>';
  const text = `${num.target} ÷ ${den.target} ${relation === '=' ? '=' : '>'} ${sig(ratio)}`;
  const meaning =
    ratio >= 1
      ? `${relation === '>' ? 'at least ' : ''}${sig(ratio)}-fold more potent on ${den.target}`
      : `the tested range does not show which target is more potent (${num.target} IC50 above ${sig(pn.value)} µM)`;
  return { numerator: num.target, denominator: den.target, relation, ratio, text, meaning, approved };
}

/** Ratios between every pair of targets with a potency (by target name), from the chosen fit of each. */
export function selectivityRatios(chosen: ProfileFit[]): SelectivityRatio[] {
  const fits = [...chosen].sort((x, y) => x.target.localeCompare(y.target));
  const ratios: SelectivityRatio[] = [];
  for (let i = 0; i < fits.length; i++) {
    for (let j = i + 1; j < fits.length; j++) {
      const r = ratioOf(fits[i]!, fits[j]!);
      if (r) ratios.push(r);
    }
  }
  return ratios;
}
