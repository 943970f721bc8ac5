import type { Metadata } from 'next';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { listCompounds } from '@/lib/compounds/list';

export const metadata: Metadata = { title: 'Compounds' };

export default async function CompoundsPage() {
  const actor = await requireActor();
  const compounds = await listCompounds(actor);
  return (
    <>
      <PageHeader title="Compounds" intro="The registry of compounds and batches that plates refer to." />
      {compounds.length ? (
        <DataTable
          caption="Registered compounds"
          rows={compounds}
          rowKey={(c) => c.id}
          columns={[
            { header: 'Identifier', cell: (c) => <span className="font-mono font-medium">{c.identifier}</span> },
            { header: 'Name', cell: (c) => c.name || '—' },
            { header: 'SMILES', cell: (c) => <span className="break-all font-mono text-xs">{c.smiles || '—'}</span> },
            { header: 'MW (g/mol)', cell: (c) => (c.molecularWeight === null ? '—' : c.molecularWeight.toFixed(2)), align: 'right' },
            { header: 'Batches', cell: (c) => c.batchCount, align: 'right' },
            { header: 'Plates', cell: (c) => c.plateCount, align: 'right' },
          ]}
        />
      ) : (
        <EmptyState title="No compounds registered">A chemist registers compounds before their plates are imported.</EmptyState>
      )}
    </>
  );
}
