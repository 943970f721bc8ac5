import 'server-only';
import { guessMapping, tableView } from '@/lib/imports/guess-mapping';
import { columnMappingDraftSchema, type ColumnMapping } from '@/lib/imports/mapping-schema';
import { guessFactLocators, readPlateFacts, type PlateFacts } from '@/lib/imports/plate-facts';
import { guessPlateSplit, splitPlates } from '@/lib/imports/split-plates';
import type { SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet, type PlatePreview } from '@/lib/imports/validate-plate-sheet';
import type { QcRuleNotApplied } from '@/lib/science/qc/qc-rules';
import { qcRulesNotApplied, readoutsAbsentFromEveryWell } from '@/lib/science/qc/qc-rules';
import { DEFAULT_QC_THRESHOLDS } from '@/lib/science/qc/qc-thresholds';
import { BLOCK_READOUTS, type BlockReadout } from '@/lib/domain/fits';
import { parsedPlateInput } from './analysis-input';

/**
 * The facts of an import in one go, with no database (lib/plates/import-once.ts adds the database's
 * part): which sheet and mapping a file is read with when nobody chose them, and what a check of it found,
 * as `scripts/import-plate.ts --dry-run --json` prints it and `POST /api/imports/plate` answers it.
 */

/** What an import of one file found, in plain values. */
export interface ImportFacts {
  file: string;
  sheet: string;
  /** The template applied (by name), or null when the mapping was guessed. */
  template: string | null;
  plateLabel: string;
  /**
   * Where the label came from: given, the plate barcode in the file, the file name, or, for a file of
   * several plates, the plate's sheet name or plate-column value.
   */
  labelSource: 'given' | 'barcode' | 'file' | 'sheet' | 'column';
  plateFormat: number | null;
  wellCount: number;
  roleCounts: { negativeControl: number; positiveControl: number; test: number; empty: number };
  /** The concentration unit as the file gives it (the header's, else the mapping's). */
  concentrationUnit: string;
  /** The file's target values as it writes them (or the one target named for the whole sheet). */
  targets: string[];
  /**
   * The block readouts the file gives per target (as the check names the target), tonic first:
   * ["tonic"] for a target read at one moment, ["tonic", "use_dependent"] when the mapping maps a second.
   */
  readouts: Record<string, BlockReadout[]>;
  /** Codes of the QC rules whose readout no well carries (not applied; the others still run). */
  qcRulesNotApplied: string[];
  /** Test compounds not in the registry; null when no registry was asked (offline). */
  unregisteredCompounds: string[] | null;
  errors: string[];
  warnings: string[];
}

/** One plate of a file's import facts: what ImportFacts says of one plate, and its key in the file. */
export type PlateImportFacts = Omit<ImportFacts, 'file' | 'template'> & {
  /** The sheet's name (one plate, a sheet per plate) or the plate-column value. */
  key: string;
};

/**
 * What an import of a file found, plate by plate (`plates`, in the order they are stored). A file of several
 * plates keeps the top-level keys of one plate: those of its first plate (sheet, plateLabel, wellCount,
 * roleCounts …), except `errors`, `warnings` and `unregisteredCompounds`, which are the whole file's, each
 * error and warning naming its plate; `plateCount` says how many plates there are.
 */
export type FileImportFacts = ImportFacts & { plateCount: number; plates: PlateImportFacts[] };

/** The file's facts from each plate's (see FileImportFacts); a file of one plate is that plate's facts. */
export function joinPlateFacts(plates: readonly (ImportFacts & { key: string })[]): FileImportFacts {
  const several = plates.length > 1;
  const named = (label: string, lines: readonly string[]) =>
    several ? lines.map((line) => `Plate "${label}": ${line}`) : [...lines];
  const perPlate: PlateImportFacts[] = plates.map(({ file: _file, template: _template, ...rest }) => rest);
  const { key: _key, ...first } = plates[0]!;
  const unregistered =
    first.unregisteredCompounds === null
      ? null
      : [...new Set(plates.flatMap((p) => p.unregisteredCompounds ?? []))];
  return {
    ...first,
    errors: plates.flatMap((p) => named(p.plateLabel, p.errors)),
    warnings: plates.flatMap((p) => named(p.plateLabel, p.warnings)),
    unregisteredCompounds: unregistered,
    plateCount: plates.length,
    plates: perPlate,
  };
}

