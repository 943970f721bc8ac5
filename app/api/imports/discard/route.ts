import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { readDraftFields } from '@/lib/api/upload';
import { discardWaitingImport } from '@/lib/compounds/waiting-imports';
import { rolesFor } from '@/lib/domain/roles';
import { draftIdSchema } from '@/lib/validation/import-compounds';

/** Discards the person's own import that waits for compounds. */
export const POST = withUser(
  async (request, actor) => {
    const { draftId } = await readDraftFields(request, draftIdSchema);
    await discardWaitingImport(actor, draftId);
    return NextResponse.json({ ok: true });
  },
  { roles: rolesFor('importPlates') },
);
