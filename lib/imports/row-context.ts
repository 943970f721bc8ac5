import 'server-only';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import type { BlockScale } from './import-fields';
import type { ColumnMapping } from './mapping-schema';
import { normaliseIdentifier, normaliseLabel } from './normalise-text';
import type { ResolvedColumns } from './resolve-columns';
import { valueKey, type RoleChoice } from './role-words';

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
  /** Other names of the screen's targets (the mapping's target values first, then the screen's aliases) by normalised label. */
  targetAliases: Map<string, string>;
  /** The role column's value map by valueKey. */
  roleValues: Map<string, RoleChoice>;
  /** Compound identifiers (normalised) that mark negative and positive control wells. */
  negativeCompounds: Set<string>;
  positiveCompounds: Set<string>;
  /** Written forms (lower case) that mean "no value" besides Gatewell's own: "nan", the mapping's words. */
  missing: ReadonlySet<string>;
  /** How the block column's values are written (decided for the whole sheet). */
  blockScale: BlockScale;
  /** The plate format whose rows running well numbers count along; null when the sheet has none. */
  wellIndexFormat: PlateFormat | null;
}

/** Prepares the look-ups for reading rows. */
export function makeRowContext(input: {
  sheet: string;
  decimalComma: boolean;
  columns: ResolvedColumns;
  mapping: ColumnMapping;
  knownCompounds: readonly string[];
  knownTargets: readonly string[];
  /** The screen's remembered target aliases: alias as written → target name. */
  targetAliases?: Readonly<Record<string, string>> | undefined;
  /** @default 'fraction' */
  blockScale?: BlockScale;
  /** @default null */
  wellIndexFormat?: PlateFormat | null;
}): RowContext {
  const { mapping } = input;
  const targets = new Map(input.knownTargets.map((name) => [normaliseLabel(name), name.trim()]));
  const targetAliases = new Map<string, string>();
  for (const [alias, name] of [
    ...Object.entries(mapping.targetValues),
    ...Object.entries(input.targetAliases ?? {}),
  ]) {
    const known = targets.get(normaliseLabel(name));
    const key = normaliseLabel(alias);
    if (known && key !== '' && !targetAliases.has(key)) targetAliases.set(key, known);
  }
  return {
    sheet: input.sheet,
    decimalComma: input.decimalComma,
    columns: input.columns,
    mapping,
    compounds: new Map(input.knownCompounds.map((id) => [normaliseIdentifier(id), id.trim()])),
    targets,
    targetAliases,
    roleValues: new Map(
      Object.entries(mapping.roleValues).map(([value, choice]) => [valueKey(value), choice] as const),
    ),
    negativeCompounds: new Set(mapping.controls.negative.map(normaliseIdentifier)),
    positiveCompounds: new Set(mapping.controls.positive.map(normaliseIdentifier)),
    missing: new Set([
      ...(mapping.missing.notANumber ? ['nan'] : []),
      ...mapping.missing.words.map((word) => word.trim().toLowerCase()),
    ]),
    blockScale: input.blockScale ?? 'fraction',
    wellIndexFormat: input.wellIndexFormat ?? null,
  };
}
