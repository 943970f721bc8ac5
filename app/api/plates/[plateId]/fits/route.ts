import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { getPlateHeader } from '@/lib/plates/detail';
import { listFitViews } from '@/lib/plates/fit-views';
import { parseId } from '@/lib/validation/ids';

/** The plate's Hill fits with curves and 95 % bands. */
export const GET = withUser<{ plateId: string }>(async (_request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  const header = await getPlateHeader(actor, plateId);
  return NextResponse.json({ version: header.version, state: header.state, fits: await listFitViews(actor, plateId) });
});
