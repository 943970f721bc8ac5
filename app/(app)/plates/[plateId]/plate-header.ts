import { notFound } from 'next/navigation';
import { cache } from 'react';
import { requireActor } from '@/lib/auth/current-actor';
import { isAppError } from '@/lib/errors';
import { getPlateHeader } from '@/lib/plates/detail';
import { parseId } from '@/lib/validation/ids';

/** The signed-in actor and the plate's header for this request (shared by the layout and its pages). */
export const loadPlate = cache(async (plateId: string) => {
  const actor = await requireActor();
  try {
    return { actor, header: await getPlateHeader(actor, parseId(plateId, 'plate')) };
  } catch (error) {
    if (isAppError(error) && error.code === 'not_found') notFound();
    throw error;
  }
});
