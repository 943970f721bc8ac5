import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { auditFilterSuggestions } from '@/lib/audit/search';
import { rolesFor } from '@/lib/domain/roles';

export const dynamic = 'force-dynamic';

/**
 * What the audit filter suggests as a plate label or compound identifier is typed:
 * `?kind=plate|compound&q=text` answers `{ suggestions: string[] }` (at most 20); a bad query answers 422.
 * Admins and approvers.
 */
export const GET = withUser(
  async (request, actor) =>
    NextResponse.json({
      suggestions: await auditFilterSuggestions(actor, Object.fromEntries(request.nextUrl.searchParams)),
    }),
  { roles: rolesFor('readAudit') },
);
