import type { Metadata } from 'next';
import { PlateTable } from '@/components/plates/plate-table';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { listPlates, statesAwaiting } from '@/lib/plates/list';

export const metadata: Metadata = { title: 'My work' };

const WHAT_YOU_DO: Record<string, string> = {
  chemist: 'verify compound maps of imported plates',
  biologist: 'review and submit verified plates, and rework returned ones',
  approver: 'approve or return submitted plates',
  admin: 'manage users, screens and thresholds',
};

export default async function MyWorkPage() {
  const actor = await requireActor();
  const states = statesAwaiting(actor);
  const plates = states.length ? await listPlates(actor, { state: states }) : [];
  const duties = actor.roles.map((role) => WHAT_YOU_DO[role]).filter(Boolean).join('; ');
  return (
    <>
      <PageHeader title={`My work`} intro={`Signed in as ${actor.name}. You ${duties || 'can read results'}.`} />
      {plates.length ? (
        <PlateTable plates={plates} caption="Plates waiting for your action" />
      ) : (
        <EmptyState title="Nothing is waiting for you">
          Plates appear here when they reach a step that needs your role. The Plates page lists every plate.
        </EmptyState>
      )}
    </>
  );
}
