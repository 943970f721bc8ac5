import 'server-only';
import {
  PLATE_TRANSITIONS,
  type PlateState,
  type PlateTransition,
  type SignoffAction,
} from '@/lib/domain/plate-states';

/**
 * Who has signed what on the plate so far in this round (the plate row's *_by columns, which rework
 * clears). Segregation of duties: in one round the verifier, the submitter and the decider are three
 * different people, whatever roles their accounts hold; the importer neither verifies nor decides. The
 * database keeps the same rule (CHECKs on plates, and the trigger on signoff_events of migration
 * 20261209000200, which states the rule in full).
 */
export interface PlateSigners {
  importedBy: string;
  verifiedBy: string | null;
  submittedBy: string | null;
}

/** One signed step: its transition and capability (lib/domain/plate-states.ts), wording and duties. */
export interface SignoffStep extends PlateTransition {
  action: SignoffAction;
  /** Button and history wording. */
  label: string;
  /** The meaning of the signature, fixed per step and shown before signing. */
  meaning: string;
  commentRequired: boolean;
  /** Why this person may not sign the step on this plate (segregation of duties), or null. */
  dutyConflict: (plate: PlateSigners, actorId: string) => string | null;
}

const none = () => null;

/** Nobody decides on a plate they imported, verified or submitted (also CHECK constraints on plates). */
function deciderConflict(plate: PlateSigners, actorId: string): string | null {
  if (actorId === plate.importedBy) return 'You imported this plate, so another approver decides on it.';
  if (actorId === plate.verifiedBy)
    return 'You verified this plate’s compound map, so another approver decides on it.';
  if (actorId === plate.submittedBy) return 'You submitted this plate, so another approver decides on it.';
  return null;
}

/** Gatewell's sign-off steps over the transitions of PLATE_TRANSITIONS. */
export const SIGNOFF_STEPS: Record<SignoffAction, SignoffStep> = {
  verify: {
    action: 'verify',
    ...PLATE_TRANSITIONS.verify,
    label: 'Verify the compound map',
    commentRequired: false,
    meaning: 'Compound map verified: each well holds the compound and concentration the export states.',
    dutyConflict: (plate, actorId) =>
      actorId === plate.importedBy
        ? 'You imported this plate, so another chemist verifies its compound map.'
        : null,
  },
  submit: {
    action: 'submit',
    ...PLATE_TRANSITIONS.submit,
    label: 'Submit for approval',
    commentRequired: false,
    meaning: 'Reviewed and submitted: the QC, exclusions and fits of this plate are ready for approval.',
    dutyConflict: (plate, actorId) =>
      actorId === plate.verifiedBy
        ? 'You verified this plate’s compound map, so another biologist reviews and submits it.'
        : null,
  },
  approve: {
    action: 'approve',
    ...PLATE_TRANSITIONS.approve,
    label: 'Approve',
    commentRequired: false,
    meaning: 'Approved: the results of this plate are accepted as they stand, and the plate is locked.',
    dutyConflict: deciderConflict,
  },
  reject: {
    action: 'reject',
    ...PLATE_TRANSITIONS.reject,
    label: 'Return for rework',
    commentRequired: true,
    meaning: 'Returned for rework: the results of this plate are not accepted as they stand.',
    dutyConflict: deciderConflict,
  },
  rework: {
    action: 'rework',
    ...PLATE_TRANSITIONS.rework,
    label: 'Reopen for rework',
    commentRequired: false,
    meaning: 'Reopened for rework: the plate goes back to compound-map verification.',
    dutyConflict: none,
  },
};

/** The steps that leave a state (two for a submitted plate). */
export function stepsFrom(state: PlateState): SignoffStep[] {
  return Object.values(SIGNOFF_STEPS).filter((step) => step.from === state);
}

/** What the plate waits for in each state, for people who cannot act on it themselves. */
export const WAITING_FOR: Record<PlateState, string> = {
  imported: 'Waiting for a chemist to verify the compound map.',
  verified: 'Waiting for a biologist to review and submit it for approval.',
  submitted: 'Waiting for an approver to approve it or return it for rework.',
  rejected: 'Returned: waiting for a biologist to reopen it for rework.',
  approved: 'Approved and locked: wells, exclusions, readouts and fits can no longer change.',
};
