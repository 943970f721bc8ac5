'use client';

import { AppLink } from '@/components/ui/app-link';
import { PLATE_FACT_LABEL, type PlateFact } from '@/lib/imports/import-fields';
import type { ColumnMapping } from '@/lib/imports/mapping-schema';
import type { PlateCheckView } from './import-api';

const SPLIT_CHOICES = [
  { by: 'one', label: 'One plate' },
  { by: 'sheet', label: 'A sheet per plate' },
  { by: 'column', label: 'A plate column' },
] as const;

/**
 * "Plates in this file" on the mapping step: one plate, a sheet per plate (every sheet with this sheet's
 * header row), or a plate column (which one: each distinct value is a plate).
 */
export function PlateSplitChoice({
  headers,
  mapping,
  onChange,
}: {
  headers: string[];
  mapping: ColumnMapping;
  onChange: (next: ColumnMapping) => void;
}) {
  const named = headers.filter((h) => h.trim() !== '');
  const { plates } = mapping;
  const choose = (by: ColumnMapping['plates']['by']) =>
    onChange({
      ...mapping,
      plates: { by, column: by === 'column' ? (plates.column ?? named[0] ?? null) : null },
    });
  return (
    <fieldset className="rounded-md border border-ink-100 p-3 text-sm">
      <legend className="gw-label px-1">Plates in this file</legend>
      <div className="flex flex-wrap items-center gap-4">
        {SPLIT_CHOICES.map((choice) => (
          <label key={choice.by} className="flex items-center gap-1.5">
            <input
              type="radio"
              name="plates-in-file"
              value={choice.by}
              checked={plates.by === choice.by}
              onChange={() => choose(choice.by)}
            />
            {choice.label}
          </label>
        ))}
        {plates.by === 'column' ? (
          <label className="flex items-center gap-2">
            <span>Plate column</span>
            <select
              aria-label="Plate column"
              className="gw-input"
              value={plates.column ?? ''}
              onChange={(e) =>
                onChange({ ...mapping, plates: { by: 'column', column: e.target.value || null } })
              }
            >
              {named.map((header) => (
                <option key={header} value={header}>
                  {header}
                </option>
              ))}
            </select>
          </label>
        ) : null}
      </div>
      <p className="mt-1 text-xs text-ink-500">
        {plates.by === 'sheet'
          ? 'Every sheet with this sheet’s header row is stored as a plate of its own, labelled by its barcode or sheet name.'
          : plates.by === 'column'
            ? 'Each value of the plate column is stored as a plate of its own, labelled by that value.'
            : 'The chosen sheet is stored as one plate.'}{' '}
        A file of several plates is stored whole or not at all.
      </p>
    </fieldset>
  );
}

const ROLE_WORDS = [
  ['negativeControl', 'negative'],
  ['positiveControl', 'positive'],
  ['test', 'test'],
  ['empty', 'empty'],
] as const;

/** A plate's (or the file's) wells by role, as one line: "8 negative · 8 positive · 80 test · 0 empty". */
function rolesLine(counts: PlateCheckView['roleCounts']) {
  return ROLE_WORDS.map(([key, word]) => `${counts[key]} ${word}`).join(' · ');
}

/**
 * The check step's list of the file's plates, each with its own facts: label (editable), format, wells,
 * wells by role, wells QC flags, QC rules not applied, the plate facts read beside its table, and its
 * errors and warnings; under them, the whole file's totals (sums of the plates, never one plate's).
 */
