import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { withImportSlot } from '@/lib/imports/import-slots';
import { readUpload } from '@/lib/api/upload';
import { commitImport } from '@/lib/plates/import-service';
import { commitFieldsSchema } from '@/lib/validation/imports';

/** Stores the plate with its wells, readouts, QC and fits in one transaction; 201 with the plate id. */
export const POST = withUser(async (request, actor) => {
  const { fields, ...file } = await readUpload(request, commitFieldsSchema);
  const { format, ...rest } = fields;
  const { plateId } = await withImportSlot(() => commitImport(actor, { ...rest, ...file, ...(format ? { format } : {}) }));
  return NextResponse.json({ plateId, href: `/plates/${plateId}` }, { status: 201 });
}, { roles: ['biologist'] });
