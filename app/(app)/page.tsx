import type { Metadata } from 'next';
import { WaitingImports } from '@/components/imports/waiting-imports';
import { PlatePager } from '@/components/plates/plate-pager';
import { PlateTable } from '@/components/plates/plate-table';
import { AppLink } from '@/components/ui/app-link';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { can } from '@/lib/auth/roles';
import { listWaitingImports } from '@/lib/compounds/waiting-imports';
import { listPlatePage } from '@/lib/plates/list';
import { plateSignoffPath } from '@/lib/signoff/notices';
import { myWorkPageHref, platePageSchema } from '@/lib/validation/plate-filter';

export const metadata: Metadata = { title: 'My work' };

const WHAT_YOU_DO: Record<string, string> = {
  chemist: 'verify compound maps of imported plates',
  biologist: 'review and submit verified plates, and rework returned ones',
  approver: 'approve or return submitted plates',
  admin: 'manage users, screens and thresholds',
};

export default async function MyWorkPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const actor = await requireActor();
  // Plates in a state this person signs next, less those segregation of duties keeps from them, a page at a time.
  const result = await listPlatePage(
    actor,
    { waitingFor: actor },
    platePageSchema.parse((await searchParams).page),
  );
  // Imports waiting for compounds: the person's own, and every one for those who may register compounds.
  const waiting = await listWaitingImports(actor);
  const duties = actor.roles
    .map((role) => WHAT_YOU_DO[role])
    .filter(Boolean)
    .join('; ');
  return (
    <>
      <PageHeader
        title="My work"
        intro={`Signed in as ${actor.name}. You ${duties || 'can read results'}.`}
      />
      {waiting.length ? (
        <section className="gw-card mb-6 p-5" aria-labelledby="waiting-imports-heading">
          <h2 id="waiting-imports-heading" className="mb-3 text-lg font-semibold">
            Imports waiting for compounds
          </h2>
          <WaitingImports items={waiting} canRegister={can(actor, 'registerCompounds')} />
        </section>
      ) : null}
      {result.plates.length ? (
        <>
          <PlatePager result={result} pageHref={myWorkPageHref} />
          <PlateTable
            plates={result.plates}
            caption="Plates waiting for your action"
            linkTo={(p) => plateSignoffPath(p.id)}
          />
        </>
      ) : result.total ? (
        <EmptyState title="This page is past the last plate waiting for you">
          <AppLink href={myWorkPageHref(1)} className="underline">
            Go to the first page
          </AppLink>
          .
        </EmptyState>
      ) : (
        <EmptyState title="Nothing is waiting for you">
          Plates appear here when they reach a step that needs your role. The Plates page lists every plate.
        </EmptyState>
      )}
    </>
  );
}
