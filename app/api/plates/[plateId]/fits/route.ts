import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { getPlateHeader } from '@/lib/plates/detail';
import { listFitViews } from '@/lib/plates/fit-views';
import { parseId } from '@/lib/validation/ids';

/** The plate's Hill fits with curves and 95 % bands, and whether a refit is still queued or running. */
export const GET = withUser<{ plateId: string }>(async (_request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  const header = await getPlateHeader(actor, plateId);
  return NextResponse.json({
    version: header.version,
    state: header.state,
    fitsPending: header.fitsPending,
    fits: await listFitViews(actor, plateId),
  });
});
