'use client';

import type { ColumnMapping, SheetLayout } from '@/lib/imports/mapping-schema';
import type { Inspection } from './import-api';

type InspectedSheet = Inspection['sheets'][number];

/** The table the mapping step maps: the one read in the mapping's layout, else the sheet's own. */
export function tableOf(
  sheet: InspectedSheet,
  mapping: ColumnMapping,
): { headers: string[]; values: Record<string, string[]> } {
  const view = sheet.layouts?.find((l) => l.mapping.layout.kind === mapping.layout.kind);
  return view ?? { headers: sheet.headers, values: sheet.values };
}

function describe(layout: SheetLayout, headers: string[]): string {
  if (layout.kind === 'wide')
    return `One row per well, a column block per target (${layout.targets.join(', ')})`;
  if (layout.kind === 'grid') {
    const grids = Math.max(0, headers.length - 1 - layout.constants.length);
    return `Plate grids, one per readout (${grids} grid${grids === 1 ? '' : 's'})`;
  }
  return 'One row per well and target';
}

/**
 * How the sheet lays out its wells: one row per well and target, a column block per target, or plate
 * grids. Offered when Gatewell found more than one way to read the sheet; choosing one maps the table
 * read in that way (its guessed columns) and keeps the value maps and plate facts.
 */
export function LayoutChoice({
  sheet,
  mapping,
  onChange,
}: {
  sheet: InspectedSheet;
  mapping: ColumnMapping;
  onChange: (next: ColumnMapping) => void;
}) {
  const layouts = sheet.layouts ?? [];
  if (layouts.length < 2 && mapping.layout.kind === 'long') return null;
  const chosen = layouts.findIndex((l) => l.mapping.layout.kind === mapping.layout.kind);
  const choose = (index: number) => {
    const view = layouts[index];
    if (!view) return;
    const { roleValues, controls, targetValues, fixedTarget, facts, wellSheet } = mapping;
    onChange({ ...view.mapping, roleValues, controls, targetValues, fixedTarget, facts, wellSheet });
  };
  return (
    <div className="space-y-1">
      <label htmlFor="import-layout" className="gw-label">
        How the sheet lays out its wells
      </label>
      <select
        id="import-layout"
        className="gw-input max-w-xl"
        value={chosen < 0 ? '' : String(chosen)}
        onChange={(e) => choose(Number(e.target.value))}
      >
        {chosen < 0 ? <option value="">{describe(mapping.layout, [])}</option> : null}
        {layouts.map((view, index) => (
          <option key={view.mapping.layout.kind} value={String(index)}>
            {describe(view.mapping.layout, view.headers)}
          </option>
        ))}
      </select>
      {mapping.layout.kind !== 'long' ? (
        <p className="text-xs text-ink-700">
          Gatewell reads this sheet as a table of one row per well and target
          {mapping.layout.kind === 'grid'
            ? ': a column per grid, named by its title, and the lines above the grids read as columns'
            : ': the columns every target shares, a Target column, and one column per readout of a block'}
          . The columns below are that table’s; messages still name the cells of the file.
        </p>
      ) : null}
    </div>
  );
}
