import type { Metadata } from 'next';
import { FitsPanel } from '@/components/fits/fits-panel';
import { can } from '@/lib/auth/roles';
import { loadPlate } from '../plate-header';

export const metadata: Metadata = { title: 'Plate fits' };

export default async function PlateFitsPage({ params }: { params: Promise<{ plateId: string }> }) {
  const { actor, header } = await loadPlate((await params).plateId);
  return (
    <section aria-labelledby="fits-heading">
      <h2 id="fits-heading" className="mb-1 text-lg font-semibold">
        Concentration–response fits
      </h2>
      <p className="mb-4 max-w-3xl text-sm text-ink-700">
        Hill fits of fractional block per compound and target. Filled points are used; hollow points failed QC
        or were excluded. The band is the pointwise 95 % confidence band of the fitted curve; the IC50
        interval uses the t distribution on log10 IC50.
      </p>
      <FitsPanel plateId={header.id} canEdit={can(actor, 'reviewPlates')} />
    </section>
  );
}
