import 'server-only';
// The value maps applied to rows: which role a row's well has, from the role column's value map, the
// control compounds or concentration 0, and Gatewell's guess from common words.
import type { WellRole } from '@/lib/domain/well-roles';
import { MISSING_MARKERS, readText } from './read-cell';
import type { RowContext } from './row-context';
import { guessRoleValue, valueKey, type RoleChoice } from './role-words';
import { normaliseIdentifier } from './normalise-text';
import type { Cell } from './spreadsheet-types';

/** The role column's value as written (trimmed), or null when the cell is blank. */
export function roleCellText(cell: Cell | undefined): string | null {
  if (cell === null || cell === undefined) return null;
  const text = typeof cell === 'string' ? cell.trim() : String(cell);
  return text === '' ? null : text;
}

/** What a value of the role column means: the mapping's value map first, then the common words; null when unknown. */
export function roleChoiceOf(text: string, ctx: Pick<RowContext, 'roleValues'>): RoleChoice | null {
  return ctx.roleValues.get(valueKey(text)) ?? guessRoleValue(text);
}

const isMissing = (text: string) => MISSING_MARKERS.includes(text.toLowerCase());

/**
 * The role of a row's well. A value in the role column decides; a blank one (or no role column) leaves it to
 * the compound: a control compound of the mapping, concentration 0 when the mapping says so (pass the
 * row's concentration, or undefined before it is read), a compound identifier that is itself a control
 * word (DMSO), else test. Null when the role column holds a word that is neither mapped nor guessed.
 */
export function roleChoiceForRow(
  cells: Cell[],
  ctx: RowContext,
  concentration_uM?: number | null,
): RoleChoice | null {
  const roleColumn = ctx.columns.role;
  const text = roleColumn ? roleCellText(cells[roleColumn.index]) : null;
  if (text !== null) {
    const choice = roleChoiceOf(text, ctx);
    if (choice) return choice;
    if (!isMissing(text)) return null;
  }
  const compoundColumn = ctx.columns.compound;
  const compound = compoundColumn ? readText(cells[compoundColumn.index]) : null;
  if (compound !== null) {
    const id = normaliseIdentifier(compound);
    if (ctx.negativeCompounds.has(id)) return 'vehicle';
    if (ctx.positiveCompounds.has(id)) return 'reference';
  }
  if (ctx.mapping.controls.zeroConcentration && concentration_uM !== undefined && !concentration_uM)
    return 'vehicle';
  const guess = compound === null ? null : guessRoleValue(compound);
  return guess === 'vehicle' || guess === 'reference' ? guess : 'test';
}

/** The well role stored for a row; an unknown role word reads as test (the whole file is refused before that). */
export function wellRoleForRow(cells: Cell[], ctx: RowContext, concentration_uM: number | null): WellRole {
  const choice = roleChoiceForRow(cells, ctx, concentration_uM);
  return choice === null || choice === 'empty' ? 'test' : choice;
}

/** The role column's values, as first written, that the value map does not place and Gatewell cannot guess. */
export function unknownRoleValues(rows: Cell[][], ctx: RowContext): string[] {
  const roleColumn = ctx.columns.role;
  if (!roleColumn) return [];
  const unknown = new Map<string, string>();
  for (const cells of rows) {
    const text = roleCellText(cells[roleColumn.index]);
    if (text === null || isMissing(text) || roleChoiceOf(text, ctx) !== null) continue;
    if (!unknown.has(valueKey(text))) unknown.set(valueKey(text), text);
  }
  return [...unknown.values()];
}
