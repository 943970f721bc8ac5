import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { getPlateHeader, listPlateWells } from '@/lib/plates/detail';
import { parseId } from '@/lib/validation/ids';

/** Every readout of the plate with its well, QC reasons and block, and the plate's version and state. */
export const GET = withUser<{ plateId: string }>(async (_request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  const header = await getPlateHeader(actor, plateId);
  return NextResponse.json({
    version: header.version,
    state: header.state,
    wells: await listPlateWells(actor, plateId),
  });
});
