import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { rolesFor } from '@/lib/domain/roles';
import { withImportSlot } from '@/lib/imports/import-slots';
import { readUpload } from '@/lib/api/upload';
import { previewImport } from '@/lib/plates/import-service';
import { previewFieldsSchema } from '@/lib/validation/imports';

/** Every row of the chosen sheet with its parse result and QC flags; writes nothing. */
export const POST = withUser(async (request, actor) => {
  const { fields, ...file } = await readUpload(request, previewFieldsSchema);
  const { format, ...rest } = fields;
  return NextResponse.json(await withImportSlot(() => previewImport(actor, { ...rest, ...file, ...(format ? { format } : {}) })));
}, { roles: rolesFor('importPlates') });
