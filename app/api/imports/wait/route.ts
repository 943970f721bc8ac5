import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { readDraftFields } from '@/lib/api/upload';
import { holdImportForCompounds } from '@/lib/compounds/waiting-imports';
import { rolesFor } from '@/lib/domain/roles';
import { waitFieldsSchema } from '@/lib/validation/import-compounds';

/** Keeps an import draft waiting for the compounds the registry lacks, and tells who may register them. */
export const POST = withUser(
  async (request, actor) => {
    const { format, ...rest } = await readDraftFields(request, waitFieldsSchema);
    return NextResponse.json(await holdImportForCompounds(actor, { ...rest, ...(format ? { format } : {}) }));
  },
  { roles: rolesFor('importPlates') },
);
