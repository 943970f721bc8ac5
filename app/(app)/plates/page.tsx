import type { Metadata } from 'next';
import { PlateFilters } from '@/components/plates/plate-filters';
import { PlateTable } from '@/components/plates/plate-table';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { listImporters, listPlates } from '@/lib/plates/list';
import { listScreens } from '@/lib/screens/list';
import { plateFilterSchema } from '@/lib/validation/plate-filter';

export const metadata: Metadata = { title: 'Plates' };

export default async function PlatesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await requireActor();
  const filter = plateFilterSchema.parse(await searchParams);
  const [plates, screens, importers] = await Promise.all([
    listPlates(actor, {
      ...(filter.state ? { state: [filter.state] } : {}), ...(filter.screen ? { screenId: filter.screen } : {}),
      ...(filter.importer ? { importedBy: filter.importer } : {}), ...(filter.from ? { from: filter.from } : {}), ...(filter.to ? { to: filter.to } : {}),
    }),
    listScreens(actor),
    listImporters(actor),
  ]);
  const filtered = Object.values(filter).some(Boolean);
  return (
    <>
      <PageHeader title="Plates" intro="Every imported plate, newest first, with its sign-off state and QC failures." />
      <PlateFilters filter={filter} screens={screens} importers={importers} />
      {plates.length ? (
        <PlateTable plates={plates} caption="Plates" />
      ) : filtered ? (
        <EmptyState title="No plate matches these filters">Widen the dates or clear the filters.</EmptyState>
      ) : (
        <EmptyState title="No plates yet">A biologist imports the instrument&apos;s export to create the first plate.</EmptyState>
      )}
    </>
  );
}
