import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { PlateFilters } from '@/components/plates/plate-filters';
import { PlatePager } from '@/components/plates/plate-pager';
import { PlateTable } from '@/components/plates/plate-table';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { listImporters, listPlatePage } from '@/lib/plates/list';
import { listScreens } from '@/lib/screens/list';
import { plateFilterSchema, platePageHref, platePageSchema } from '@/lib/validation/plate-filter';

export const metadata: Metadata = { title: 'Plates' };

export default async function PlatesPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const actor = await requireActor();
  const params = await searchParams;
  const filter = plateFilterSchema.parse(params);
  const [result, screens, importers] = await Promise.all([
    listPlatePage(
      actor,
      {
        ...(filter.state ? { state: [filter.state] } : {}),
        ...(filter.screen ? { screenId: filter.screen } : {}),
        ...(filter.importer ? { importedBy: filter.importer } : {}),
        ...(filter.from ? { from: filter.from } : {}),
        ...(filter.to ? { to: filter.to } : {}),
      },
      platePageSchema.parse(params.page),
    ),
    listScreens(actor),
    listImporters(actor),
  ]);
  const filtered = Object.values(filter).some(Boolean);
  return (
    <>
      <PageHeader
        title="Plates"
        intro="Every imported plate, newest first, with its sign-off state and QC failures."
      />
      <PlateFilters filter={filter} screens={screens} importers={importers} />
      {result.plates.length ? (
        <>
          <PlatePager result={result} pageHref={(page) => platePageHref(filter, page)} />
          <PlateTable plates={result.plates} caption="Plates" />
        </>
      ) : result.total ? (
        <EmptyState title="This page is past the last plate">
          <AppLink href={platePageHref(filter, 1)} className="underline">
            Go to the newest plates
          </AppLink>
          .
        </EmptyState>
      ) : filtered ? (
        <EmptyState title="No plate matches these filters">Widen the dates or clear the filters.</EmptyState>
      ) : (
        <EmptyState title="No plates yet">
          A biologist imports the instrument&apos;s export to create the first plate.
        </EmptyState>
      )}
    </>
  );
}
