'use client';

import { useState } from 'react';
import type { ColumnMapping } from '@/lib/imports/mapping-schema';
import { normaliseLabel } from '@/lib/imports/normalise-text';
import { parseUnit, type QuantityKind } from '@/lib/imports/units';
import type { Cell } from '@/lib/imports/spreadsheet-types';

/** What the reading section shows of the file: a few rows under the header row and the guessed mapping. */
export interface ReadingSample {
  /** The spreadsheet rows right under the guessed header row (rows[0] is the row under it). */
  rows: Cell[][];
  /** The header row those rows follow (1-based). */
  headerRow: number;
  /** The mapping as guessed from the file (or the recognised template's). */
  guessed: ColumnMapping;
}

type Reading = Pick<ColumnMapping, 'rows' | 'wellNames' | 'application' | 'missing'> & {
  block: ColumnMapping['units']['block'];
};

const UNITS_ROW_CHOICES: { value: ColumnMapping['rows']['unitsRow']; label: string }[] = [
  { value: 'guess', label: 'Guess: skip it if it holds only units' },
  { value: 'yes', label: 'Skip it: it holds units' },
  { value: 'no', label: 'Read it as a well' },
];
const WELL_NAME_CHOICES: { value: ColumnMapping['wellNames']; label: string }[] = [
  { value: 'guess', label: 'Guess from the values' },
  { value: 'label', label: 'By position, like A1 or B03' },
  { value: 'index', label: 'By running number (A1 = 1, A2 = 2 …)' },
];
const APPLICATION_CHOICES: { value: ColumnMapping['application']; label: string }[] = [
  { value: 'guess', label: 'Guess from the rows' },
  { value: 'single', label: 'One concentration per well' },
  { value: 'cumulative', label: 'Several in turn on one cell' },
];
const BLOCK_CHOICES: { value: ColumnMapping['units']['block']; label: string }[] = [
  { value: 'guess', label: 'Guess from header and values' },
  { value: 'fraction', label: 'A fraction (0.5 = half blocked)' },
  { value: 'percent', label: 'Percent inhibition (50 = half)' },
];

const UNIT_KINDS: QuantityKind[] = ['concentration', 'current', 'sealResistance', 'capacitance'];
const SCALE_WORDS = new Set(['%', 'percent', 'fraction', 'ratio', '#', 'no', 'count', 'text', '-']);

const filled = (cell: Cell | undefined) => cell !== null && cell !== undefined && String(cell).trim() !== '';

/** Whether a row of the sample reads as units ("mM", "[nA]", "MΩ", "%"), as the guess judges it. */
function looksLikeUnits(cells: readonly Cell[]): boolean {
  const texts = cells.filter(filled);
  return (
    texts.length > 0 &&
    texts.every((cell) => {
      if (typeof cell !== 'string') return false;
      const bare = cell.trim().replace(/^[([{]\s*|\s*[)\]}]$/g, '');
      return SCALE_WORDS.has(bare.toLowerCase()) || UNIT_KINDS.some((kind) => parseUnit(bare, kind) !== null);
    })
  );
}

/** Splits a list typed with commas or semicolons into its words. */
const words = (text: string) =>
  text
    .split(/[,;]/)
    .map((w) => w.trim())
    .filter((w) => w !== '');

/** A text box for a list of words that keeps what is typed (commas, spaces) while it says the same list. */
function WordList({
  id,
  label,
  value,
  onChange,
  placeholder,
  disabled = false,
}: {
  id: string;
  label: string;
  value: string[];
  onChange: (next: string[]) => void;
  placeholder: string;
  disabled?: boolean;
}) {
  const [text, setText] = useState(value.join(', '));
  // The list changed from outside (a template applied): show it.
  if (words(text).join('\u0000') !== value.join('\u0000')) setText(value.join(', '));
  return (
    <div>
      <label htmlFor={id} className="text-sm">
        {label}
      </label>
      <input
        id={id}
        className="gw-input mt-1 w-full"
        value={text}
        placeholder={placeholder}
        disabled={disabled}
        onChange={(e) => {
          setText(e.target.value);
          onChange(words(e.target.value));
        }}
      />
    </div>
  );
}