export function PlatesInFile({
  plates,
  labels,
  onLabel,
}: {
  plates: PlateCheckView[];
  labels: Record<string, string>;
  onLabel: (key: string, label: string) => void;
}) {
  const total = (value: (plate: PlateCheckView) => number) =>
    plates.reduce((sum, plate) => sum + value(plate), 0);
  const totalRoles = Object.fromEntries(
    ROLE_WORDS.map(([key]) => [key, total((p) => p.roleCounts[key])]),
  ) as PlateCheckView['roleCounts'];
  const formats = [...new Set(plates.map((p) => p.format).filter((f) => f !== null))];
  const rules = [...new Set(plates.flatMap((p) => p.qcRulesNotApplied.map((r) => r.label)))];
  const errors = total((p) => (p.ok ? 0 : p.summary.errors || 1));
  const warnings = total((p) => p.summary.warnings + p.factWarnings.length);
  const head = 'py-1 pr-3';
  const cell = 'py-1.5 pr-3';
  return (
    <section className="gw-card space-y-2 overflow-x-auto p-4" aria-label="Plates in this file">
      <h2 className="text-base font-semibold">Plates in this file ({plates.length})</h2>
      <table className="min-w-full text-sm">
        <thead className="text-left text-xs uppercase tracking-wide text-ink-700">
          <tr>
            <th scope="col" className={head}>
              In the file
            </th>
            <th scope="col" className={head}>
              Plate label
            </th>
            <th scope="col" className={head}>
              Wells
            </th>
            <th scope="col" className={head}>
              Format
            </th>
            <th scope="col" className={head}>
              Wells by role
            </th>
            <th scope="col" className={head}>
              QC flags
            </th>
            <th scope="col" className={head}>
              QC rules not applied
            </th>
            <th scope="col" className={head}>
              Plate facts
            </th>
            <th scope="col" className="py-1">
              Errors and warnings
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100 align-top">
          {plates.map((plate, i) => (
            <tr key={plate.key} data-plate={plate.key}>
              <td className={`${cell} whitespace-nowrap font-mono`}>{plate.key}</td>
              <td className={cell}>
                <input
                  aria-label={`Label of plate ${i + 1}`}
                  className="gw-input min-w-44"
                  value={labels[plate.key] ?? plate.label}
                  onChange={(e) => onLabel(plate.key, e.target.value)}
                />
              </td>
              <td className={`${cell} tabular-nums`}>{plate.wellCount}</td>
              <td className={`${cell} tabular-nums`}>{plate.format ?? '—'}</td>
              <td className={`${cell} whitespace-nowrap tabular-nums`}>{rolesLine(plate.roleCounts)}</td>
              <td className={`${cell} tabular-nums`}>{plate.qcFlaggedWells}</td>
              <td className={cell}>
                {plate.qcRulesNotApplied.length ? (
                  <span className="text-signal-warn">
                    {plate.qcRulesNotApplied.map((r) => r.label).join(', ')}
                  </span>
                ) : (
                  'none'
                )}
              </td>
              <td className={`${cell} text-xs`}>
                {Object.keys(plate.facts).length ? null : '—'}
                {Object.entries(plate.facts).map(([fact, value]) => (
                  <p key={fact}>
                    <span className="text-ink-500">{PLATE_FACT_LABEL[fact as PlateFact]}:</span>{' '}
                    <span className="font-mono">{value}</span>
                  </p>
                ))}
              </td>
              <td className="py-1.5">
                {plate.ok ? (
                  <span className="text-signal-pass">
                    No errors
                    {plate.summary.warnings + plate.factWarnings.length
                      ? `, ${plate.summary.warnings + plate.factWarnings.length} warning(s)`
                      : ''}
                  </span>
                ) : (
                  <span className="font-medium text-signal-fail">{plate.summary.errors || 1} error(s)</span>
                )}
                <ul className="mt-1 space-y-0.5 text-xs">
                  {[
                    ...plate.fileProblems.map((p) => `${p.message} ${p.whatToDo}`),
                    ...plate.issues.map((x) => x.message),
                    ...plate.factWarnings,
                  ]
                    .slice(0, 3)
                    .map((message) => (
                      <li key={message} className="text-ink-700">
                        {message}
                      </li>
                    ))}
                </ul>
              </td>
            </tr>
          ))}
        </tbody>
        <tfoot className="border-t-2 border-ink-200 font-medium">
          <tr data-plate-total="">
            <th scope="row" className={`${cell} text-left`} colSpan={2}>
              All {plates.length} plates
            </th>
            <td className={`${cell} tabular-nums`}>{total((p) => p.wellCount)}</td>
            <td className={`${cell} tabular-nums`}>{formats.join(', ') || '—'}</td>
            <td className={`${cell} whitespace-nowrap tabular-nums`}>{rolesLine(totalRoles)}</td>
            <td className={`${cell} tabular-nums`}>{total((p) => p.qcFlaggedWells)}</td>
            <td className={cell}>{rules.length ? rules.join(', ') : 'none'}</td>
            <td className={cell} />
            <td className="py-1.5">
              {errors ? (
                <span className="text-signal-fail">{errors} error(s)</span>
              ) : (
                <span className="text-signal-pass">No errors</span>
              )}
              {warnings ? `, ${warnings} warning(s)` : ''}
            </td>
          </tr>
        </tfoot>
      </table>
    </section>
  );
}

/** After a file of several plates is stored: a link to each stored plate. */
export function StoredPlates({ plates }: { plates: { plateId: string; label: string; href: string }[] }) {
  return (
    <section role="status" className="gw-card space-y-2 p-4" aria-label="Stored plates">
      <h2 className="text-base font-semibold">Stored {plates.length} plates from this file</h2>
      <ul className="list-disc pl-5 text-sm">
        {plates.map((plate) => (
          <li key={plate.plateId}>
            <AppLink href={plate.href} className="font-medium text-lagoon-700 underline">
              {plate.label}
            </AppLink>
          </li>
        ))}
      </ul>
    </section>
  );
}
