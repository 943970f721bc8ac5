import 'server-only';
import type { Transaction } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { PLATE_TRANSITIONS, type SignoffAction } from '@/lib/domain/plate-states';
import { rolesFor, type Role } from '@/lib/domain/roles';
import { env } from '@/lib/env';
import type { NoticeKind } from '@/lib/domain/notices';
import type { NoticeToQueue } from '@/lib/notices/queue';
import { selectRecipients, type RecipientRow } from './queries';

/** Where a plate's sign-off panel and history live; e-mails link here. */
export const plateSignoffPath = (plateId: string) => `/plates/${plateId}/history`;

export interface NoticePlate {
  id: string;
  label: string;
  screenName: string;
  importedBy: string;
  submittedBy: string | null;
}

interface Audience {
  kind: NoticeKind;
  roles: readonly Role[];
  /** Whether the importer and submitter hear of it too. */
  owners: boolean;
  subject: string;
  done: string;
  next: string;
}

/** Who may sign the step that follows (its capability, lib/domain/roles.ts). */
const signersOf = (next: SignoffAction) => rolesFor(PLATE_TRANSITIONS[next].capability);

/** Who hears of each step: the people of the next role, and on a decision the importer and submitter. */
const AUDIENCE: Record<SignoffAction | 'import', Audience> = {
  import: {
    kind: 'plate_imported',
    roles: signersOf('verify'),
    owners: false,
    subject: 'imported: compound map to verify',
    done: 'imported',
    next: 'It waits for a chemist to verify its compound map.',
  },
  verify: {
    kind: 'plate_verified',
    roles: signersOf('submit'),
    owners: false,
    subject: 'compound map verified: ready to review and submit',
    done: 'verified the compound map of',
    next: 'It waits for a biologist to review and submit it for approval.',
  },
  submit: {
    kind: 'plate_submitted',
    roles: signersOf('approve'),
    owners: false,
    subject: 'submitted for approval',
    done: 'submitted',
    next: 'It waits for an approver to approve it or return it for rework.',
  },
  approve: {
    kind: 'plate_approved',
    roles: [],
    owners: true,
    subject: 'approved and locked',
    done: 'approved',
    next: 'It is now locked; a correction is a new import that references it.',
  },
  reject: {
    kind: 'plate_rejected',
    roles: signersOf('rework'),
    owners: true,
    subject: 'returned for rework',
    done: 'returned',
    next: 'It waits for a biologist to reopen it for rework.',
  },
  rework: {
    kind: 'plate_reopened',
    roles: signersOf('verify'),
    owners: false,
    subject: 'reopened: compound map to verify again',
    done: 'reopened',
    next: 'It waits for a chemist to verify its compound map again.',
  },
};

/** Enabled users holding one of the roles, or with one of the ids. */
async function users(
  where: 'role' | 'id',
  values: readonly string[],
  transaction: Transaction,
): Promise<RecipientRow[]> {
  if (!values.length) return [];
  return selectRecipients(where, values, transaction);
}

/** The QC warnings in a notice: read them before signing the next step. */
function qcLines(
  step: SignoffAction | 'import',
  signer: string,
  warnings: readonly { message: string }[],
): string[] {
  if (!warnings.length) return [];
  const heading =
    step === 'import'
      ? 'QC warnings on this plate (the sign-off panel shows them before anyone signs):'
      : `QC warnings on this plate, which ${signer} acknowledged when signing:`;
  return ['', heading, ...warnings.map((w) => `- ${w.message}`)];
}

/**
 * The notices of one step (kept in Gatewell and, by each person's choice, mailed): to everyone of the next role who may act on the plate (`mayAct`
 * applies segregation of duties), and on a decision to the importer and submitter; never to the signer.
 */
export async function noticesFor(
  step: SignoffAction | 'import',
  context: {
    actor: Actor;
    plate: NoticePlate;
    comment: string;
    /** The plate's QC warnings: acknowledged by the signer of the step, or found at import. */
    qcWarnings: readonly { message: string }[];
    signoffEventId: string | null;
    mayAct: (userId: string) => boolean;
  },
  transaction: Transaction,
): Promise<NoticeToQueue[]> {
  const audience = AUDIENCE[step];
  const { actor, plate } = context;
  const next = (await users('role', audience.roles, transaction)).filter((person) =>
    context.mayAct(person.id),
  );
  const owners = audience.owners
    ? await users('id', [plate.importedBy, ...(plate.submittedBy ? [plate.submittedBy] : [])], transaction)
    : [];
  const people = [...new Map([...next, ...owners].map((person) => [person.id, person])).values()].filter(
    (person) => person.id !== actor.id,
  );
  const link = `${env().APP_URL.replace(/\/$/, '')}${plateSignoffPath(plate.id)}`;
  const title = `Plate ${plate.label} ${audience.subject}`;
  const subject = `Gatewell: plate ${plate.label} ${audience.subject}`;
  // The notice in Gatewell says the same in a few sentences; an import's comment (each plate's address
  // when a file held several) is left out, as the label already names every plate.
  const summary = [
    `${actor.name} ${audience.done} plate ${plate.label} (${plate.screenName}).`,
    audience.next,
    ...(context.comment && step !== 'import' ? [`Comment: ${context.comment}`] : []),
    ...(context.qcWarnings.length
      ? [`QC warnings: ${context.qcWarnings.map((w) => w.message).join('; ')}`]
      : []),
  ].join(' ');
  return people.map((person) => ({
    kind: audience.kind,
    notice: { title, summary, linkPath: plateSignoffPath(plate.id) },
    plateId: plate.id,
    signoffEventId: context.signoffEventId,
    recipientId: person.id,
    toAddress: person.email,
    subject,
    bodyText: [
      `Hello ${person.name},`,
      '',
      `${actor.name} ${audience.done} plate ${plate.label} (${plate.screenName}).`,
      ...(context.comment ? ['', `Comment: ${context.comment}`] : []),
      ...qcLines(step, actor.name, context.qcWarnings),
      '',
      audience.next,
      '',
      `Open the plate: ${link}`,
      '',
      'Gatewell',
    ].join('\n'),
  }));
}
