import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { rolesFor } from '@/lib/domain/roles';
import { withImportSlot } from '@/lib/imports/import-slots';
import { readUpload } from '@/lib/api/upload';
import { inspectUpload } from '@/lib/plates/import-service';
import { inspectFieldsSchema } from '@/lib/validation/imports';

/** Reads an uploaded export once, keeps it as the person's import draft and proposes a column mapping per sheet. */
export const POST = withUser(
  async (request, actor) => {
    const { fields, ...file } = await readUpload(request, inspectFieldsSchema);
    return NextResponse.json(
      await withImportSlot(() => inspectUpload(actor, { screenId: fields.screenId, ...file })),
    );
  },
  { roles: rolesFor('importPlates') },
);
