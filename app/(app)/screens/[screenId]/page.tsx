import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { ScreenForm } from '@/components/screens/screen-form';
import { TargetForm } from '@/components/screens/target-form';
import { TargetMappingForm } from '@/components/screens/target-mapping-form';
import { DataTable } from '@/components/ui/data-table';
import { PageHeader } from '@/components/ui/page-header';
import { requireActor } from '@/lib/auth/current-actor';
import { can } from '@/lib/auth/roles';
import { isAppError } from '@/lib/errors';
import { getScreen } from '@/lib/screens/list';
import { parseId } from '@/lib/validation/ids';
import { blockableConductances } from '@/lib/validation/screens';
import { PRESET_NAMES } from '@/lib/science/neuron/presets';
import { addTargetAction, setTargetMappingAction, updateScreenAction } from '../actions';
import { PRESET_OPTIONS } from '../presets';

export const metadata: Metadata = { title: 'Screen' };

export default async function ScreenPage({ params }: { params: Promise<{ screenId: string }> }) {
  const actor = await requireActor();
  const screen = await getScreen(actor, parseId((await params).screenId, 'screen')).catch((error) => {
    if (isAppError(error) && error.code === 'not_found') notFound();
    throw error;
  });
  const isAdmin = can(actor, 'manageScreens');
  return (
    <>
      <PageHeader title={screen.name} intro={screen.description || undefined} />
      <section className="space-y-3" aria-labelledby="targets-heading">
        <h2 id="targets-heading" className="text-lg font-semibold">
          Targets
        </h2>
        {screen.targets.length ? (
          <DataTable
            caption="Targets"
            rows={screen.targets}
            rowKey={(t) => t.id}
            columns={[
              { header: 'Target', cell: (t) => t.name },
              {
                header: `Model conductance (${screen.neuronPreset})`,
                cell: (t) => <span className="font-mono">{t.conductance}</span>,
              },
              {
                header: 'Block readouts',
                cell: (t) =>
                  t.blockReadouts.use_dependent
                    ? `${t.blockReadouts.tonic ?? 'tonic'} (tonic) · ${t.blockReadouts.use_dependent} (use-dependent)`
                    : 'one readout',
              },
              {
                header: 'In the other presets',
                cell: (t) => (
                  <span className="text-xs text-ink-700">
                    {t.byPreset
                      .filter((m) => m.preset !== screen.neuronPreset)
                      .map((m) => `${m.preset} → ${m.conductance ?? 'none'}`)
                      .join(' · ')}
                  </span>
                ),
              },
            ]}
          />
        ) : (
          <p className="text-sm text-ink-700">
            No targets yet: plates of this screen cannot be imported until it names the currents it measures.
          </p>
        )}
        {isAdmin ? (
          <div className="gw-card p-5">
            <TargetForm
              action={addTargetAction}
              screenId={screen.id}
              conductances={blockableConductances(screen.neuronPreset)}
            />
          </div>
        ) : null}
        {isAdmin && screen.targets.length ? (
          <div className="gw-card p-5">
            <h3 className="mb-2 text-sm font-semibold">Mapping in the other presets</h3>
            <p className="mb-3 text-xs text-ink-700">
              Used if the screen switches to that preset. Without one, a target takes the default for its name
              (sodium channels → gNa, Kv7 → gM, Kv1–Kv3 → gK); a target with neither blocks the switch.
            </p>
            <TargetMappingForm
              action={setTargetMappingAction}
              screenId={screen.id}
              targets={screen.targets.map((t) => ({ id: t.id, name: t.name }))}
              presets={PRESET_NAMES.filter((p) => p !== screen.neuronPreset).map((p) => ({
                name: p,
                conductances: blockableConductances(p),
              }))}
            />
          </div>
        ) : null}
      </section>
      {isAdmin ? (
        <section className="gw-card mt-6 p-5" aria-labelledby="settings-heading">
          <h2 id="settings-heading" className="mb-3 text-lg font-semibold">
            Settings and QC limits
          </h2>
          <ScreenForm
            action={updateScreenAction}
            screen={screen}
            presets={PRESET_OPTIONS}
            submitLabel="Save settings"
          />
        </section>
      ) : null}
    </>
  );
}
