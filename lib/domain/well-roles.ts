// What a well holds, in one word from the import to the science and the database (wells.role). A plate
// export's own words for the roles are mapped to these once, by the import (lib/imports/import-fields.ts).
// The roles are defined by the science (lib/science/qc/well.ts), which imports nothing of the app.
import { z } from 'zod';
import { WELL_ROLES } from '@/lib/science/qc/well';

export { WELL_ROLES, type WellRole } from '@/lib/science/qc/well';
export const wellRoleSchema = z.enum(WELL_ROLES);
