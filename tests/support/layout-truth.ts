// What the truth of the invented export layouts (tests/fixtures/export-layouts) says an import of a
// file must find, in the names of an import's facts (lib/plates/import-facts.ts); no database needed.
import type { FileFacts } from '../fixtures/export-layouts/layout-kit';
import { expectedIc50s, PLATES, plate, type PlateName, type Target } from '../fixtures/export-layouts/truth';

/** The screen targets a file records, in the truth's order. */
export function fileTargets(facts: FileFacts): Target[] {
  return (['Nav1.7', 'Kv7.2'] as const).filter((t) => facts.targetWords[t] !== undefined);
}

/** The truth's count of each role on a plate, by its barcode, in the names of an import's facts. */
export function truthRoleCounts(label: string) {
  const name = (Object.keys(PLATES) as PlateName[]).find((n) => PLATES[n].barcode === label);
  if (!name) throw new RangeError(`no plate of the truth has the barcode ${label}`);
  const wells = plate(name).wells;
  const count = (role: string) => wells.filter((w) => w.role === role).length;
  return {
    negativeControl: count('vehicle'),
    positiveControl: count('reference'),
    test: count('test'),
    empty: 0,
  };
}

/** The IC50s the truth expects of one plate of a file (by its barcode): each measurable compound × target. */
export function plateExpectedIc50(label: string, facts: FileFacts): FileFacts['expectedIc50'] {
  const name = (Object.keys(PLATES) as PlateName[]).find((n) => PLATES[n].barcode === label);
  if (!name) throw new RangeError(`no plate of the truth has the barcode ${label}`);
  return expectedIc50s(PLATES[name], fileTargets(facts));
}
