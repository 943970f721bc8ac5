import type { Metadata } from 'next';
import { QcSummary } from '@/components/plates/qc-summary';
import { WellsPanel } from '@/components/plates/wells-panel';
import { can } from '@/lib/auth/roles';
import { listPlateWells } from '@/lib/plates/detail';
import { gridLayoutOf } from '@/lib/preferences/grid-layouts';
import { loadPlate } from './plate-header';

export const metadata: Metadata = { title: 'Plate' };

export default async function PlateWellsPage({ params }: { params: Promise<{ plateId: string }> }) {
  const { actor, header } = await loadPlate((await params).plateId);
  const [wellsLayout, wells] = await Promise.all([
    gridLayoutOf(actor, 'plate-wells'),
    listPlateWells(actor, header.id),
  ]);
  return (
    <div className="space-y-8">
      <QcSummary header={header} />
      <WellsPanel
        plateId={header.id}
        format={header.format}
        canEdit={can(actor, 'reviewPlates')}
        // Someone who verifies compound maps and does not review QC opens the map on compounds.
        initialLayout={wellsLayout}
        initialWells={{ version: header.version, state: header.state, wells }}
        initialMode={can(actor, 'verifyCompoundMap') && !can(actor, 'reviewPlates') ? 'compound' : 'block'}
      />
    </div>
  );
}
