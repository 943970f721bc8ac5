import 'server-only';
import { can, type Actor } from '@/lib/auth/roles';
import { rolesFor } from '@/lib/domain/roles';
import { AppError } from '@/lib/errors';
import type { SignoffAction } from '@/lib/domain/plate-states';
import type { PlateState } from '@/lib/domain/plate-states';
import { plateContentSha256 } from './plate-content';
import { plateQcWarnings, qcWarningKeys, type QcWarning } from './qc-warnings';
import { selectLastPlateSignature, selectPanelPlate } from './queries';
import { stepsFrom, WAITING_FOR } from './steps';

export interface SignoffChoice {
  action: SignoffAction;
  label: string;
  meaning: string;
  commentRequired: boolean;
}

/** What the sign-off panel shows one person about one plate. */
export interface SignoffPanelData {
  plateId: string;
  label: string;
  state: PlateState;
  version: number;
  waitingFor: string;
  signers: {
    importedBy: string;
    verifiedBy: string | null;
    submittedBy: string | null;
    decidedBy: string | null;
  };
  /** SHA-256 of the plate's data now, and of the data under the latest signature. */
  currentSha256: string;
  lastSignature: { signerName: string; signedAt: string; meaning: string; contentSha256: string } | null;
  /** The steps this person may sign now. */
  choices: SignoffChoice[];
  /** Why this person cannot sign the step the plate waits for, when that is so. */
  notYours: string | null;
  /** The plate's QC warnings, shown before anyone signs; a signer acknowledges them. */
  qcWarnings: QcWarning[];
  /** Their keys, sent back with the signature so that it covers the warnings shown. */
  qcWarningKeys: string;
}

/** The sign-off panel of a plate for this person: its state, who signed, the data hash, and what they may sign. */
export async function signoffPanel(actor: Actor, plateId: string): Promise<SignoffPanelData> {
  const plate = await selectPanelPlate(plateId);
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const last = await selectLastPlateSignature(plateId);
  const signers = {
    importedBy: plate.importedById,
    verifiedBy: plate.verifiedById,
    submittedBy: plate.submittedById,
  };
  const qcWarnings = await plateQcWarnings(plate.id);
  const steps = stepsFrom(plate.state);
  const withRole = steps.filter((step) => can(actor, step.capability));
  const allowed = withRole.filter((step) => step.dutyConflict(signers, actor.id) === null);
  const notYours =
    steps.length === 0 || allowed.length
      ? null
      : withRole.length
        ? withRole[0]!.dutyConflict(signers, actor.id)
        : `This step needs the ${rolesFor(steps[0]!.capability).join(' or ')} role.`;
  return {
    plateId: plate.id,
    label: plate.label,
    state: plate.state,
    version: plate.version,
    waitingFor: WAITING_FOR[plate.state],
    signers: {
      importedBy: plate.importedBy,
      verifiedBy: plate.verifiedBy,
      submittedBy: plate.submittedBy,
      decidedBy: plate.decidedBy,
    },
    currentSha256: await plateContentSha256(plate.id),
    lastSignature: last ?? null,
    choices: allowed.map(({ action, label, meaning, commentRequired }) => ({
      action,
      label,
      meaning,
      commentRequired,
    })),
    notYours,
    qcWarnings,
    qcWarningKeys: qcWarningKeys(qcWarnings),
  };
}
