'use client';

import { useActionState } from 'react';
import { Field, SubmitRow } from '@/components/forms/field';
import { SelectField } from '@/components/forms/select-field';
import type { FormAction } from '@/lib/actions/validated-action';
import type { ScreenDetail } from '@/lib/screens/list';

/** Values a new screen starts from: the QC defaults of lib/science/qc/qc-thresholds.ts. */
const NEW_SCREEN = {
  zPrimeMin: 0.5,
  sealResistanceMin_GOhm: 0.5,
  controlCurrentMin_pA: 200,
  seriesResistanceMax_MOhm: 25,
  capacitanceMin_pF: 1,
  capacitanceMax_pF: 100,
  vehicleRundownMax_fraction: 0.2,
};

export function ScreenForm({
  action,
  screen,
  presets,
  submitLabel,
}: {
  action: FormAction;
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
      <SelectField
        label="Neuron preset"
        name="neuronPreset"
        options={presets}
        defaultValue={screen?.neuronPreset}
        errors={e.neuronPreset}
      />
      <Field
        label="Exposures of interest (µM)"
        name="exposures_uM"
        hint="Separated by commas, e.g. 0.1, 0.3, 1"
        defaultValue={screen?.exposures_uM.join(', ') ?? ''}
        errors={e.exposures_uM}
      />
      <div className="sm:col-span-2 lg:col-span-3">
        <Field
          label="Description"
          name="description"
          defaultValue={screen?.description}
          errors={e.description}
        />
      </div>
      <Field
        label="Seal resistance at least (GΩ)"
        name="sealResistanceMin_GOhm"
        inputMode="decimal"
        defaultValue={v.sealResistanceMin_GOhm}
        errors={e.sealResistanceMin_GOhm}
      />
      <Field
        label="Control current at least (pA)"
        name="controlCurrentMin_pA"
        inputMode="decimal"
        defaultValue={v.controlCurrentMin_pA}
        errors={e.controlCurrentMin_pA}
      />
      <Field
        label="Series resistance at most (MΩ)"
        name="seriesResistanceMax_MOhm"
        inputMode="decimal"
        defaultValue={v.seriesResistanceMax_MOhm}
        errors={e.seriesResistanceMax_MOhm}
      />
      <Field
        label="Capacitance from (pF)"
        name="capacitanceMin_pF"
        inputMode="decimal"
        defaultValue={v.capacitanceMin_pF}
        errors={e.capacitanceMin_pF}
      />
      <Field
        label="Capacitance to (pF)"
        name="capacitanceMax_pF"
        inputMode="decimal"
        defaultValue={v.capacitanceMax_pF}
        errors={e.capacitanceMax_pF}
      />
      <Field
        label="Vehicle run-down at most (%)"
        name="vehicleRundownMax_percent"
        inputMode="decimal"
        defaultValue={Math.round(v.vehicleRundownMax_fraction * 1000) / 10}
        errors={e.vehicleRundownMax_percent}
      />
      <Field
        label="Plate Z′ at least"
        name="zPrimeMin"
        inputMode="decimal"
        defaultValue={v.zPrimeMin}
        errors={e.zPrimeMin}
      />
      <SubmitRow
        label={submitLabel}
        pendingLabel="Saving…"
        pending={pending}
        state={state}
        className="flex items-center gap-3 sm:col-span-2 lg:col-span-3"
      />
    </form>
  );
}
