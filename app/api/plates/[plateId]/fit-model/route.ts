import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { rolesFor } from '@/lib/domain/roles';
import { setFitModel } from '@/lib/plates/review';
import { parseId } from '@/lib/validation/ids';
import { fitModelSchema } from '@/lib/validation/plates';

/** Switches one compound × target fit between the two- and four-parameter Hill model. */
export const POST = withUser<{ plateId: string }>(
  async (request, actor, { params }) => {
    const plateId = parseId((await params).plateId, 'plate');
    const input = fitModelSchema.parse(await request.json().catch(() => ({})));
    return NextResponse.json(await setFitModel(actor, plateId, input));
  },
  { roles: rolesFor('reviewPlates') },
);
