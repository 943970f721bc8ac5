import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { z } from 'zod';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Pager } from '@/components/ui/pager';
import { auditFilterChoices, auditFilterSchemaHere, auditTimeZone, searchAudit } from '@/lib/audit/search';
import { requirePageRole } from '@/lib/auth/page-guard';
import { rolesFor } from '@/lib/domain/roles';
import { AUDIT_FILTER_KEYS } from '@/lib/validation/audit';
import { AuditFilterForm, type FilterValues } from './audit-filter-form';
import { AuditGrid } from './audit-grid';
import { DownloadButton } from '@/components/exports/download-button';

export const metadata: Metadata = { title: 'Audit trail' };

type SearchParams = Record<string, string | string[] | undefined>;

function filterValues(params: SearchParams): FilterValues {
  const values: FilterValues = {};
  for (const key of AUDIT_FILTER_KEYS) {
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
  const timeZone = auditTimeZone();
  // The search parameters are parsed by zod (searchAudit parses them again at its own boundary).
  const parsed = auditFilterSchemaHere().safeParse(params);
  const [choices, result] = await Promise.all([
    auditFilterChoices(actor),
    parsed.success ? searchAudit(actor, params) : null,
  ]);
  const errors = parsed.success ? {} : z.flattenError(parsed.error).fieldErrors;
  const first = result ? (result.page - 1) * result.pageSize + 1 : 0;
  const last = result ? first + result.rows.length - 1 : 0;
  const pages = result ? Math.max(1, Math.ceil(result.total / result.pageSize)) : 0;
  return (
    <>
      <PageHeader
        title="Audit trail"
        intro={`Every change, sign-in and signature, as it happened. Nothing here can be edited or removed, not even by an administrator. Times are in ${timeZone}.`}
      />
      <AuditFilterForm values={values} errors={errors} timeZone={timeZone} choices={choices} />
      {values.entityId ? (
        <p className="mb-3 text-sm text-ink-700">
          Showing the events of one record only.{' '}
          <AppLink
            href={`/audit?${new URLSearchParams(Object.entries(values).filter(([key]) => key !== 'entityId'))}`}
          >
            Show every record
          </AppLink>
        </p>
      ) : null}
      {!result ? (
        <p role="alert" className="text-sm font-medium text-signal-fail">
          Correct the filter to see events.
        </p>
      ) : result.total === 0 ? (
        <EmptyState title="No events match">Widen the time range or clear a filter.</EmptyState>
      ) : result.rows.length === 0 ? (
        <EmptyState title={`There is no page ${result.page}`}>
          These filters give {result.total} events on {pages} {pages === 1 ? 'page' : 'pages'}.{' '}
          <AppLink href={pageHref(values, pages)}>Go to the last page</AppLink>
        </EmptyState>
      ) : (
        <>
          <Pager
            label="Pages of events"
            page={result.page}
            hasOlder={last < result.total}
            pageHref={(page) => pageHref(values, page)}
            between={
              <p className="flex items-center gap-2">
                <span className="text-ink-500">Download all {result.total}:</span>
                <DownloadButton className="gw-button-quiet py-1" href={exportHref(values, 'csv')}>
                  csv
                </DownloadButton>
                <DownloadButton className="gw-button-quiet py-1" href={exportHref(values, 'xlsx')}>
                  xlsx
                </DownloadButton>
              </p>
            }
          >
            Events {first}–{last} of {result.total}, newest first (page {result.page} of {pages})
          </Pager>
          <AuditGrid rows={result.rows} names={result.names} timeZone={result.timeZone} />
        </>
      )}
    </>
  );
}
