import { z } from 'zod';

export const PLATE_EXPORT_TABLES = ['wells', 'fits', 'forecast', 'signoff'] as const;
export const COMPOUND_EXPORT_TABLES = ['potency', 'selectivity', 'forecast', 'signoff'] as const;
export const AUDIT_EXPORT_TABLES = ['events'] as const;

/** format=xlsx (every table as a sheet) or format=csv with the one table to write. */
function exportQuery<const T extends readonly [string, ...string[]]>(tables: T) {
  return z
    .object({
      format: z.enum(['xlsx', 'csv'], { error: 'format must be xlsx or csv.' }).default('xlsx'),
      table: z.enum(tables, { error: `table must be one of: ${tables.join(', ')}.` }).optional(),
    })
    .refine((q) => q.format !== 'csv' || q.table !== undefined, {
      path: ['table'],
      message: `A csv file holds one table: add table=${tables.join(', ')}.`,
    });
}

export const plateExportQuerySchema = exportQuery(PLATE_EXPORT_TABLES);
export const compoundExportQuerySchema = exportQuery(COMPOUND_EXPORT_TABLES);
export const auditExportQuerySchema = exportQuery(AUDIT_EXPORT_TABLES);

export type ExportQuery = z.infer<typeof plateExportQuerySchema> | z.infer<typeof compoundExportQuerySchema>;
