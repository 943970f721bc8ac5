'use server';

import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { addBatch, createCompound, updateCompound } from '@/lib/compounds/service';
import { rolesFor } from '@/lib/domain/roles';
import { batchSchema, compoundSchema } from '@/lib/validation/compounds';
import { parseId } from '@/lib/validation/ids';

/** Registers a compound and opens its page. */
export const createCompoundAction = validatedAction(
  compoundSchema,
  rolesFor('registerCompounds'),
  async (input, actor) => {
    const compound = await createCompound(actor, input);
    revalidatePath('/compounds');
    redirect(`/compounds/${compound.id}`);
  },
);

/** Saves edits to a compound. */
export const updateCompoundAction = validatedAction(
  compoundSchema.extend({ compoundId: z.string() }),
  rolesFor('registerCompounds'),
  async (input, actor) => {
    const { compoundId, ...fields } = input;
    await updateCompound(actor, parseId(compoundId, 'compound'), fields);
    revalidatePath(`/compounds/${compoundId}`);
    return { ok: true, message: 'Saved.' };
  },
);

/** Adds a batch to a compound. */
export const addBatchAction = validatedAction(
  batchSchema.extend({ compoundId: z.string() }),
  rolesFor('registerCompounds'),
  async (input, actor) => {
    const { compoundId, ...fields } = input;
    const batch = await addBatch(actor, parseId(compoundId, 'compound'), fields);
    revalidatePath(`/compounds/${compoundId}`);
    return { ok: true, message: `Batch ${batch.lot} registered.` };
  },
);
