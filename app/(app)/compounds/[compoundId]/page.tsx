import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { notFound } from 'next/navigation';
import { BatchForm } from '@/components/compounds/batch-form';
import { CompoundForm } from '@/components/compounds/compound-form';
import { DataTable } from '@/components/ui/data-table';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { can } from '@/lib/auth/roles';
import { getCompound } from '@/lib/compounds/service';
import { isAppError } from '@/lib/errors';
import { parseId } from '@/lib/validation/ids';
import { addBatchAction, updateCompoundAction } from '../actions';

export const metadata: Metadata = { title: 'Compound' };

async function load(compoundId: string) {
  const actor = await requireActor();
  try {
    return { actor, compound: await getCompound(actor, parseId(compoundId, 'compound')) };
  } catch (error) {
    if (isAppError(error) && error.code === 'not_found') notFound();
    throw error;
  }
}

export default async function CompoundPage({ params }: { params: Promise<{ compoundId: string }> }) {
  const { actor, compound } = await load((await params).compoundId);
  const canEdit = can(actor, 'registerCompounds');
  return (
    <>
      <PageHeader
        title={compound.identifier}
        intro={compound.name || 'No name recorded.'}
        actions={
          <AppLink className="gw-button" href={`/compounds/${compound.id}/profile`}>
            Profile across plates
          </AppLink>
        }
      />
      <section className="gw-card p-5" aria-labelledby="identity-heading">
        <h2 id="identity-heading" className="mb-3 text-lg font-semibold">
          Identity
        </h2>
        {canEdit ? (
          <CompoundForm action={updateCompoundAction} compound={compound} submitLabel="Save changes" />
        ) : (
          <dl className="grid gap-3 text-sm sm:grid-cols-3">
            <div>
              <dt className="text-ink-500">SMILES</dt>
              <dd className="break-all font-mono">{compound.smiles || '—'}</dd>
            </div>
            <div>
              <dt className="text-ink-500">Molecular weight</dt>
              <dd>{compound.molecularWeight ?? '—'} g/mol</dd>
            </div>
          </dl>
        )}
      </section>
      <section className="mt-6 space-y-3" aria-labelledby="batches-heading">
        <h2 id="batches-heading" className="text-lg font-semibold">
          Batches
        </h2>
        {compound.batches.length ? (
          <DataTable
            caption="Batches"
            rows={compound.batches}
            rowKey={(b) => b.id}
            columns={[
              { header: 'Lot', cell: (b) => <span className="font-mono">{b.lot}</span> },
              { header: 'Purity (%)', cell: (b) => b.purity_percent ?? '—', align: 'right' },
              { header: 'Stock (mM)', cell: (b) => b.stockConcentration_mM ?? '—', align: 'right' },
              { header: 'Solvent', cell: (b) => b.solvent },
            ]}
          />
        ) : (
          <p className="text-sm text-ink-700">No batches registered yet.</p>
        )}
        {canEdit ? (
          <div className="gw-card p-5">
            <BatchForm action={addBatchAction} compoundId={compound.id} />
          </div>
        ) : null}
      </section>
    </>
  );
}
