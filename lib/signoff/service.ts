import 'server-only';
import type { Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { signRecord } from '@/lib/auth/signature';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { queueNotices } from '@/lib/notices/queue';
import { parseOrRefuse } from '@/lib/validation/parse';
import { signoffRequestSchema, type SignoffRequest } from '@/lib/validation/signoff';
import { Plate, Screen, SignoffEvent } from '@/models';
import type { PlateState, SignoffAction } from '@/lib/domain/plate-states';
import { refusalFromDatabase, refuseWrongState } from './refusals';
import { noticesFor } from './notices';
import { plateContent } from './plate-content';
import { plateQcWarnings, qcWarningKeys, type QcWarning } from './qc-warnings';
import { SIGNOFF_STEPS, stepsFrom, type SignoffStep } from './steps';

export interface SignoffResult {
  plateId: string;
  label: string;
  state: PlateState;
  version: number;
  signatureId: string;
  signoffEventId: string;
  contentSha256: string;
  /** Notifications queued in the outbox with the transition. */
  notified: number;
  /** The QC warnings the signer acknowledged, stored with the sign-off event. */
  qcWarnings: QcWarning[];
}

/** The plate columns a step sets: who verified, submitted or decided; rework clears them for the next round. */
function signerColumns(
  action: SignoffAction,
  actorId: string,
): Partial<Pick<Plate, 'verifiedBy' | 'submittedBy' | 'decidedBy'>> {
  if (action === 'verify') return { verifiedBy: actorId };
  if (action === 'submit') return { submittedBy: actorId };
  if (action === 'rework') return { verifiedBy: null, submittedBy: null, decidedBy: null };
  return { decidedBy: actorId };
}

/** Whether someone may sign whatever the plate waits for next (used to address the notifications). */
function mayActNext(plate: Plate, userId: string): boolean {
  return stepsFrom(plate.state).some((next) => next.dutyConflict(plate, userId) === null);
}

/**
 * A plate with QC warnings is signed only by someone who ticked that they read them, and only over the
 * warnings they were shown (a form sends their keys back): otherwise nothing is signed.
 */
function requireQcAcknowledgement(
  label: string,
  warnings: QcWarning[],
  input: { acknowledgeQcWarnings: boolean; qcWarningsShown?: string | undefined },
): void {
  if (!warnings.length) return;
  if (input.qcWarningsShown !== undefined && input.qcWarningsShown.trim() !== qcWarningKeys(warnings)) {
    throw new AppError(
      'conflict',
      `The QC warnings of plate ${label} changed after you opened it; reload the page and read them before you sign. Nothing was signed.`,
    );
  }
  if (!input.acknowledgeQcWarnings) {
    const message = `Plate ${label} has ${warnings.length === 1 ? 'a QC warning' : `${warnings.length} QC warnings`}: tick that you read ${warnings.length === 1 ? 'it' : 'them'} before you sign. Nothing was signed.`;
    throw new AppError('invalid', message, {
      fieldErrors: { acknowledgeQcWarnings: [message] },
    });
  }
}

/** States a plate reaches only with current fits (the database checks submitted and approved as well). */
const SIGNED_OVER_FITS: PlateState[] = ['verified', 'submitted', 'approved'];

async function lockForStep(
  actor: Actor,
  plateId: string,
  step: SignoffStep,
  expectedVersion: number | undefined,
  transaction: Transaction,
): Promise<Plate> {
  const plate = await Plate.findByPk(plateId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!plate) throw new AppError('not_found', 'No such plate.');
  if (plate.state !== step.from) await refuseWrongState(plate, step, transaction);
  if (expectedVersion !== undefined && expectedVersion !== plate.version) {
    throw new AppError(
      'conflict',
      `Plate ${plate.label} changed after you opened it; reload the page and check it before you sign. Nothing was signed.`,
    );
  }
  const conflict = step.dutyConflict(plate, actor.id);
  if (conflict) throw new AppError('forbidden', conflict);
  // A signature covers the fits: it waits until the refit queued by the last change has run.
  if (plate.fitsPending && SIGNED_OVER_FITS.includes(step.to)) {
    throw new AppError(
      'conflict',
      `The fits of plate ${plate.label} are still being computed after its last change; sign once the plate page shows them current. Nothing was signed.`,
    );
  }
  return plate;
}

/**
 * Signs one sign-off step of a plate in one transaction: re-verifies the password, signs the SHA-256 of
 * the plate's data as it stands, writes the sign-off event, moves the plate's state (version + 1), and
 * appends the audit event and the notifications for whoever acts next. The plate row is locked first,
 * so of two people signing at once exactly one succeeds; the other is told what happened. The signer is
 * always `actor`, the signed-in person: no caller names another. A plate with QC warnings needs the
 * signer's acknowledgement, stored with the sign-off event and told in the notifications.
 */
export async function signPlateStep(
  actor: Actor,
  plateId: string,
  raw: SignoffRequest,
): Promise<SignoffResult> {
  const input = parseOrRefuse(signoffRequestSchema, raw, 'The signature is not complete.');
  const step = SIGNOFF_STEPS[input.action];
  requireCapability(actor, step.capability);
  try {
    return await db().transaction(async (transaction) => {
      const plate = await lockForStep(actor, plateId, step, input.expectedVersion, transaction);
      const qcWarnings = await plateQcWarnings(plate.id, transaction);
      requireQcAcknowledgement(plate.label, qcWarnings, input);
      const content = await plateContent(plate.id, transaction);
      const signature = await signRecord(
        actor,
        {
          password: input.password,
          meaning: step.meaning,
          comment: input.comment,
          entityType: 'plate',
          entityId: plate.id,
          content,
        },
        transaction,
      );
      const event = await SignoffEvent.create(
        {
          plateId: plate.id,
          signatureId: signature.id,
          fromState: step.from,
          toState: step.to,
          qcWarnings: qcWarnings.map(({ code, key, message }) => ({ code, key, message })),
        },
        { transaction },
      );
      const before = {
        state: plate.state,
        version: plate.version,
        verifiedBy: plate.verifiedBy,
        submittedBy: plate.submittedBy,
        decidedBy: plate.decidedBy,
      };
      await plate.update(
        { state: step.to, version: plate.version + 1, ...signerColumns(step.action, actor.id) },
        { transaction },
      );
      await recordAudit(
        {
          actorId: actor.id,
          action: step.action,
          entityType: 'plate',
          entityId: plate.id,
          reason: input.comment || null,
          address: actor.address,
          before,
          after: {
            state: plate.state,
            version: plate.version,
            verifiedBy: plate.verifiedBy,
            submittedBy: plate.submittedBy,
            decidedBy: plate.decidedBy,
            signatureId: signature.id,
            signoffEventId: event.id,
            meaning: step.meaning,
            contentSha256: signature.contentSha256,
            ...(qcWarnings.length ? { qcWarningsAcknowledged: qcWarnings.map((w) => w.message) } : {}),
          },
        },
        transaction,
      );
      const screen = await Screen.findByPk(plate.screenId, { transaction, rejectOnEmpty: true });
      const notices = await noticesFor(
        step.action,
        {
          actor,
          comment: input.comment,
          qcWarnings,
          signoffEventId: event.id,
          mayAct: (userId) => mayActNext(plate, userId),
          plate: {
            id: plate.id,
            label: plate.label,
            screenName: screen.name,
            importedBy: plate.importedBy,
            submittedBy: plate.submittedBy,
          },
        },
        transaction,
      );
      const notified = await queueNotices(notices, transaction);
      return {
        plateId: plate.id,
        label: plate.label,
        state: plate.state,
        version: plate.version,
        signatureId: signature.id,
        signoffEventId: event.id,
        contentSha256: signature.contentSha256,
        notified,
        qcWarnings,
      };
    });
  } catch (error) {
    throw refusalFromDatabase(error);
  }
}
