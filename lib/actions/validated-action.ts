import 'server-only';
import { unstable_rethrow } from 'next/navigation';
import { z, type ZodType } from 'zod';
import { currentActor } from '@/lib/auth/current-actor';
import { refuseUntilOwnPassword } from '@/lib/auth/own-password';
import { requireRole, type Actor } from '@/lib/auth/roles';
import type { Role } from '@/lib/domain/roles';
import {
  DATABASE_UNAVAILABLE_MESSAGE,
  isDatabaseUnavailable,
  isStorageFull,
  STORAGE_FULL_MESSAGE,
} from '@/lib/database-unavailable';
import { isAppError } from '@/lib/errors';

/** What every form action answers: a message for the whole form and/or messages keyed by field. */
export interface ActionState {
  ok?: boolean;
  message?: string;
  fieldErrors?: Record<string, string[] | undefined>;
}

/** A server action as a form calls it: the state it last answered, and the form's data. */
export type FormAction<State extends ActionState = ActionState> = (
  state: State,
  formData: FormData,
) => Promise<State>;

/**
 * The one way server actions are written: loads the signed-in actor, refuses anyone who must first
 * choose their own password (unless `beforeOwnPassword`), checks roles, parses the form with
 * zod, and turns failures (an unreachable database too) into an ActionState the form shows beside its fields.
 */
export function validatedAction<Schema extends ZodType, Result extends ActionState = ActionState>(
  schema: Schema,
  roles: readonly Role[],
  run: (input: z.infer<Schema>, actor: Actor, formData: FormData) => Promise<Result>,
  options: { beforeOwnPassword?: boolean } = {},
) {
  return async (_previous: ActionState, formData: FormData): Promise<ActionState> => {
    try {
      const actor = await currentActor();
      if (!actor) return { message: 'Your session has ended. Sign in again.' };
      if (!options.beforeOwnPassword) refuseUntilOwnPassword(actor);
      if (roles.length) requireRole(actor, ...roles);
      const parsed = schema.safeParse(formFields(formData));
      if (!parsed.success) return invalidFormState(parsed.error);
      return await run(parsed.data, actor, formData);
    } catch (error) {
      return failedActionState(error);
    }
  };
}

/**
 * What a failed action answers: an AppError's own message and fields, an unreachable database's message,
 * or that nothing was changed. redirect() and notFound() are thrown on, as Next needs them.
 */
export function failedActionState(error: unknown): ActionState {
  unstable_rethrow(error);
  if (isAppError(error)) return { message: error.message, fieldErrors: fieldErrorsOf(error.details) };
  if (isDatabaseUnavailable(error)) {
    console.error('database unavailable during an action', error);
    return { message: DATABASE_UNAVAILABLE_MESSAGE };
  }
  if (isStorageFull(error)) {
    console.error('storage full during an action', error);
    return { message: STORAGE_FULL_MESSAGE };
  }
  console.error('unhandled action error', error);
  return { message: 'Something failed on the server; nothing was changed.' };
}

/** A form's parse failure as an action answers it. */
export function invalidFormState(error: z.ZodError): ActionState {
  return {
    message: 'Some fields need attention.',
    fieldErrors: z.flattenError(error).fieldErrors as ActionState['fieldErrors'],
  };
}

/** The form's fields; a name sent more than once (checkboxes) becomes an array; Next's own fields are left out. */
export function formFields(formData: FormData): Record<string, unknown> {
  const fields: Record<string, unknown> = {};
  for (const key of new Set(formData.keys())) {
    if (key.startsWith('$ACTION')) continue;
    const values = formData.getAll(key);
    fields[key] = values.length > 1 ? values : values[0];
  }
  return fields;
}

function fieldErrorsOf(details: unknown): ActionState['fieldErrors'] {
  if (details && typeof details === 'object' && 'fieldErrors' in details) {
    return (details as { fieldErrors: ActionState['fieldErrors'] }).fieldErrors;
  }
  return undefined;
}
