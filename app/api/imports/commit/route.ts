import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { readUpload } from '@/lib/api/upload';
import { rolesFor } from '@/lib/domain/roles';
import { awaitImport, queueImport } from '@/lib/plates/import-jobs';
import { commitFieldsSchema } from '@/lib/validation/imports';

/**
 * Queues the upload as an import job and waits for a worker to store the plate with its wells,
 * readouts, QC and fits in one transaction: 201 with the plate id, the import's refusal with its
 * reasons, or 202 when a worker is still storing it when the wait ends (lib/plates/import-jobs.ts).
 */
export const POST = withUser(async (request, actor) => {
  const { fields, ...file } = await readUpload(request, commitFieldsSchema);
  const { format, ...rest } = fields;
  const jobId = await queueImport(actor, { ...rest, ...file, ...(format ? { format } : {}) });
  const result = await awaitImport(jobId);
  if (result.state === 'storing') {
    return NextResponse.json(
      { jobId, href: '/plates', message: 'A worker is still storing this plate; it appears in the plate list when it is done.' },
      { status: 202 },
    );
  }
  return NextResponse.json({ plateId: result.plateId, href: `/plates/${result.plateId}` }, { status: 201 });
}, { roles: rolesFor('importPlates') });
