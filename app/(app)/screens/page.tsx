import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { can } from '@/lib/auth/roles';
import { listScreens } from '@/lib/screens/list';

export const metadata: Metadata = { title: 'Screens' };

function Threshold({ label, value }: { label: string; value: string }) {
  return (
    <div>
      <dt className="text-xs text-ink-500">{label}</dt>
      <dd className="font-medium tabular-nums">{value}</dd>
    </div>
  );
}

export default async function ScreensPage() {
  const actor = await requireActor();
  const screens = await listScreens(actor);
  const actions = can(actor, 'manageScreens') ? (
    <AppLink href="/screens/new" className="gw-button">
      New screen
    </AppLink>
  ) : undefined;
  if (!screens.length) {
    return (
      <>
        <PageHeader title="Screens" actions={actions} />
        <EmptyState title="No screens yet">
          An administrator creates a screen with its targets and QC thresholds.
        </EmptyState>
      </>
    );
  }
  return (
    <>
      <PageHeader
        title="Screens"
        intro="Campaigns, the currents they measure and the model conductance each maps to."
        actions={actions}
      />
      <div className="grid gap-4 xl:grid-cols-2">
        {screens.map((screen) => (
          <section key={screen.id} className="gw-card p-5" aria-labelledby={`screen-${screen.id}`}>
            <h2 id={`screen-${screen.id}`} className="text-lg font-semibold">
              <AppLink href={`/screens/${screen.id}`} className="hover:text-lagoon-700 hover:underline">
                {screen.name}
              </AppLink>
            </h2>
            <p className="mt-1 text-sm text-ink-700">{screen.description}</p>
            <p className="mt-3 text-xs uppercase tracking-wide text-ink-500">Neuron preset</p>
            <p className="font-mono text-sm">{screen.neuronPreset}</p>
            <h3 className="mt-4 text-sm font-semibold">Targets</h3>
            <ul className="mt-1 space-y-1 text-sm">
              {screen.targets.map((target) => (
                <li key={target.id} className="flex justify-between gap-4 border-b border-ink-100 pb-1">
                  <span>{target.name}</span>
                  <span className="font-mono text-ink-700">{target.conductance}</span>
                </li>
              ))}
            </ul>
            <h3 className="mt-4 text-sm font-semibold">Quality limits</h3>
            <dl className="mt-2 grid grid-cols-2 gap-3 text-sm sm:grid-cols-3">
              <Threshold label="Seal resistance ≥" value={`${screen.sealResistanceMin_GOhm} GΩ`} />
              <Threshold label="Control current ≥" value={`${screen.controlCurrentMin_pA} pA`} />
              <Threshold label="Series resistance ≤" value={`${screen.seriesResistanceMax_MOhm} MΩ`} />
              <Threshold
                label="Capacitance"
                value={`${screen.capacitanceMin_pF}–${screen.capacitanceMax_pF} pF`}
              />
              <Threshold
                label="Vehicle run-down ≤"
                value={`${Math.round(screen.vehicleRundownMax_fraction * 100)} %`}
              />
              <Threshold label="Plate Z′ ≥" value={String(screen.zPrimeMin)} />
            </dl>
            <p className="mt-4 text-xs text-ink-500">
              Exposures of interest:{' '}
              {screen.exposures_uM.length ? screen.exposures_uM.map((c) => `${c} µM`).join(', ') : 'none set'}
            </p>
          </section>
        ))}
      </div>
    </>
  );
}
