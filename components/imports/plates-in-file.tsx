'use client';

import { AppLink } from '@/components/ui/app-link';
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

/** The check step's list of the file's plates: each with its label (editable), well count and issues. */
export function PlatesInFile({
  plates,
  labels,
  onLabel,
}: {
  plates: PlateCheckView[];
  labels: Record<string, string>;
  onLabel: (key: string, label: string) => void;
}) {
  return (
    <section className="gw-card space-y-2 p-4" aria-label="Plates in this file">
      <h2 className="text-base font-semibold">Plates in this file ({plates.length})</h2>
      <table className="min-w-full text-sm">
        <thead className="text-left text-xs uppercase tracking-wide text-ink-700">
          <tr>
            <th scope="col" className="py-1 pr-3">
              In the file
            </th>
            <th scope="col" className="py-1 pr-3">
              Plate label
            </th>
            <th scope="col" className="py-1 pr-3">
              Wells
            </th>
            <th scope="col" className="py-1 pr-3">
              QC flags
            </th>
            <th scope="col" className="py-1">
              Issues
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100 align-top">
          {plates.map((plate, i) => (
            <tr key={plate.key} data-plate={plate.key}>
              <td className="py-1.5 pr-3 font-mono">{plate.key}</td>
              <td className="py-1.5 pr-3">
                <input
                  aria-label={`Label of plate ${i + 1}`}
                  className="gw-input"
                  value={labels[plate.key] ?? plate.label}
                  onChange={(e) => onLabel(plate.key, e.target.value)}
                />
              </td>
              <td className="py-1.5 pr-3">{plate.wellCount}</td>
              <td className="py-1.5 pr-3">{plate.qcFlaggedWells}</td>
              <td className="py-1.5">
                {plate.ok ? (
                  <span className="text-signal-pass">
                    No errors{plate.summary.warnings ? `, ${plate.summary.warnings} warning(s)` : ''}
                  </span>
                ) : (
                  <span className="font-medium text-signal-fail">{plate.summary.errors || 1} error(s)</span>
                )}
                <ul className="mt-1 space-y-0.5 text-xs">
                  {[
                    ...plate.fileProblems.map((p) => `${p.message} ${p.whatToDo}`),
                    ...plate.issues.map((x) => x.message),
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
