import 'server-only';
import { Op, type Transaction } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { rolesFor } from '@/lib/domain/roles';
import { env } from '@/lib/env';
import { queueNotices, type NoticeToQueue } from '@/lib/notices/queue';
import { User, UserRole } from '@/models';

/** Where the people who may register compounds find the imports waiting for them. */
export const WAITING_IMPORTS_PATH = '/compounds#waiting-imports';
/** One waiting import in the list of the compounds page (components/imports/waiting-imports.tsx). */
export const waitingImportPath = (draftId: string) => `/compounds#waiting-import-${draftId}`;
/** Where an import's owner resumes a waiting import. */
export const resumeImportPath = (draftId: string) => `/plates/import?resume=${draftId}`;

const link = (path: string) => `${env().APP_URL.replace(/\/$/, '')}${path}`;

/** Enabled people holding a role that may register compounds, by e-mail. */
async function registrars(transaction: Transaction) {
  const roles = await UserRole.findAll({
    attributes: ['userId'],
    where: { role: [...rolesFor('registerCompounds')] },
    raw: true,
    transaction,
  });
  return User.findAll({
    attributes: ['id', 'email', 'name'],
    where: { id: [...new Set(roles.map((r) => r.userId))], disabledAt: { [Op.is]: null } },
    order: [['email', 'ASC']],
    raw: true,
    transaction,
  });
}

const list = (identifiers: readonly string[]) => identifiers.map((id) => `  - ${id}`);

/**
 * Writes, in the caller's transaction, the notice (in Gatewell and, by choice, by e-mail) to everyone who
 * may register compounds (not the actor) that an import waits for these identifiers; returns the
 * addresses of the people told.
 */
export async function queueWaitingNotices(
  actor: Actor,
  draft: { id: string; filename: string; screenName: string; waitingFor: readonly string[] },
  transaction: Transaction,
): Promise<string[]> {
  const people = (await registrars(transaction)).filter((p) => p.id !== actor.id);
  const n = draft.waitingFor.length;
  const title = `An import waits for ${n} compound${n === 1 ? '' : 's'} to be registered`;
  const messages: NoticeToQueue[] = people.map((person) => ({
    kind: 'import_waiting_for_compounds',
    notice: {
      title,
      summary: `${actor.name} is importing ${draft.filename} (${draft.screenName}), which names compounds the registry does not know: ${draft.waitingFor.join(', ')}. Register them, or map each to a registered compound as an alias.`,
      linkPath: waitingImportPath(draft.id),
    },
    plateId: null,
    signoffEventId: null,
    recipientId: person.id,
    toAddress: person.email,
    subject: `Gatewell: ${title[0]!.toLowerCase()}${title.slice(1)}`,
    bodyText: [
      `Hello ${person.name},`,
      '',
      `${actor.name} is importing ${draft.filename} (${draft.screenName}). The file names ${n} compound${n === 1 ? '' : 's'} the registry does not know:`,
      ...list(draft.waitingFor),
      '',
      'Register them, or map each to a registered compound as an alias; the import waits until then.',
      '',
      `Open the imports waiting for compounds: ${link(WAITING_IMPORTS_PATH)}`,
      '',
      'Gatewell',
    ].join('\n'),
  }));
  await queueNotices(messages, transaction);
  return messages.map((m) => m.toAddress);
}

/**
 * Writes, in the caller's transaction, the notice (in Gatewell and, by choice, by e-mail) to a waiting
 * import's owner that nothing is missing now.
 */
export async function queueReadyNotice(
  actor: Actor,
  draft: { id: string; ownerId: string; filename: string; waitingFor: readonly string[] },
  transaction: Transaction,
): Promise<void> {
  if (draft.ownerId === actor.id) return;
  const owner = await User.findOne({
    attributes: ['id', 'email', 'name'],
    where: { id: draft.ownerId, disabledAt: { [Op.is]: null } },
    raw: true,
    transaction,
  });
  if (!owner) return;
  await queueNotices(
    [
      {
        kind: 'import_compounds_ready',
        notice: {
          title: `The compounds of ${draft.filename} are registered`,
          summary: `${actor.name} registered or mapped the compounds your import of ${draft.filename} waited for: ${draft.waitingFor.join(', ')}. Check the rows again and store the plate.`,
          linkPath: resumeImportPath(draft.id),
        },
        plateId: null,
        signoffEventId: null,
        recipientId: owner.id,
        toAddress: owner.email,
        subject: `Gatewell: the compounds of ${draft.filename} are registered`,
        bodyText: [
          `Hello ${owner.name},`,
          '',
          `${actor.name} registered or mapped the compounds your import of ${draft.filename} waited for:`,
          ...list(draft.waitingFor),
          '',
          'Check the rows again and store the plate.',
          '',
          `Resume the import: ${link(resumeImportPath(draft.id))}`,
          '',
          'Gatewell',
        ].join('\n'),
      },
    ],
    transaction,
  );
}
