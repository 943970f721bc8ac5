import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { readUpload } from '@/lib/api/upload';
import { rolesFor } from '@/lib/domain/roles';
import { withImportSlot } from '@/lib/imports/import-slots';
import { importOnce } from '@/lib/plates/import-once';
import { importOnceFieldsSchema } from '@/lib/validation/imports';

/**
 * Imports a plate in one request, for scripts: the file, the screen (name or id), optionally a template
 * (name or id; else the one the file's header fingerprint shows, else the guessed mapping) and a label
 * (else the file's barcode, else its name). Reads the file once, checks it, and, when the check finds no
 * error, queues its commit for a worker and waits: 201 with the plate id, every plate of the file
 * (`plates`: a file may hold a plate per sheet or a plate column) and what the check found, 202
 * when a worker is still storing it, or the refusal (422 with `details.facts` and the problems).
 */
export const POST = withUser(
  async (request, actor) => {
    const { fields, ...file } = await readUpload(request, importOnceFieldsSchema);
    const result = await importOnce(
      actor,
      { screen: fields.screen, template: fields.template, label: fields.label, file },
      { via: 'job', slot: withImportSlot },
    );
    if (result.state === 'storing')
      return NextResponse.json(
        {
          jobId: result.jobId,
          href: '/plates',
          message: 'A worker is still storing this plate; it appears in the plate list when it is done.',
          facts: result.facts,
        },
        { status: 202 },
      );
    // Every plate of the file with what the check found of it; plateId and href are the first plate's.
    const plates = result.plates.map((plate, i) => ({
      ...plate,
      href: `/plates/${plate.plateId}`,
      facts: result.facts.plates[i] ?? null,
    }));
    return NextResponse.json(
      { plateId: result.plateId, href: `/plates/${result.plateId}`, plates, facts: result.facts },
      { status: 201 },
    );
  },
  { roles: rolesFor('importPlates') },
);
