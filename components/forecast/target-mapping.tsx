import { getPreset, isPresetName } from '@/lib/science/neuron/presets';
import type { TargetPotency } from '@/lib/validation/forecasts';

/** Which model conductance each target blocks in the forecast's preset, e.g. "Nav1.7 → gNa". */
export function TargetMapping({ preset, targets }: { preset: string; targets: TargetPotency[] }) {
  const title = isPresetName(preset) ? getPreset(preset).title : null;
  return (
    <section aria-label="Targets in the model" className="text-sm text-ink-700">
      <span className="font-medium text-ink-900">Targets in the model:</span>{' '}
      {targets.map((t, i) => (
        <span key={t.targetId}>
          {i > 0 ? ' · ' : null}
          {t.target} → <span className="font-mono">{t.conductance}</span>
        </span>
      ))}{' '}
      <span className="text-ink-500">
        ({title ? `${title}, ` : null}preset <span className="font-mono">{preset}</span>; an admin sets the
        mapping on the screen’s page)
      </span>
    </section>
  );
}
