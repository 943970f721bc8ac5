// What a well holds and the raw values read from it, as the science sees them. lib/domain/well-roles.ts
// re-exports the roles as the app's vocabulary: one definition, and the science stays self-contained.

/** A test compound, vehicle only (0 % block) or the reference blocker (full block). */
export const WELL_ROLES = ['vehicle', 'reference', 'test'] as const;
export type WellRole = (typeof WELL_ROLES)[number];

/** A cell value as it came from the plate export: a number, text, or nothing. */
export type RawValue = number | string | boolean | null | undefined;
