import { withUser } from '@/lib/api/handler';
import { rolesFor } from '@/lib/domain/roles';
import { auditExport } from '@/lib/exports/audit-export';
import { auditedExportResponse } from '@/lib/exports/respond';
import { auditExportQuerySchema } from '@/lib/validation/exports';

export const dynamic = 'force-dynamic';

/**
 * The audit trail the query's filter selects (entityType, entityId, userId, from, to; every page) as an
 * xlsx workbook, or with format=csv&table=events as csv. Admins and approvers. The export is itself an
 * audit event (with its filter), written after the file's events were read.
 */
export const GET = withUser(
  async (request, actor) => {
    const { format, table, ...filter } = Object.fromEntries(request.nextUrl.searchParams);
    const query = auditExportQuerySchema.parse({ format, table });
    const document = await auditExport(actor, filter);
    return auditedExportResponse(
      actor,
      document,
      query,
      `gatewell-audit-trail-${new Date().toISOString().slice(0, 10)}`,
      {
        entityType: 'audit_trail',
        entityId: null,
        details: { filter: document.about.find(([key]) => key === 'Filter')?.[1] ?? null },
      },
    );
  },
  { roles: rolesFor('readAudit') },
);
