import 'server-only';
import { setTimeout as sleep } from 'node:timers/promises';
import type { Transaction } from 'sequelize';
import type { z } from 'zod';
import { loadActor } from '@/lib/auth/load-actor';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import {
  isDatabaseUnavailable,
  isStorageFull,
  STORAGE_FULL_MESSAGE,
  untilDatabaseAnswers,
} from '@/lib/database-unavailable';
import { db } from '@/lib/db';
import { AppError, ERROR_STATUS, type ErrorCode } from '@/lib/errors';
import type { JobContext } from '@/lib/jobs/job-types';
import type { PlateImportPayload } from '@/lib/jobs/payloads';
import { cancelJob, enqueueJob } from '@/lib/jobs/queue';
import {
  storedDraftCommitSchema,
  storedImportRequestSchema,
  type StoredDraftCommit,
  type StoredImportRequest,
} from '@/lib/validation/imports';
import { ComputeJob, ImportUpload, Plate } from '@/models';
import { commitImport, type CommitRequest, type StoredPlate } from './import-service';
import { readDraft, removeExpiredDrafts } from './import-drafts';
import { importJobKey, removeUploadNoWorkerHolds, removeUploadsOfEndedJobs } from './import-queries';

/**
 * Imports as jobs. The web server keeps the commit (import_uploads) and queues a plate-import job in one
 * transaction, then waits for it; a worker process (scripts/worker.ts, at a lower CPU priority, on any
 * machine) checks and stores the plate, removing the upload in the same transaction. A commit names the
 * import draft inspect kept (its sheets were parsed once, at inspect) or, from scripts, sends the file,
 * which the worker then reads once. Checking and storing a plate is most of an import's CPU, and it does
 * not run in the processes that serve pages. The person sees the same answer as before: the new plate,
 * or the refusal with its reasons.
 */

/**
 * The stages of an import a worker has taken, in order; the job's progress counts them (done = the stage's
 * number, total = 3), so that the request waiting for it can say which one it is in.
 */
export const IMPORT_STAGES = ['reading', 'checking', 'storing'] as const;
/** Where an import stands while a request waits for it: queued for a worker, or one of IMPORT_STAGES. */
export type ImportStage = 'queued' | (typeof IMPORT_STAGES)[number];

/** How long a request waits for a worker to take its import before withdrawing it. */
export const IMPORT_QUEUE_WAIT_MS = 60_000;
/** How long it then waits for an import a worker is storing (the job's own limit is 120 s). */
export const IMPORT_RUN_WAIT_MS = 60_000;

/**
 * Keeps the commit and queues its job, in one transaction; returns the job's id. A draft is checked first
 * (the actor's, unused, not expired), so that a refusal comes at once and nothing is queued.
 */
export async function queueImport(actor: Actor, request: CommitRequest): Promise<string> {
  requireCapability(actor, 'importPlates');
  if ('draftId' in request) {
    await readDraft(actor, request.draftId, { content: false });
    const { draftId, ...fields } = request;
    const stored: StoredDraftCommit = fields;
    return keepAndQueue(actor, { request: { ...stored }, bytes: null, draftId });
  }
  const { bytes, parsed: _parsed, ...fields } = request;
  const stored: StoredImportRequest = fields;
  return keepAndQueue(actor, {
    request: { ...stored },
    bytes: Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength),
    draftId: null,
  });
}

async function keepAndQueue(
  actor: Actor,
  commit: { request: Record<string, unknown>; bytes: Buffer | null; draftId: string | null },
): Promise<string> {
  return db().transaction(async (transaction) => {
    const upload = await ImportUpload.create(
      { requestedBy: actor.id, address: actor.address, ...commit },
      { transaction },
    );
    const job = await enqueueJob(
      {
        kind: 'plate-import',
        key: importJobKey(upload.id),
        data: { uploadId: upload.id },
        requestedBy: actor.id,
      },
      transaction,
    );
    return job.id;
  });
}

/**
 * How many times a worker stores a queued import whose database went away under it (a restart, a
 * failover): the transaction was rolled back with everything in it and the upload is still queued, so
 * storing it again once the database answers is safe and stores it once.
 */
export const IMPORT_DATABASE_ATTEMPTS = 3;
/** How long a worker waits for the database to answer again before the next attempt. */
const DATABASE_BACK_WITHIN_MS = 60_000;

