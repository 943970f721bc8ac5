import 'server-only';
import type { Transaction } from 'sequelize';
import { AppError, isAppError } from '@/lib/errors';
import { PLATE_STATE_PHRASE, type PlateState } from '@/lib/domain/plate-states';
import type { Plate } from '@/models/plate';
import { selectLastSignoff } from './queries';
import type { SignoffStep } from './steps';

const timeFormat = new Intl.DateTimeFormat('en-GB', {
  dateStyle: 'medium',
  timeStyle: 'short',
  timeZone: 'UTC',
});

/**
 * Refuses a step on a plate that is not in the step's starting state, saying who moved it and when;
 * this is what the slower of two people signing at once reads. An approved plate is refused as locked.
 */
export async function refuseWrongState(
  plate: Plate,
  step: SignoffStep,
  transaction: Transaction,
): Promise<never> {
  const last = await selectLastSignoff(plate.id, transaction);
  const by = last ? ` by ${last.name} (${timeFormat.format(new Date(last.signedAt))} UTC)` : '';
  if (plate.state === 'approved') {
    throw new AppError(
      'locked',
      `Plate ${plate.label} was approved${by} and is locked: no signature, edit or exclusion can change it. A correction is a new import that references it. Nothing was signed.`,
    );
  }
  throw new AppError(
    'conflict',
    `Plate ${plate.label} is ${PLATE_STATE_PHRASE[plate.state as PlateState]}${by}; “${step.label}” needs a plate that is ${PLATE_STATE_PHRASE[step.from]}. Nothing was signed; reload to see the plate as it is.`,
  );
}

interface PgCause {
  code?: string;
  constraint?: string;
}

const DUTY_CONSTRAINTS: Record<string, string> = {
  plates_decider_independent:
    'The database refused it: whoever decides on a plate may not have imported or verified it.',
  plates_decider_not_submitter:
    'The database refused it: whoever decides on a plate may not have submitted it.',
  plates_verifier_independent:
    'The database refused it: the chemist who verifies a plate may not have imported it.',
  plates_submitter_not_verifier:
    'The database refused it: whoever submits a plate may not have verified its compound map.',
  signoff_events_one_duty_per_round:
    'The database refused it: you already signed another step of this plate in this round, and its verifier, submitter and approver are three different people. Nothing was signed.',
  signoff_events_signature_of_plate: 'The database refused it: that signature is not one of this plate.',
};

/** Turns the database's own refusals (the plate lock trigger, segregation-of-duties checks) into messages for people. */
export function refusalFromDatabase(error: unknown): unknown {
  if (isAppError(error)) return error;
  const cause =
    (error as { parent?: PgCause; original?: PgCause }).parent ?? (error as { original?: PgCause }).original;
  if (cause?.code === 'P0002')
    return new AppError('locked', 'This plate is approved and locked; nothing was changed.');
  if (cause?.code === '23514' && cause.constraint && DUTY_CONSTRAINTS[cause.constraint])
    return new AppError('forbidden', DUTY_CONSTRAINTS[cause.constraint]!);
  return error;
}
