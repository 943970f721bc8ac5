import { NextResponse } from 'next/server';
import { z } from 'zod';
import { withUser } from '@/lib/api/handler';
import { rolesFor } from '@/lib/domain/roles';
import { AppError } from '@/lib/errors';
import { listTemplates, saveTemplate } from '@/lib/plates/templates';

/** Saved column mappings, by name. */
export const GET = withUser(async (_request, actor) =>
  NextResponse.json({ templates: await listTemplates(actor) }),
);

const saveSchema = z.object({
  name: z.string(),
  mapping: z.unknown(),
  /** The header row of the file's well sheet, for the template's fingerprint. */
  headers: z.array(z.string().max(200)).max(500).nullable().default(null),
});

/** Saves a template by name (replacing the mapping of one of that name); answers the template. */
export const POST = withUser(
  async (request, actor) => {
    const body: unknown = await request.json().catch(() => {
      throw new AppError('invalid', 'Send the template as JSON: {"name", "mapping", "headers"}.');
    });
    const input = saveSchema.parse(body);
    const template = await saveTemplate(actor, {
      name: input.name,
      mapping: input.mapping as never,
      headerCells: input.headers,
    });
    return NextResponse.json({ template }, { status: 201 });
  },
  { roles: rolesFor('importPlates') },
);
