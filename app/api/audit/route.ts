import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { searchAudit } from '@/lib/audit/search';
import { rolesFor } from '@/lib/domain/roles';

export const dynamic = 'force-dynamic';

/**
 * One page of the audit trail as JSON, filtered by the query string (entityType, entityId, userId,
 * from, to, page); a bad filter answers 422 with messages keyed by field. Admins and approvers.
 */
export const GET = withUser(
  async (request, actor) =>
    NextResponse.json(await searchAudit(actor, Object.fromEntries(request.nextUrl.searchParams))),
  { roles: rolesFor('readAudit') },
);
