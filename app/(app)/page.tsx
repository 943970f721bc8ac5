import type { Metadata } from 'next';
import { PlateTable } from '@/components/plates/plate-table';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { listPlates } from '@/lib/plates/list';
import { plateSignoffPath } from '@/lib/signoff/notices';

export const metadata: Metadata = { title: 'My work' };

const WHAT_YOU_DO: Record<string, string> = {
  chemist: 'verify compound maps of imported plates',
  biologist: 'review and submit verified plates, and rework returned ones',
  approver: 'approve or return submitted plates',
  admin: 'manage users, screens and thresholds',
};

export default async function MyWorkPage() {
  const actor = await requireActor();
  // Plates in a state this person signs next, less those segregation of duties keeps from them.
  const plates = await listPlates(actor, { waitingFor: actor });
  const duties = actor.roles.map((role) => WHAT_YOU_DO[role]).filter(Boolean).join('; ');
  return (
    <>
      <PageHeader title={`My work`} intro={`Signed in as ${actor.name}. You ${duties || 'can read results'}.`} />
      {plates.length ? (
        <PlateTable plates={plates} caption="Plates waiting for your action" linkTo={(p) => plateSignoffPath(p.id)} />
      ) : (
        <EmptyState title="Nothing is waiting for you">
          Plates appear here when they reach a step that needs your role. The Plates page lists every plate.
        </EmptyState>
      )}
    </>
  );
}
