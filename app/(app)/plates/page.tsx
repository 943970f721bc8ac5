import type { Metadata } from 'next';
import { PlateTable } from '@/components/plates/plate-table';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { listPlates } from '@/lib/plates/list';

export const metadata: Metadata = { title: 'Plates' };

export default async function PlatesPage() {
  const actor = await requireActor();
  const plates = await listPlates(actor);
  return (
    <>
      <PageHeader title="Plates" intro="Every imported plate, newest first, with its sign-off state and QC failures." />
      {plates.length ? (
        <PlateTable plates={plates} caption="All plates" />
      ) : (
        <EmptyState title="No plates yet">A biologist imports the instrument&apos;s export to create the first plate.</EmptyState>
      )}
    </>
  );
}