/**
 * The plate-import job's handler (lib/jobs/registry.ts): reads the queued commit under its row lock,
 * takes the draft's sheets (or reads the sent file once), checks and stores the plate, consumes the draft
 * and removes the upload in one transaction; the plate's id goes on the job. When the database goes away
 * in the middle, it waits for it to come back and stores the same upload again (IMPORT_DATABASE_ATTEMPTS).
 */
export async function runQueuedImport(
  payload: PlateImportPayload,
  job: Pick<JobContext, 'id'> & Partial<Pick<JobContext, 'progress'>>,
): Promise<string> {
  // Written beside the transaction (the job's row is not locked until the end): a lost report loses nothing.
  const stage = (name: (typeof IMPORT_STAGES)[number]) =>
    job.progress?.(IMPORT_STAGES.indexOf(name) + 1, IMPORT_STAGES.length).catch(() => undefined);
  for (let attempt = 1; ; attempt++) {
    await stage('reading');
    try {
      return await storeQueuedImport(payload, job.id, attempt, stage);
    } catch (error) {
      if (isDatabaseUnavailable(error) && attempt < IMPORT_DATABASE_ATTEMPTS) {
        // The commit may have reached the database just before the connection broke: then the job's row says so.
        const row = await untilDatabaseAnswers(() => ComputeJob.findByPk(job.id), DATABASE_BACK_WITHIN_MS);
        if (row?.state === 'done') return row.message ?? 'Stored.';
        continue;
      }
      if (!isDatabaseUnavailable(error)) await removeUpload(payload.uploadId).catch(() => undefined);
      // Told to the person waiting as it is (refusal below), not as a failure on the worker.
      if (isStorageFull(error)) throw new AppError('storage_full', STORAGE_FULL_MESSAGE);
      throw error;
    }
  }
}

