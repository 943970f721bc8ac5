// What a well holds, in one word from the import to the science and the database (wells.role). A plate
// export's own words for the roles are mapped to these once, by the import (lib/imports/import-fields.ts).
import { z } from 'zod';

/** A test compound, vehicle only (0 % block) or the reference blocker (full block). */
export const WELL_ROLES = ['vehicle', 'reference', 'test'] as const;
export const wellRoleSchema = z.enum(WELL_ROLES);
export type WellRole = z.infer<typeof wellRoleSchema>;
