import type { Metadata } from 'next';
import { PlateForecastPanel } from '@/components/forecast/plate-forecast-panel';
import { loadPlate } from '../plate-header';

export const metadata: Metadata = { title: 'Plate forecast' };

export default async function PlateForecastPage({ params }: { params: Promise<{ plateId: string }> }) {
  const { header } = await loadPlate((await params).plateId);
  const exposures = [...header.exposures_uM]
    .sort((a, b) => a - b)
    .map((c) => `${c} µM`)
    .join(', ');
  return (
    <section aria-labelledby="forecast-heading">
      <h2 id="forecast-heading" className="mb-1 text-lg font-semibold">
        Excitability forecast
      </h2>
      <p className="mb-4 max-w-3xl text-sm text-ink-700">
        What each compound’s block of{' '}
        {header.targets.map((t) => `${t.name} (${t.conductance})`).join(', ') || 'the screen’s targets'} does
        to a model neuron at the screen’s exposures{exposures ? ` (${exposures})` : ''}: rheobase, spike
        threshold and firing rate beside control, from this plate’s IC50s and Hill slopes.
      </p>
      <PlateForecastPanel plateId={header.id} />
    </section>
  );
}