/** The facts of a file whose plates could not be told apart (or read): no wells, the reason as its one error. */
export function unreadFileFacts(input: {
  filename: string;
  sheet: string;
  template: string | null;
  label: Pick<ImportFacts, 'plateLabel' | 'labelSource'>;
  errors: string[];
  offline: boolean;
}): FileImportFacts {
  const facts: ImportFacts = {
    file: input.filename,
    sheet: input.sheet,
    template: input.template,
    ...input.label,
    plateFormat: null,
    wellCount: 0,
    roleCounts: { negativeControl: 0, positiveControl: 0, test: 0, empty: 0 },
    concentrationUnit: '',
    targets: [],
    readouts: {},
    qcRulesNotApplied: [],
    unregisteredCompounds: input.offline ? null : [],
    errors: input.errors,
    warnings: [],
  };
  return { ...facts, plateCount: 0, plates: [] };
}

/**
 * The check of a file with no registry (scripts/import-plate.ts --offline): split into its plates as the
 * mapping says, each validated offline (validateOffline), its facts read on its own sheet.
 */
export function offlineFileFacts(input: {
  filename: string;
  sheets: readonly SheetData[];
  sheet: SheetData;
  mapping: ColumnMapping;
  givenLabel: string | undefined;
}): FileImportFacts {
  const { filename, sheets, sheet, mapping } = input;
  const split = splitPlates(sheets, sheet.name, mapping);
  if (!split.ok)
    return unreadFileFacts({
      filename,
      sheet: sheet.name,
      template: null,
      label: plateLabel(input.givenLabel, {}, filename),
      errors: split.problems.map((p) => `${p.message} ${p.whatToDo}`),
      offline: true,
    });
  const several = split.parts.length > 1;
  return joinPlateFacts(
    split.parts.map((part) => {
      const preview = validateOffline(part.sheet, part.mapping);
      const found = readPlateFacts(sheets, part.mapping);
      const label =
        several && part.label !== null && part.labelSource !== null
          ? { plateLabel: part.label, labelSource: part.labelSource }
          : plateLabel(input.givenLabel, found.facts, filename);
      return {
        key: part.key,
        ...importFacts({
          filename,
          sheet: part.sheet,
          mapping: part.mapping,
          template: null,
          label,
          preview,
          factWarnings: found.warnings,
          rulesNotApplied: defaultRulesNotApplied(preview),
          offline: true,
        }),
      };
    }),
  );
}

/** At most this many row errors are listed; the rest are counted in one more line. */
const ERROR_LIMIT = 100;

/** A sheet and its guessed mapping (with the plate facts located), for a file nobody mapped. */
export interface GuessedSheet {
  sheet: SheetData;
  mapping: ColumnMapping;
}

/**
 * The sheet most likely to hold the wells and its guessed mapping: the sheet whose guess misses the
 * fewest required fields (the first of equals), with its barcode and other facts located as inspect does.
 */
export function guessSheet(sheets: readonly SheetData[]): GuessedSheet {
  const guesses = sheets.map((sheet) => ({ sheet, guess: guessMapping(sheet) }));
  const best = guesses.reduce((a, b) =>
    b.guess.missingFields.length < a.guess.missingFields.length ? b : a,
  );
  const located = guessFactLocators(sheets, best.sheet.name, best.guess.mapping.headerRow);
  const withFacts = { ...best.guess.mapping, wellSheet: best.sheet.name, facts: located.facts };
  // Several plates in the file (issue 18): a sheet per plate, or a plate column.
  const mapping = columnMappingDraftSchema.parse({
    ...withFacts,
    plates: guessPlateSplit(sheets, best.sheet, columnMappingDraftSchema.parse(withFacts)),
  });
  return { sheet: best.sheet, mapping };
}

/**
 * The sheet a mapping given whole (`scripts/import-plate.ts --mapping`) reads: the sheet it names, else
 * the sheet the guess would choose; the mapping as given, with that sheet. A sheet named but not in the
 * file is refused, naming the file's sheets.
 */
export function sheetForMapping(
  sheets: readonly SheetData[],
  mapping: ColumnMapping,
): GuessedSheet | { refused: string } {
  const sheet = mapping.wellSheet
    ? sheets.find((s) => s.name === mapping.wellSheet)
    : guessSheet(sheets).sheet;
  if (!sheet)
    return {
      refused: `The mapping reads the sheet "${mapping.wellSheet}", which the file does not hold; its sheets: ${sheets.map((s) => `"${s.name}"`).join(', ')}.`,
    };
  return { sheet, mapping: { ...mapping, wellSheet: sheet.name } };
}

/** The plate's label: the one given, else the barcode found in the file, else the file's name without its extension. */
export function plateLabel(
  given: string | undefined,
  facts: PlateFacts,
  filename: string,
): Pick<ImportFacts, 'plateLabel' | 'labelSource'> {
  if (given?.trim()) return { plateLabel: given.trim(), labelSource: 'given' };
  const barcode = facts.barcode?.trim();
  if (barcode) return { plateLabel: barcode.slice(0, 120), labelSource: 'barcode' };
  const stem = filename.replace(/\.[^.]+$/, '').trim() || filename;
  return { plateLabel: stem.slice(0, 120), labelSource: 'file' };
}

