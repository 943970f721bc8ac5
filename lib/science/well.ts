// Raw cell values shared by QC and fractional block (a well's role is WellRole, lib/domain/well-roles.ts).

/** A cell value as it came from the plate export: a number, text, or nothing. */
export type RawValue = number | string | boolean | null | undefined;
