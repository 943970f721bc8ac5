// The grids whose columns a person may arrange (shown or hidden, order, width), and the columns of each.
// Pure: the grid component, the validation schema and the service share it. A saved layout names
// columns by these ids; a column added later is shown at the end of an older layout, and an id no
// longer here is dropped when the layout is read.

export const GRID_NAMES = ['plate-wells'] as const;
export type GridName = (typeof GRID_NAMES)[number];

/** The columns of each grid in their default order, by column id. */
export const GRID_COLUMNS: Record<GridName, readonly string[]> = {
  'plate-wells': [
    'position',
    'role',
    'compound',
    'concentration_uM',
    'controlCurrent_pA',
    'compoundCurrent_pA',
    'fractionalBlock',
    'sealResistance_GOhm',
    'seriesResistance_MOhm',
    'capacitance_pF',
    'qc',
    'excluded',
  ],
};

/** Columns that stay shown whatever the layout (the column that names each row). */
export const GRID_ALWAYS_SHOWN: Record<GridName, readonly string[]> = {
  'plate-wells': ['position'],
};

/** Column widths a layout may hold, in CSS pixels. */
export const GRID_COLUMN_WIDTH_MIN_PX = 40;
export const GRID_COLUMN_WIDTH_MAX_PX = 1200;

/** One column of a saved layout; the layout lists them in the order shown. */
export interface GridColumnChoice {
  id: string;
  hidden: boolean;
  /** Width in CSS pixels; null keeps the grid's own width. */
  width: number | null;
}

/**
 * A saved layout made to fit the grid's columns today: unknown ids dropped, columns it does not name
 * appended in their default place order, always-shown columns shown.
 */
export function fitLayoutToGrid(grid: GridName, saved: readonly GridColumnChoice[]): GridColumnChoice[] {
  const known = GRID_COLUMNS[grid];
  const seen = new Set<string>();
  const kept: GridColumnChoice[] = [];
  for (const column of saved) {
    if (!known.includes(column.id) || seen.has(column.id)) continue;
    seen.add(column.id);
    kept.push({ ...column, hidden: column.hidden && !GRID_ALWAYS_SHOWN[grid].includes(column.id) });
  }
  for (const id of known) if (!seen.has(id)) kept.push({ id, hidden: false, width: null });
  return kept;
}
