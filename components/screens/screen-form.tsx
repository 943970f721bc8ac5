'use client';

import { useActionState } from 'react';
import { Field, FormMessage } from '@/components/forms/field';
import { SelectField } from '@/components/forms/select-field';
import type { ActionState } from '@/lib/actions/validated-action';
import type { ScreenDetail } from '@/lib/screens/list';

type Action = (state: ActionState, formData: FormData) => Promise<ActionState>;

/** Values a new screen starts from: the QC defaults of lib/science/qc/qc-thresholds.ts. */
const NEW_SCREEN = { zprimeMin: 0.5, sealMinGohm: 0.5, controlCurrentMinPa: 200, seriesMaxMohm: 25, capacitanceMinPf: 1, capacitanceMaxPf: 100, rundownMaxFraction: 0.2 };

export function ScreenForm({ action, screen, presets, submitLabel }: {
  action: Action;
  screen?: ScreenDetail;
  presets: { value: string; label: string }[];
  submitLabel: string;
}) {
  const [state, formAction, pending] = useActionState(action, {});
  const e = state.fieldErrors ?? {};
  const v = screen ?? NEW_SCREEN;
  return (
    <form action={formAction} className="grid gap-x-4 gap-y-1 sm:grid-cols-2 lg:grid-cols-3" noValidate>
      {screen ? <input type="hidden" name="screenId" value={screen.id} /> : null}
      <Field label="Name" name="name" required defaultValue={screen?.name} errors={e.name} />
      <SelectField label="Neuron preset" name="neuronPreset" options={presets} defaultValue={screen?.neuronPreset} errors={e.neuronPreset} />
      <Field label="Exposures of interest (µM)" name="exposuresUm" hint="Separated by commas, e.g. 0.1, 0.3, 1" defaultValue={screen?.exposuresUm.join(', ') ?? ''} errors={e.exposuresUm} />
      <div className="sm:col-span-2 lg:col-span-3">
        <Field label="Description" name="description" defaultValue={screen?.description} errors={e.description} />
      </div>
      <Field label="Seal resistance at least (GΩ)" name="sealMinGohm" inputMode="decimal" defaultValue={v.sealMinGohm} errors={e.sealMinGohm} />
      <Field label="Control current at least (pA)" name="controlCurrentMinPa" inputMode="decimal" defaultValue={v.controlCurrentMinPa} errors={e.controlCurrentMinPa} />
      <Field label="Series resistance at most (MΩ)" name="seriesMaxMohm" inputMode="decimal" defaultValue={v.seriesMaxMohm} errors={e.seriesMaxMohm} />
      <Field label="Capacitance from (pF)" name="capacitanceMinPf" inputMode="decimal" defaultValue={v.capacitanceMinPf} errors={e.capacitanceMinPf} />
      <Field label="Capacitance to (pF)" name="capacitanceMaxPf" inputMode="decimal" defaultValue={v.capacitanceMaxPf} errors={e.capacitanceMaxPf} />
      <Field label="Vehicle run-down at most (%)" name="rundownMaxPercent" inputMode="decimal" defaultValue={Math.round(v.rundownMaxFraction * 1000) / 10} errors={e.rundownMaxPercent} />
      <Field label="Plate Z′ at least" name="zprimeMin" inputMode="decimal" defaultValue={v.zprimeMin} errors={e.zprimeMin} />
      <div className="flex items-center gap-3 sm:col-span-2 lg:col-span-3">
        <button type="submit" className="gw-button" disabled={pending}>{pending ? 'Saving…' : submitLabel}</button>
        <FormMessage ok={state.ok} message={state.message} />
      </div>
    </form>
  );
}
