import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { rolesFor } from '@/lib/domain/roles';
import { setWellExclusion } from '@/lib/plates/review';
import { parseId } from '@/lib/validation/ids';
import { exclusionSchema } from '@/lib/validation/plates';

/** Excludes or re-includes wells with a reason; QC and block recompute in the same transaction, which also queues the refit. */
export const POST = withUser<{ plateId: string }>(
  async (request, actor, { params }) => {
    const plateId = parseId((await params).plateId, 'plate');
    const input = exclusionSchema.parse(await request.json().catch(() => ({})));
    return NextResponse.json(await setWellExclusion(actor, plateId, input));
  },
  { roles: rolesFor('reviewPlates') },
);
