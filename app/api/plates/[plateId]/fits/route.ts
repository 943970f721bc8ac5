import { withUser } from '@/lib/api/handler';
import { keptTaggedJson, notModified, plateAnswerTag, requestHoldsTag } from '@/lib/plates/answer-tag';
import { getPlateHeader } from '@/lib/plates/detail';
import { listFitViews } from '@/lib/plates/fit-views';
import { parseId } from '@/lib/validation/ids';

/**
 * The plate's Hill fits with what their curves and 95 % bands are drawn from, and whether a refit is
 * still queued or running. Tagged (ETag) by the plate's content revision and state: a browser asking
 * again with the tag it holds gets 304 without the fits being read.
 */
export const GET = withUser<{ plateId: string }>(async (request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  const tag = await plateAnswerTag(actor, plateId, 'fits');
  if (requestHoldsTag(request, tag)) return notModified(tag);
  return keptTaggedJson(plateId, 'fits', tag, async () => {
    const header = await getPlateHeader(actor, plateId);
    return {
      version: header.version,
      state: header.state,
      fitsPending: header.fitsPending,
      fits: await listFitViews(actor, plateId),
    };
  });
});
