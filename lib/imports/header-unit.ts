import 'server-only';
import { parseUnit, type QuantityKind } from './units';

const KINDS: QuantityKind[] = ['concentration', 'current', 'sealResistance', 'capacitance'];

/** A header split into its name and the unit written with it: "Conc (nM)" → "Conc" and "nM". */
export interface HeaderParts {
  name: string;
  unitText: string | null;
}

/**
 * Splits a trailing unit off a header: in brackets ("Rseal (GOhm)", "I control [pA]"), after "in"
 * or "/" ("Conc in nM", "I / nA"), or as a last word that is a unit ("Conc_uM", "Cm pF").
 */
export function splitHeaderUnit(header: string): HeaderParts {
  const text = header.trim().slice(0, 200);
  const bracket = /^(.*?)[\s_]*[([{]\s*([^()[\]{}]{1,24}?)\s*[)\]}]\s*$/.exec(text);
  if (bracket?.[1]) return { name: bracket[1], unitText: bracket[2] ?? null };
  const patterns = [
    /^(.*\S)\s+in\s+(\S{1,12})$/i,
    /^(.*?)\s*\/\s*(\S{1,12})$/,
    /^(.*?)[\s_,-]+([^\s_,-]{1,12})$/,
  ];
  for (const pattern of patterns) {
    const match = pattern.exec(text);
    const unitText = match?.[2];
    if (match?.[1] && unitText && KINDS.some((kind) => parseUnit(unitText, kind) !== null))
      return { name: match[1], unitText };
  }
  return { name: text, unitText: null };
}
