import { NextResponse } from 'next/server';
import { z } from 'zod';
import { withUser } from '@/lib/api/handler';
import { readUpload } from '@/lib/api/upload';
import { registerCompoundsFromSheet } from '@/lib/compounds/bulk';
import { rolesFor } from '@/lib/domain/roles';

const fields = z.object({
  commit: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
});

/** Checks (commit=false) or registers (commit=true) every compound of an uploaded spreadsheet, all or none. */
export const POST = withUser(
  async (request, actor) => {
    const {
      fields: { commit },
      bytes,
      filename,
    } = await readUpload(request, fields);
    const result = await registerCompoundsFromSheet(actor, { bytes, filename }, commit);
    return NextResponse.json(result, { status: commit && result.ok ? 201 : 200 });
  },
  { roles: rolesFor('registerCompounds') },
);