/** One attempt at storing the queued commit, in one transaction; the message the job ends with. */
async function storeQueuedImport(
  payload: PlateImportPayload,
  jobId: string,
  attempt: number,
  stage: (name: (typeof IMPORT_STAGES)[number]) => Promise<void> | undefined,
): Promise<string> {
  return db().transaction(async (transaction) => {
    const upload = await ImportUpload.findByPk(payload.uploadId, {
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!upload)
      throw new AppError('conflict', 'The import was withdrawn before a worker took it; nothing was stored.');
    const request = storedCommit(upload);
    const actor = await loadActor(upload.requestedBy, upload.address ?? '');
    if (!actor)
      throw new AppError(
        'forbidden',
        'The account that uploaded this file is no longer active; nothing was stored.',
      );
    const { plateId, plates } = await commitImport(actor, request, {
      transaction,
      onStage: async (name) => void (await stage(name)),
    });
    const stored =
      plates.length === 1
        ? `Stored as plate ${plates[0]!.label}.`
        : `Stored as ${plates.length} plates: ${plates.map((p) => p.label).join(', ')}.`;
    const message =
      attempt === 1
        ? stored
        : `${stored} The database went away during attempt ${attempt - 1}, so it was stored on the next attempt.`;
    await removeUpload(payload.uploadId, transaction);
    // Done in the same transaction as the plate, so that a worker stopping right after the commit leaves no doubt.
    await ComputeJob.update(
      { state: 'done', plateId, plateIds: plates.map((p) => p.plateId), finishedAt: new Date(), message },
      { where: { id: jobId }, transaction },
    );
    return message;
  });
}

/** The queued commit, checked: one that fails ends the job as refused, with nothing stored. */
function storedCommit(upload: ImportUpload): CommitRequest {
  if (upload.draftId) return { ...checked(storedDraftCommitSchema, upload.request), draftId: upload.draftId };
  if (!upload.bytes)
    throw new AppError(
      'invalid',
      'The queued import holds neither a file nor a draft; nothing was stored. Upload the file again.',
    );
  const bytes = new Uint8Array(upload.bytes.buffer, upload.bytes.byteOffset, upload.bytes.byteLength);
  return { ...checked(storedImportRequestSchema, upload.request), bytes };
}

function checked<Schema extends z.ZodType>(schema: Schema, request: unknown): z.output<Schema> {
  const parsed = schema.safeParse(request);
  if (!parsed.success)
    throw new AppError(
      'invalid',
      'The stored import request is not valid; nothing was stored. Upload the file again.',
      { issues: parsed.error.issues },
    );
  return parsed.data;
}

async function removeUpload(uploadId: string, transaction?: Transaction): Promise<void> {
  db();
  await ImportUpload.destroy({ where: { id: uploadId }, ...(transaction ? { transaction } : {}) });
}

/**
 * The plate-import sweep (lib/jobs/registry.ts): removes uploads whose job has ended and import drafts past
 * their expiry; queues nothing again.
 */
export async function sweepImports(): Promise<number> {
  await removeUploadsOfEndedJobs();
  await removeExpiredDrafts();
  return 0;
}

/**
 * Withdraws an upload no worker has taken yet: true when it was removed here (its job then ends
 * without storing anything), false when a worker holds it (the import goes on) or it is gone.
 */
async function withdraw(job: ComputeJob, waitedMs: number): Promise<boolean> {
  const uploadId = job.jobKey.slice(importJobKey('').length);
  if (!(await removeUploadNoWorkerHolds(uploadId))) return false;
  const message = `No worker took the import within ${waitedMs / 1000} s; it was withdrawn and nothing was stored.`;
  await ComputeJob.update(
    { state: 'failed', finishedAt: new Date(), message },
    { where: { id: job.id, state: ['queued', 'running'] } },
  );
  await cancelJob('plate-import', job.id).catch(() => undefined);
  return true;
}

export type ImportResult =
  { state: 'stored'; plateId: string; plates: StoredPlate[] } | { state: 'storing'; jobId: string };

/** The plates an import job stored, in the order stored, with their labels. */
async function storedPlates(job: ComputeJob): Promise<StoredPlate[]> {
  const ids = job.plateIds?.length ? job.plateIds : [job.plateId!];
  const rows = await Plate.findAll({ where: { id: ids }, attributes: ['id', 'label'], raw: true });
  const label = new Map(rows.map((r) => [r.id, r.label]));
  return ids.map((plateId) => ({ plateId, label: label.get(plateId) ?? '' }));
}

/** Reads the job's row; a lost database during the wait is tried again until the deadline. */
async function readJob(jobId: string, deadline: number): Promise<ComputeJob> {
  for (;;) {
    try {
      return await ComputeJob.findByPk(jobId, { rejectOnEmpty: true });
    } catch (error) {
      if (!isDatabaseUnavailable(error) || Date.now() >= deadline) throw error;
      await sleep(500);
    }
  }
}

/**
 * Waits for the import job: the stored plate, the refusal as the AppError the import raised, or,
 * when no worker took it in time, a 503 after withdrawing it (nothing stored). An import a worker is
 * still storing when the wait ends is reported as under way ("storing").
 */
export async function awaitImport(
  jobId: string,
  waits: { queuedMs?: number; runningMs?: number } = {},
  onStage?: (stage: ImportStage) => void,
): Promise<ImportResult> {
  db();
  let told: ImportStage | null = null;
  const tell = (job: ComputeJob) => {
    const stage: ImportStage | null =
      job.state === 'queued'
        ? 'queued'
        : job.state === 'running'
          ? (IMPORT_STAGES[Math.max(0, Math.min(job.done, IMPORT_STAGES.length) - 1)] ?? 'reading')
          : null;
    if (stage !== null && stage !== told && onStage) onStage((told = stage));
  };
  const queuedMs = waits.queuedMs ?? IMPORT_QUEUE_WAIT_MS;
  const started = Date.now();
  let runningSince: number | null = null;
  for (let delay = 20; ; delay = Math.min(delay * 2, 200)) {
    const deadline =
      runningSince === null ? started + queuedMs : runningSince + (waits.runningMs ?? IMPORT_RUN_WAIT_MS);
    const job = await readJob(jobId, deadline);
    tell(job);
    if (job.state === 'done' && job.plateId)
      return { state: 'stored', plateId: job.plateId, plates: await storedPlates(job) };
    if (job.state === 'failed' || job.state === 'done') throw refusal(job);
    if (job.state === 'running') runningSince ??= Date.now();
    if (Date.now() >= deadline) {
      if (runningSince === null && (await withdraw(job, queuedMs))) {
        throw new AppError(
          'unavailable',
          `No worker took the import within ${queuedMs / 1000} s, so nothing was changed. Try again in a minute.`,
        );
      }
      if (runningSince !== null) return { state: 'storing', jobId };
      runningSince = Date.now(); // a worker took it at the last moment: wait for it to finish
    }
    await sleep(delay);
  }
}

/** The refusal a failed import job left, as the AppError it was (code, message, details). */
function refusal(job: ComputeJob): AppError {
  const code = job.outcome?.code;
  if (code && code in ERROR_STATUS)
    return new AppError(
      code as ErrorCode,
      job.message ?? 'The import was refused.',
      job.outcome?.details ?? undefined,
    );
  return new AppError(
    'unavailable',
    'The import failed on the worker, so nothing was changed. Try again in a minute.',
  );
}
