import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { z } from 'zod';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { auditFilterChoices, searchAudit } from '@/lib/audit/search';
import { requirePageRole } from '@/lib/auth/page-guard';
import { rolesFor } from '@/lib/domain/roles';
import { auditFilterSchema } from '@/lib/validation/audit';
import { AuditFilterForm, type FilterValues } from './audit-filter-form';
import { AuditGrid } from './audit-grid';

export const metadata: Metadata = { title: 'Audit trail' };

type SearchParams = Record<string, string | string[] | undefined>;
const FILTER_KEYS = ['entityType', 'entityId', 'userId', 'from', 'to'] as const;

function filterValues(params: SearchParams): FilterValues {
  const values: FilterValues = {};
  for (const key of FILTER_KEYS) {
    const raw = params[key];
    const value = Array.isArray(raw) ? raw[0] : raw;
    if (value) values[key] = value;
  }
  return values;
}

function pageHref(values: FilterValues, page: number): string {
  return `/audit?${new URLSearchParams({ ...values, page: String(page) })}`;
}

/** The download of every event the filter selects (all pages), as csv or xlsx. */
function exportHref(values: FilterValues, format: 'csv' | 'xlsx'): string {
  return `/api/audit/export?${new URLSearchParams({ ...values, format, ...(format === 'csv' ? { table: 'events' } : {}) })}`;
}

export default async function AuditPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const actor = await requirePageRole(...rolesFor('readAudit'));
  const params = await searchParams;
  const values = filterValues(params);
  const parsed = auditFilterSchema.safeParse(params);
  const [choices, result] = await Promise.all([
    auditFilterChoices(actor),
    parsed.success ? searchAudit(actor, params) : null,
  ]);
  const errors = parsed.success ? {} : z.flattenError(parsed.error).fieldErrors;
  const first = result ? (result.page - 1) * result.pageSize + 1 : 0;
  const last = result ? first + result.rows.length - 1 : 0;
  return (
    <>
      <PageHeader
        title="Audit trail"
        intro="Every change, sign-in and signature, as it happened. Nothing here can be edited or removed, not even by an administrator."
      />
      <AuditFilterForm
        values={values}
        errors={errors}
        entityTypes={choices.entityTypes}
        people={choices.people}
      />
      {!result ? (
        <p role="alert" className="text-sm font-medium text-signal-fail">
          Correct the filter to see events.
        </p>
      ) : result.total === 0 ? (
        <EmptyState title="No events match">Widen the time range or clear a filter.</EmptyState>
      ) : (
        <>
          <div className="mb-2 flex items-center justify-between text-sm text-ink-700">
            <p aria-live="polite">
              Events {first}–{last} of {result.total}, newest first
            </p>
            <p className="flex items-center gap-2">
              <span className="text-ink-500">Download all {result.total}:</span>
              <a className="gw-button-quiet py-1" href={exportHref(values, 'csv')} download>
                csv
              </a>
              <a className="gw-button-quiet py-1" href={exportHref(values, 'xlsx')} download>
                xlsx
              </a>
            </p>
            <nav aria-label="Pages of events" className="flex gap-2">
              {result.page > 1 ? (
                <AppLink href={pageHref(values, result.page - 1)} className="gw-button-quiet py-1">
                  Newer
                </AppLink>
              ) : null}
              {last < result.total ? (
                <AppLink href={pageHref(values, result.page + 1)} className="gw-button-quiet py-1">
                  Older
                </AppLink>
              ) : null}
            </nav>
          </div>
          <AuditGrid rows={result.rows} />
        </>
      )}
    </>
  );
}
