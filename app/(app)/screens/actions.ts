'use server';

import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { rolesFor } from '@/lib/domain/roles';
import { addTarget, createScreen, setTargetMapping, updateScreen } from '@/lib/screens/service';
import { parseId } from '@/lib/validation/ids';
import { screenSchema, targetMappingSchema, targetSchema } from '@/lib/validation/screens';

/** Creates a screen and opens it to add targets. */
export const createScreenAction = validatedAction(
  screenSchema,
  rolesFor('manageScreens'),
  async (input, actor) => {
    const { id } = await createScreen(actor, input);
    revalidatePath('/screens');
    redirect(`/screens/${id}`);
  },
);

/** Saves a screen's settings. */
export const updateScreenAction = validatedAction(
  screenSchema.and(z.object({ screenId: z.string() })),
  rolesFor('manageScreens'),
  async (input, actor) => {
    const { screenId, ...fields } = input;
    await updateScreen(actor, parseId(screenId, 'screen'), fields);
    revalidatePath(`/screens/${screenId}`);
    return { ok: true, message: 'Saved.' };
  },
);

/** Adds a target to a screen. */
export const addTargetAction = validatedAction(
  targetSchema.extend({ screenId: z.string() }),
  rolesFor('manageScreens'),
  async (input, actor) => {
    const { screenId, ...fields } = input;
    await addTarget(actor, parseId(screenId, 'screen'), fields);
    revalidatePath(`/screens/${screenId}`);
    return { ok: true, message: `Target ${fields.name} added.` };
  },
);

/** Sets a target's conductance in another preset than the screen's current one. */
export const setTargetMappingAction = validatedAction(
  targetMappingSchema.extend({ screenId: z.string(), targetId: z.string() }),
  rolesFor('manageScreens'),
  async (input, actor) => {
    const { screenId, targetId, ...fields } = input;
    await setTargetMapping(actor, parseId(targetId, 'target'), fields);
    revalidatePath(`/screens/${screenId}`);
    return { ok: true, message: `Mapping in ${fields.preset} saved.` };
  },
);
