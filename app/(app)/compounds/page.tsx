import type { Metadata } from 'next';
import { BulkRegister } from '@/components/compounds/bulk-register';
import { CompoundForm } from '@/components/compounds/compound-form';
import { CompoundGrid } from '@/components/compounds/compound-grid';
import { WaitingImports } from '@/components/imports/waiting-imports';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { can } from '@/lib/auth/roles';
import { listCompounds } from '@/lib/compounds/list';
import { listWaitingImports } from '@/lib/compounds/waiting-imports';
import { createCompoundAction } from './actions';

export const metadata: Metadata = { title: 'Compounds' };

export default async function CompoundsPage() {
  const actor = await requireActor();
  const compounds = await listCompounds(actor);
  const canRegister = can(actor, 'registerCompounds');
  const waiting = canRegister ? await listWaitingImports(actor) : [];
  return (
    <>
      <PageHeader title="Compounds" intro="The registry of compounds and batches that plates refer to." />
      {waiting.length ? (
        <section id="waiting-imports" className="gw-card mb-6 p-5" aria-labelledby="waiting-imports-heading">
          <h2 id="waiting-imports-heading" className="mb-3 text-lg font-semibold">
            Imports waiting for compounds
          </h2>
          <WaitingImports items={waiting} canRegister />
        </section>
      ) : null}
      {compounds.length ? (
        <CompoundGrid compounds={compounds} />
      ) : (
        <EmptyState title="No compounds registered">
          A chemist registers compounds before their plates are imported.
        </EmptyState>
      )}
      {canRegister ? (
        <section className="gw-card mt-6 p-5" aria-labelledby="register-heading">
          <h2 id="register-heading" className="mb-3 text-lg font-semibold">
            Register a compound
          </h2>
          <CompoundForm action={createCompoundAction} submitLabel="Register compound" />
        </section>
      ) : null}
      {canRegister ? (
        <section className="gw-card mt-6 p-5" aria-labelledby="bulk-heading">
          <h2 id="bulk-heading" className="mb-3 text-lg font-semibold">
            Register many from a spreadsheet
          </h2>
          <BulkRegister />
        </section>
      ) : null}
    </>
  );
}
