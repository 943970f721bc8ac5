import { withUser } from '@/lib/api/handler';
import { keptTaggedJson, notModified, plateAnswerTag, requestHoldsTag } from '@/lib/plates/answer-tag';
import { getPlateHeader, listPlateWells } from '@/lib/plates/detail';
import { parseId } from '@/lib/validation/ids';

/**
 * Every readout of the plate with its well, QC reasons and block, and the plate's version and state.
 * Tagged (ETag) by the plate's content revision and state: a browser asking again with the tag it holds
 * gets 304 without the wells being read.
 */
export const GET = withUser<{ plateId: string }>(async (request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  const tag = await plateAnswerTag(actor, plateId, 'wells');
  if (requestHoldsTag(request, tag)) return notModified(tag);
  return keptTaggedJson(plateId, 'wells', tag, async () => {
    const header = await getPlateHeader(actor, plateId);
    return { version: header.version, state: header.state, wells: await listPlateWells(actor, plateId) };
  });
});
