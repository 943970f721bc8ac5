import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { rolesFor } from '@/lib/domain/roles';
import { withImportSlot } from '@/lib/imports/import-slots';
import { readDraftFields } from '@/lib/api/upload';
import { previewImport } from '@/lib/plates/import-service';
import { previewFieldsSchema } from '@/lib/validation/imports';

/** Every row of the chosen sheet of an import draft with its parse result and QC flags; writes nothing. */
export const POST = withUser(
  async (request, actor) => {
    const { format, ...rest } = await readDraftFields(request, previewFieldsSchema);
    return NextResponse.json(
      await withImportSlot(() => previewImport(actor, { ...rest, ...(format ? { format } : {}) })),
    );
  },
  { roles: rolesFor('importPlates') },
);
