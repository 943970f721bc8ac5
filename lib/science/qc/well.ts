// Well vocabulary shared by QC and fractional block.

/** What a well holds: a test compound, vehicle only (0 % block) or the reference blocker (full block). */
export type WellRole = 'compound' | 'vehicle' | 'reference';

/** A cell value as it came from the plate export: a number, text, or nothing. */
export type RawValue = number | string | boolean | null | undefined;
