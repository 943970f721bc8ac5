import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { rolesFor } from '@/lib/domain/roles';
import { deleteTemplate } from '@/lib/plates/templates';
import { parseId } from '@/lib/validation/ids';

/** Deletes a saved template; plates imported with it keep their data. */
export const DELETE = withUser<{ templateId: string }>(
  async (_request, actor, { params }) => {
    await deleteTemplate(actor, parseId((await params).templateId, 'template'));
    return new NextResponse(null, { status: 204 });
  },
  { roles: rolesFor('importPlates') },
);
