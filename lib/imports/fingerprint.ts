// A layout's header fingerprint: the normalised header texts of its well sheet, in order, so a second
// file of the same layout is recognised (lib/plates/templates.ts) whatever its data rows hold.
import { normaliseLabel } from './normalise-text';
import type { Cell } from './spreadsheet-types';

/** The fingerprint of a header row; null when it has fewer than two headers (too little to recognise). */
export function headerFingerprint(headerCells: readonly Cell[] | undefined): string | null {
  const headers = (headerCells ?? [])
    .map((cell) => (cell === null ? '' : normaliseLabel(String(cell))))
    .filter((header) => header !== '');
  return headers.length < 2 ? null : headers.join('|');
}
