import { NextResponse } from 'next/server';
import { errorResponse, withUser } from '@/lib/api/handler';
import { readForm, uploadedFile } from '@/lib/api/upload';
import { AppError } from '@/lib/errors';
import { rolesFor } from '@/lib/domain/roles';
import { awaitImport, queueImport, type ImportResult, type ImportStage } from '@/lib/plates/import-jobs';
import type { CommitRequest } from '@/lib/plates/import-service';
import { commitFieldsSchema, commitFileFieldsSchema } from '@/lib/validation/imports';

/** The answer once the import job has ended (or is still being stored when the wait ends). */
function outcome(jobId: string, result: ImportResult): NextResponse {
  if (result.state === 'storing') {
    return NextResponse.json(
      {
        jobId,
        href: '/plates',
        message: 'A worker is still storing this plate; it appears in the plate list when it is done.',
      },
      { status: 202 },
    );
  }
  // Every plate the file held (one, or a plate per sheet or plate-column value); plateId is the first.
  const plates = result.plates.map((p) => ({ ...p, href: `/plates/${p.plateId}` }));
  return NextResponse.json(
    { plateId: result.plateId, href: `/plates/${result.plateId}`, plates },
    { status: 201 },
  );
}

/**
 * The wait told as it goes, for a browser that asks with `Accept: application/x-ndjson`: one JSON line per
 * stage the import job reaches (`{"stage":"queued"|"reading"|"checking"|"storing"}`), then the answer the
 * plain request would have had as `{"status":…,"body":…}`. The answer's own status is 200 once streaming.
 */
function streamedWait(jobId: string): Response {
  const encoder = new TextEncoder();
  const body = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (line: unknown) => controller.enqueue(encoder.encode(`${JSON.stringify(line)}\n`));
      let answer: NextResponse;
      try {
        answer = outcome(jobId, await awaitImport(jobId, {}, (stage: ImportStage) => send({ stage })));
      } catch (error) {
        answer = errorResponse(error);
      }
      send({ status: answer.status, body: await answer.json() });
      controller.close();
    },
  });
  return new Response(body, {
    status: 200,
    headers: { 'content-type': 'application/x-ndjson; charset=utf-8', 'cache-control': 'no-store' },
  });
}

/**
 * Queues the commit of an import draft (or of a file sent with it, for scripts) as an import job and
 * waits for a worker to store the plate with its wells, readouts, QC and fits in one transaction: 201
 * with the plate id, the import's refusal with its reasons, or 202 when a worker is still storing it
 * when the wait ends (lib/plates/import-jobs.ts); asked for it, the stages of the wait first (streamedWait).
 */
export const POST = withUser(
  async (request, actor) => {
    const form = await readForm(request);
    let commit: CommitRequest;
    if (form.file) {
      if (form.fields.draftId)
        throw new AppError('invalid', 'Send either the draftId that inspect answered or the file, not both.');
      const { format, ...rest } = commitFileFieldsSchema.parse(form.fields);
      commit = { ...rest, ...(await uploadedFile(form.file)), ...(format ? { format } : {}) };
    } else {
      const { format, ...rest } = commitFieldsSchema.parse(form.fields);
      commit = { ...rest, ...(format ? { format } : {}) };
    }
    const jobId = await queueImport(actor, commit);
    if (request.headers.get('accept')?.includes('application/x-ndjson')) return streamedWait(jobId);
    return outcome(jobId, await awaitImport(jobId));
  },
  { roles: rolesFor('importPlates') },
);