/**
 * Validates the sheet with no registry: every compound identifier and target value of the file is taken
 * as known (a first pass finds them), so that only the file's own faults remain.
 */
export function validateOffline(sheet: SheetData, mapping: ColumnMapping): PlatePreview {
  const first = validatePlateSheet(sheet, mapping, { knownCompounds: [], knownTargets: [] });
  if (first.unknownCompounds.length === 0 && first.unknownTargets.length === 0) return first;
  return validatePlateSheet(sheet, mapping, {
    knownCompounds: first.unknownCompounds.map((c) => c.identifier),
    knownTargets: first.unknownTargets.map((t) => t.name),
  });
}

/** The QC rules (at Gatewell's default limits) that the plate's readouts leave unapplied. */
export function defaultRulesNotApplied(preview: PlatePreview): QcRuleNotApplied[] {
  if (!preview.plate) return [];
  return qcRulesNotApplied(
    readoutsAbsentFromEveryWell(parsedPlateInput(preview.plate).wells),
    DEFAULT_QC_THRESHOLDS,
  );
}

/**
 * The distinct values of a mapped column as the file writes them, in the order first written (of the
 * table the mapping reads: a wide or grid sheet's long table, lib/imports/reshape-table.ts).
 */
function columnValues(
  sheet: SheetData,
  preview: PlatePreview,
  field: 'target' | 'concentrationUnit',
  mapping: ColumnMapping,
) {
  const column = preview.columns[field];
  if (!column) return [];
  return tableView(sheet, mapping).values[column.index] ?? [];
}

/** The readouts the wells carry per target, in BLOCK_READOUTS order, targets in order of first appearance. */
function readoutsPerTarget(
  wells: readonly { readouts: readonly { target: string; readout?: BlockReadout }[] }[],
): Record<string, BlockReadout[]> {
  const found = new Map<string, Set<BlockReadout>>();
  for (const well of wells)
    for (const r of well.readouts) {
      const set = found.get(r.target) ?? new Set<BlockReadout>();
      set.add(r.readout ?? 'tonic');
      found.set(r.target, set);
    }
  return Object.fromEntries(
    [...found].map(([target, set]) => [target, BLOCK_READOUTS.filter((r) => set.has(r))]),
  );
}

/** What a check of the file found, in plain values (`unregisteredCompounds` null when offline). */
export function importFacts(input: {
  filename: string;
  sheet: SheetData;
  mapping: ColumnMapping;
  template: string | null;
  label: Pick<ImportFacts, 'plateLabel' | 'labelSource'>;
  preview: PlatePreview;
  factWarnings: readonly string[];
  rulesNotApplied: readonly QcRuleNotApplied[];
  offline: boolean;
}): ImportFacts {
  const { preview, mapping } = input;
  const wells = preview.plate?.wells ?? [];
  const count = (role: string) => wells.filter((w) => w.role === role).length;
  const rowErrors = preview.issues.filter((i) => i.severity === 'error').map((i) => i.message);
  const errors = [
    ...preview.fileProblems.map((p) => `${p.message} ${p.whatToDo}`),
    ...(preview.fileProblems.length ? [] : rowErrors.slice(0, ERROR_LIMIT)),
  ];
  if (!preview.fileProblems.length && rowErrors.length > ERROR_LIMIT)
    errors.push(`… and ${rowErrors.length - ERROR_LIMIT} more row errors.`);
  if (preview.fileProblems.length === 0 && !preview.plate) errors.push('The sheet holds no wells.');
  const unitValues = columnValues(input.sheet, preview, 'concentrationUnit', mapping);
  const targets = mapping.fixedTarget
    ? [mapping.fixedTarget]
    : columnValues(input.sheet, preview, 'target', mapping);
  return {
    file: input.filename,
    sheet: input.sheet.name,
    template: input.template,
    ...input.label,
    plateFormat: preview.plate?.format ?? null,
    wellCount: wells.length,
    roleCounts: {
      negativeControl: count('vehicle'),
      positiveControl: count('reference'),
      test: count('test'),
      empty: preview.emptyWells,
    },
    concentrationUnit: unitValues.length === 1 ? unitValues[0]! : mapping.units.concentration,
    targets,
    readouts: readoutsPerTarget(wells),
    qcRulesNotApplied: input.rulesNotApplied.map((r) => r.rule),
    unregisteredCompounds: input.offline ? null : preview.unknownCompounds.map((c) => c.identifier),
    errors,
    warnings: [
      ...preview.issues.filter((i) => i.severity === 'warning').map((i) => i.message),
      ...input.factWarnings,
      ...input.rulesNotApplied.map((r) => r.message),
    ],
  };
}
