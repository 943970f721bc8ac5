// Comparing what people type: headers, targets, role words and compound identifiers.

/**
 * Header and label form used for matching: accents dropped, µ/μ → u, Ω → ohm, lower case, and only
 * letters and digits kept, so "Conc. (µM)", "conc_uM" and "CONC uM" all become "concum".
 */
export function normaliseLabel(text: string): string {
  return text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[\u00b5\u03bc]/g, 'u')
    .replace(/[\u03a9\u2126]/g, 'ohm')
    .toLowerCase()
    .replace(/[^a-z0-9]/g, '');
}

/** Identifier form: trimmed, inner runs of white space made single, upper case ("gw-0001 " → "GW-0001"). */
export function normaliseIdentifier(text: string): string {
  return text.trim().replace(/\s+/g, ' ').toUpperCase();
}

/** Excel's letter for a 0-based column index: 0 → A, 25 → Z, 26 → AA. */
export function columnLetter(index: number): string {
  let letters = '';
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) {
    letters = String.fromCharCode(65 + ((n - 1) % 26)) + letters;
  }
  return letters;
}
