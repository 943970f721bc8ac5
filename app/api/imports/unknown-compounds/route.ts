import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { resolveUnknownCompounds } from '@/lib/compounds/from-import';
import { rolesFor } from '@/lib/domain/roles';
import { AppError } from '@/lib/errors';
import { unknownCompoundsSchema } from '@/lib/validation/import-compounds';

/** Registers a file's unknown compound identifiers, or maps them to registered compounds as aliases (JSON body). */
export const POST = withUser(
  async (request, actor) => {
    const body: unknown = await request.json().catch(() => {
      throw new AppError('invalid', 'Send the identifiers as JSON.');
    });
    return NextResponse.json(await resolveUnknownCompounds(actor, unknownCompoundsSchema.parse(body)));
  },
  { roles: rolesFor('registerCompounds') },
);
