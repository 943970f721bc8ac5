import 'server-only';
import type { WellRole } from '@/lib/domain/well-roles';
import type { ColumnMapping } from './mapping-schema';
import { normaliseIdentifier, normaliseLabel } from './normalise-text';
import type { ResolvedColumns } from './resolve-columns';

/** What reading one row needs: the sheet, its columns, the mapping and the screen's names, prepared once. */
export interface RowContext {
  sheet: string;
  decimalComma: boolean;
  columns: ResolvedColumns;
  mapping: ColumnMapping;
  /** Registered compound identifiers by normalised identifier. */
  compounds: Map<string, string>;
  /** The screen's target names by normalised label. */
  targets: Map<string, string>;
  /** Role markers by normalised label. */
  markers: Record<WellRole, Set<string>>;
}

/** Prepares the look-ups for reading rows. */
export function makeRowContext(input: {
  sheet: string;
  decimalComma: boolean;
  columns: ResolvedColumns;
  mapping: ColumnMapping;
  knownCompounds: readonly string[];
  knownTargets: readonly string[];
}): RowContext {
  const { mapping } = input;
  return {
    sheet: input.sheet,
    decimalComma: input.decimalComma,
    columns: input.columns,
    mapping,
    compounds: new Map(input.knownCompounds.map((id) => [normaliseIdentifier(id), id.trim()])),
    targets: new Map(input.knownTargets.map((name) => [normaliseLabel(name), name.trim()])),
    markers: {
      vehicle: new Set(mapping.markers.vehicle.map(normaliseLabel)),
      reference: new Set(mapping.markers.reference.map(normaliseLabel)),
      test: new Set(mapping.markers.test.map(normaliseLabel)),
    },
  };
}
