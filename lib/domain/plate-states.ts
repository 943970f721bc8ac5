// Where a plate stands in sign-off, the signed steps that move it, and the words people read for both.
import { z } from 'zod';
import type { Capability } from './roles';

export const PLATE_STATES = ['imported', 'verified', 'submitted', 'approved', 'rejected'] as const;
export const plateStateSchema = z.enum(PLATE_STATES);
export type PlateState = z.infer<typeof plateStateSchema>;

/** Where a plate stands, as the state badge, the plates filter and exports say it. */
export const PLATE_STATE_LABEL: Record<PlateState, string> = {
  imported: 'Imported',
  verified: 'Map verified',
  submitted: 'Awaiting approval',
  approved: 'Approved',
  rejected: 'Returned',
};

/** Where a plate stands, as it reads inside a sentence ("Plate NAV-P01 is …"). */
export const PLATE_STATE_PHRASE: Record<PlateState, string> = {
  imported: 'imported and waiting for compound-map verification',
  verified: 'verified and waiting for submission',
  submitted: 'submitted and waiting for a decision',
  approved: 'approved',
  rejected: 'returned for rework',
};

/** The signed step that puts a plate in a state, as the list of sign-off stations names it. */
export const PLATE_STATE_STATION: Record<PlateState, string> = {
  imported: 'Imported',
  verified: 'Map verified',
  submitted: 'Submitted',
  approved: 'Approved',
  rejected: 'Returned',
};

/** The way through sign-off, in order; a submitted plate may instead be returned (rejected). */
export const PLATE_STATE_PATH: readonly PlateState[] = ['imported', 'verified', 'submitted', 'approved'];

/** The five signed steps of a plate's sign-off, by the name the forms and services use. */
export const SIGNOFF_ACTIONS = ['verify', 'submit', 'approve', 'reject', 'rework'] as const;
export const signoffActionSchema = z.enum(SIGNOFF_ACTIONS, 'Choose what you are signing.');
export type SignoffAction = z.infer<typeof signoffActionSchema>;

export interface PlateTransition {
  from: PlateState;
  to: PlateState;
  /** The work the signer does (lib/domain/roles.ts says which roles may). */
  capability: Capability;
}

/** Sign-off: imported → verified → submitted → approved | rejected, and rejected → imported. */
export const PLATE_TRANSITIONS = {
  verify: { from: 'imported', to: 'verified', capability: 'verifyCompoundMap' },
  submit: { from: 'verified', to: 'submitted', capability: 'submitPlates' },
  approve: { from: 'submitted', to: 'approved', capability: 'decidePlates' },
  reject: { from: 'submitted', to: 'rejected', capability: 'decidePlates' },
  rework: { from: 'rejected', to: 'imported', capability: 'submitPlates' },
} as const satisfies Record<SignoffAction, PlateTransition>;

/** States in which wells, exclusions and fit models may still change (not once submitted or approved). */
export const EDITABLE_PLATE_STATES: readonly PlateState[] = ['imported', 'verified', 'rejected'];
