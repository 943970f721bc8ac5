import { z } from 'zod';
import {
  GRID_ALWAYS_SHOWN,
  GRID_COLUMNS,
  GRID_COLUMN_WIDTH_MAX_PX,
  GRID_COLUMN_WIDTH_MIN_PX,
  GRID_NAMES,
  type GridName,
} from '@/lib/domain/grid-layouts';

/** The grid a layout belongs to, from the route's path; anything else is no such grid. */
export const gridNameSchema = z.enum(GRID_NAMES, 'No such grid.');

/** A person's layout of one grid: every column at most once, in the order shown. */
export const gridLayoutSchema = (grid: GridName) =>
  z
    .object({
      columns: z
        .array(
          z.object({
            id: z.enum(GRID_COLUMNS[grid] as [string, ...string[]], 'No such column in this grid.'),
            hidden: z.boolean('Say whether the column is hidden.'),
            width: z
              .number('A column width is a number of pixels.')
              .int('A column width is a whole number of pixels.')
              .min(GRID_COLUMN_WIDTH_MIN_PX, `A column is at least ${GRID_COLUMN_WIDTH_MIN_PX} px wide.`)
              .max(GRID_COLUMN_WIDTH_MAX_PX, `A column is at most ${GRID_COLUMN_WIDTH_MAX_PX} px wide.`)
              .nullable(),
          }),
        )
        .min(1, 'Name the columns of the layout.')
        .max(GRID_COLUMNS[grid].length, 'The layout names more columns than the grid has.'),
    })
    .superRefine((layout, context) => {
      const ids = layout.columns.map((c) => c.id);
      if (new Set(ids).size !== ids.length)
        context.addIssue({ code: 'custom', message: 'A column is named twice.', path: ['columns'] });
      for (const column of layout.columns)
        if (column.hidden && GRID_ALWAYS_SHOWN[grid].includes(column.id))
          context.addIssue({
            code: 'custom',
            message: `The ${column.id} column is always shown.`,
            path: ['columns'],
          });
    });