/**
 * How the table's rows and cells are read, beyond which column feeds which field: a row of units under
 * the header, summary rows, how wells are named, how compound was applied, the words for a missing
 * value and how a block column is written. Folded away by default; its summary line says what is set
 * and, where the setting is left to the guess, what the file looks like.
 */
/** A labelled choice among fixed values (the reading settings' selects). */
function ChoiceSelect<T extends string>({
  id,
  label,
  value,
  choices,
  onChange,
}: {
  id: string;
  label: string;
  value: T;
  choices: readonly { value: T; label: string }[];
  onChange: (value: T) => void;
}) {
  return (
    <>
      <label htmlFor={id} className="gw-label">
        {label}
      </label>
      <select
        id={id}
        className="gw-input mt-1 w-full"
        value={value}
        onChange={(e) => onChange(e.target.value as T)}
      >
        {choices.map((c) => (
          <option key={c.value} value={c.value}>
            {c.label}
          </option>
        ))}
      </select>
    </>
  );
}

export function ReadingSettings({
  headers,
  mapping,
  sample,
  onChange,
}: {
  headers: string[];
  mapping: ColumnMapping;
  sample?: ReadingSample | undefined;
  onChange: (next: ColumnMapping) => void;
}) {
  const set = (patch: Partial<Reading>) => {
    const { block, ...rest } = patch;
    onChange({
      ...mapping,
      ...rest,
      ...(block ? { units: { ...mapping.units, block } } : {}),
    });
  };
  const setRows = (patch: Partial<ColumnMapping['rows']>) => set({ rows: { ...mapping.rows, ...patch } });
  const setMissing = (patch: Partial<ColumnMapping['missing']>) =>
    set({ missing: { ...mapping.missing, ...patch } });

  // What the file shows where a setting is left to the guess (only when the header row is the one sampled).
  const sampled = sample && sample.headerRow === mapping.headerRow ? sample : undefined;
  const rowUnder = sampled?.rows[0];
  const unitsSeen = rowUnder ? looksLikeUnits(rowUnder) : null;
  const wellIndex =
    mapping.columns.well === null
      ? -1
      : headers.findIndex((h) => normaliseLabel(h) === normaliseLabel(mapping.columns.well!));
  const wellSamples =
    sampled && wellIndex >= 0
      ? sampled.rows
          .slice(unitsSeen ? 1 : 0)
          .map((row) => row[wellIndex])
          .filter(filled)
          .map(String)
      : [];
  const wellsByNumber = wellSamples.length > 0 && wellSamples.every((w) => /^\s*\d+\s*$/.test(w));

  const seen = {
    unitsRow:
      unitsSeen === null
        ? null
        : unitsSeen
          ? `row ${mapping.headerRow + 1} holds units: skipped`
          : `row ${mapping.headerRow + 1} holds values: read as a well`,
    wellNames:
      wellSamples.length === 0
        ? null
        : `the well column reads ${wellSamples.slice(0, 3).join(', ')}: ${wellsByNumber ? 'running numbers' : 'positions'}`,
    block:
      mapping.columns.block === null
        ? null
        : sample && sample.guessed.units.block !== 'guess'
          ? `the header says ${sample.guessed.units.block === 'percent' ? 'percent' : 'a fraction'}`
          : 'percent when any value lies beyond ±2, else a fraction',
  };

  const summary = [
    `units row: ${mapping.rows.unitsRow === 'guess' ? (seen.unitsRow ?? 'guessed') : mapping.rows.unitsRow === 'yes' ? 'skipped' : 'read as a well'}`,
    mapping.rows.skipSummaryRows ? 'summary rows skipped' : 'summary rows read',
    `wells: ${mapping.wellNames === 'guess' ? (wellSamples.length ? (wellsByNumber ? 'running numbers (guessed)' : 'positions (guessed)') : 'guessed') : mapping.wellNames === 'index' ? 'running numbers' : 'positions'}`,
    `application: ${mapping.application === 'guess' ? 'guessed' : mapping.application === 'single' ? 'one per well' : 'several per cell'}`,
    mapping.missing.notANumber ? 'NaN is missing' : 'NaN is an error',
    ...(mapping.columns.block === null
      ? []
      : [
          `block: ${mapping.units.block === 'guess' ? 'guessed' : mapping.units.block === 'percent' ? 'percent' : 'fraction'}`,
        ]),
  ].join(' · ');

  const guessedNote = (text: string | null) =>
    text ? <p className="mt-1 text-xs text-ink-500">In this file: {text}.</p> : null;

  return (
    <details className="rounded-md border border-ink-100 p-3" aria-label="Reading the rows">
      <summary className="cursor-pointer text-sm">
        <span className="font-medium">Reading the rows</span>{' '}
        <span className="text-ink-500">({summary})</span>
      </summary>
      <div className="mt-3 grid gap-4 text-sm sm:grid-cols-2 lg:grid-cols-3">
        <div>
          <ChoiceSelect
            id="reading-units-row"
            label="The row right under the header"
            value={mapping.rows.unitsRow}
            choices={UNITS_ROW_CHOICES}
            onChange={(unitsRow) => setRows({ unitsRow })}
          />
          {guessedNote(seen.unitsRow)}
          {rowUnder ? (
            <p
              className="mt-1 truncate font-mono text-xs text-ink-500"
              title={rowUnder.map(String).join(' | ')}
            >
              Row {mapping.headerRow + 1}:{' '}
              {rowUnder
                .filter(filled)
                .slice(0, 8)
                .map((cell) => String(cell))
                .join(' | ') || '(blank)'}
            </p>
          ) : null}
        </div>
        <div className="space-y-2">
          <label className="flex items-center gap-2">
            <input
              type="checkbox"
              checked={mapping.rows.skipSummaryRows}
              onChange={(e) => setRows({ skipSummaryRows: e.target.checked })}
            />
            Skip summary rows (mean, count, SD … with no well)
          </label>
          <WordList
            id="reading-summary-words"
            label="More words that start a summary row (commas between)"
            value={mapping.rows.summaryWords}
            onChange={(summaryWords) => setRows({ summaryWords })}
            placeholder="e.g. Plate mean, Z-score"
            disabled={!mapping.rows.skipSummaryRows}
          />
        </div>
        <div>
          <ChoiceSelect
            id="reading-well-names"
            label="Wells are named"
            value={mapping.wellNames}
            choices={WELL_NAME_CHOICES}
            onChange={(wellNames) => set({ wellNames })}
          />
          {guessedNote(seen.wellNames)}
          <p className="mt-1 text-xs text-ink-500">
            The guess reads a whole number as a running number along the rows, anything else as a position.
          </p>
        </div>
        <div>
          <ChoiceSelect
            id="reading-application"
            label="How compound was applied"
            value={mapping.application}
            choices={APPLICATION_CHOICES}
            onChange={(application) => set({ application })}
          />
          <p className="mt-1 text-xs text-ink-500">
            The guess reads rows of one well and target that differ only in concentration as one cell given
            several concentrations in turn, a row each.
          </p>
        </div>
        <div className="space-y-2">
          <label className="flex items-center gap-2">
            <input
              type="checkbox"
              checked={mapping.missing.notANumber}
              onChange={(e) => setMissing({ notANumber: e.target.checked })}
            />
            Read “NaN” as a missing value (not an error)
          </label>
          {sample?.guessed.missing.notANumber ? (
            <p className="text-xs text-ink-500">In this file: NaN fills cells of several rows.</p>
          ) : null}
          <WordList
            id="reading-missing-words"
            label="More words that mean “no value” (besides NA, N/A, -, none)"
            value={mapping.missing.words}
            onChange={(missingWords) => setMissing({ words: missingWords })}
            placeholder="e.g. failed, ---"
          />
        </div>
        <div>
          <ChoiceSelect
            id="reading-block"
            label="A block column is written as"
            value={mapping.units.block}
            choices={BLOCK_CHOICES}
            onChange={(block) => set({ block })}
          />
          {mapping.columns.block === null ? (
            <p className="mt-1 text-xs text-ink-500">No column is chosen for the block.</p>
          ) : (
            guessedNote(seen.block)
          )}
        </div>
      </div>
    </details>
  );
}
