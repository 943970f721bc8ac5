import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { can, requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import type { ColumnMappingInput } from '@/lib/imports/mapping-schema';
import {
  listWaitingDrafts,
  markDraftWaiting,
  readDraft,
  removeDraft,
  type WaitingDraft,
} from '@/lib/plates/import-drafts';
import { inspectSheets, previewImport, type SheetInspection } from '@/lib/plates/import-service';
import { screenTargetAliases } from '@/lib/plates/templates';
import { waitingChoiceSchema, type WaitingChoice } from '@/lib/validation/import-compounds';
import { Screen, User } from '@/models';
import { aliasText, resolveCompoundNames } from './aliases';
import { queueWaitingNotices } from './import-notices';

/**
 * Imports that wait for compounds: a person who may import but not register compounds keeps the draft
 * waiting for the identifiers the registry lacks; everyone who may register them is told by e-mail and
 * sees the list (compounds page, home page). Once they are registered or mapped, the owner resumes the
 * import with the sheet, mapping and label kept. A waiting draft does not expire: it stays until it is
 * stored or its owner discards it.
 */

export interface WaitRequest {
  draftId: string;
  sheet: string;
  mapping: ColumnMappingInput;
  format?: PlateFormat | undefined;
  label: string;
  /** Labels of a file's plates by their key, for a file of several plates. */
  labels?: Record<string, string> | undefined;
}

/** Keeps the actor's draft waiting for the compounds its check found unregistered, and tells who may register them. */
export async function holdImportForCompounds(
  actor: Actor,
  request: WaitRequest,
): Promise<{ waitingFor: string[]; notified: string[] }> {
  requireCapability(actor, 'importPlates');
  const { label, ...choice } = request;
  const preview = await previewImport(actor, choice);
  const waitingFor = preview.unknownCompounds.map((c) => c.identifier);
  if (!waitingFor.length)
    throw new AppError(
      'invalid',
      'Every compound of this file is registered: store the plate instead of waiting.',
    );
  return db().transaction(async (transaction) => {
    const draft = await readDraft(actor, request.draftId, { transaction, content: false });
    const screen = await Screen.findByPk(draft.screenId, { transaction, rejectOnEmpty: true });
    const kept: WaitingChoice = waitingChoiceSchema.parse({ ...choice, label });
    await markDraftWaiting(draft.id, { waitingFor, choice: kept }, transaction);
    await recordAudit(
      {
        actorId: actor.id,
        action: 'wait',
        entityType: 'import_draft',
        entityId: draft.id,
        after: { filename: draft.filename, screenId: draft.screenId, waitingFor },
        address: actor.address,
      },
      transaction,
    );
    const notified = await queueWaitingNotices(
      actor,
      { id: draft.id, filename: draft.filename, screenName: screen.name, waitingFor },
      transaction,
    );
    return { waitingFor, notified };
  });
}

/** A waiting import as the lists show it. */
export interface WaitingImport {
  id: string;
  filename: string;
  screenName: string;
  ownerName: string;
  ownedByActor: boolean;
  waitingSince: string;
  waitingFor: string[];
  /** The identifiers still neither registered nor an alias. */
  missing: string[];
}

/** Waiting imports the actor may act on: every one for those who may register compounds, else their own. */
export async function listWaitingImports(actor: Actor): Promise<WaitingImport[]> {
  const drafts = await listWaitingDrafts(can(actor, 'registerCompounds') ? {} : { ownerId: actor.id });
  if (!drafts.length) return [];
  const [owners, screens, resolved] = await Promise.all([
    User.findAll({ attributes: ['id', 'name'], where: { id: drafts.map((d) => d.ownerId) }, raw: true }),
    Screen.findAll({ attributes: ['id', 'name'], where: { id: drafts.map((d) => d.screenId) }, raw: true }),
    resolveCompoundNames(drafts.flatMap((d) => d.waitingFor)),
  ]);
  const ownerName = new Map(owners.map((o) => [o.id, o.name]));
  const screenName = new Map(screens.map((s) => [s.id, s.name]));
  return drafts.map((d: WaitingDraft) => ({
    id: d.id,
    filename: d.filename,
    screenName: screenName.get(d.screenId) ?? '',
    ownerName: ownerName.get(d.ownerId) ?? '',
    ownedByActor: d.ownerId === actor.id,
    waitingSince: d.waitingSince.toISOString(),
    waitingFor: d.waitingFor,
    missing: d.waitingFor.filter((id) => !resolved.has(aliasText(id).toUpperCase())),
  }));
}

/** What the import wizard needs to resume a waiting draft: its sheets as inspect shows them, and the choices kept. */
export interface ResumedImport {
  draftId: string;
  screenId: string;
  filename: string;
  sheets: SheetInspection[];
  choice: WaitingChoice;
  /** The screen's remembered target words (file word → target), as inspect gives them. */
  targetAliases: Record<string, string>;
}

/** The actor's own waiting draft, to resume (reads only: the draft waits until it is stored or discarded). */
export async function resumeWaitingImport(actor: Actor, draftId: string): Promise<ResumedImport> {
  requireCapability(actor, 'importPlates');
  const draft = await readDraft(actor, draftId);
  const [waiting] = await listWaitingDrafts({ ownerId: actor.id, ids: [draft.id] });
  if (!waiting)
    throw new AppError('conflict', 'This import is not waiting for compounds; read the file again.');
  return {
    draftId: draft.id,
    screenId: draft.screenId,
    filename: draft.filename,
    sheets: inspectSheets(draft.sheets),
    choice: waitingChoiceSchema.parse(waiting.choice),
    targetAliases: await screenTargetAliases(draft.screenId),
  };
}

/** Removes the actor's own waiting draft, with its audit event. */
export async function discardWaitingImport(actor: Actor, draftId: string): Promise<void> {
  requireCapability(actor, 'importPlates');
  await db().transaction(async (transaction) => {
    const draft = await readDraft(actor, draftId, { transaction, content: false });
    if (!draft.waitingSince)
      throw new AppError('conflict', 'This import is not waiting for compounds; nothing was discarded.');
    await removeDraft(draft.id, transaction);
    await recordAudit(
      {
        actorId: actor.id,
        action: 'discard',
        entityType: 'import_draft',
        entityId: draft.id,
        before: { filename: draft.filename, screenId: draft.screenId },
        address: actor.address,
      },
      transaction,
    );
  });
}
