import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { readForm, uploadedFile } from '@/lib/api/upload';
import { AppError } from '@/lib/errors';
import { rolesFor } from '@/lib/domain/roles';
import { awaitImport, queueImport } from '@/lib/plates/import-jobs';
import type { CommitRequest } from '@/lib/plates/import-service';
import { commitFieldsSchema, commitFileFieldsSchema } from '@/lib/validation/imports';

/**
 * Queues the commit of an import draft (or of a file sent with it, for scripts) as an import job and
 * waits for a worker to store the plate with its wells, readouts, QC and fits in one transaction: 201
 * with the plate id, the import's refusal with its reasons, or 202 when a worker is still storing it
 * when the wait ends (lib/plates/import-jobs.ts).
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
    const result = await awaitImport(jobId);
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
    return NextResponse.json({ plateId: result.plateId, href: `/plates/${result.plateId}` }, { status: 201 });
  },
  { roles: rolesFor('importPlates') },
);
