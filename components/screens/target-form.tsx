'use client';

import { useActionState } from 'react';
import { Field, SubmitRow } from '@/components/forms/field';
import { SelectField } from '@/components/forms/select-field';
import type { FormAction } from '@/lib/actions/validated-action';

/** Adds a target (a measured current) and the model conductance it maps to. */
export function TargetForm({
  action,
  screenId,
  conductances,
}: {
  action: FormAction;
  screenId: string;
  conductances: string[];
}) {
  const [state, formAction, pending] = useActionState(action, {});
  const e = state.fieldErrors ?? {};
  return (
    <form action={formAction} className="grid gap-x-4 gap-y-1 sm:grid-cols-3" noValidate>
      <input type="hidden" name="screenId" value={screenId} />
      <Field label="Target (as the export names it)" name="name" required errors={e.name} />
      <SelectField
        label="Model conductance"
        name="conductance"
        options={conductances.map((c) => ({ value: c, label: c }))}
        errors={e.conductance}
      />
      <Field label="Description" name="description" errors={e.description} />
      <Field
        label="Tonic readout name (optional)"
        name="tonicReadoutName"
        placeholder="tonic"
        errors={e.tonicReadoutName}
      />
      <Field
        label="Use-dependent readout name (blank: one readout)"
        name="useDependentReadoutName"
        placeholder="e.g. 10th pulse"
        errors={e.useDependentReadoutName}
      />
      <SubmitRow
        label="Add target"
        pendingLabel="Adding…"
        pending={pending}
        state={state}
        className="flex items-center gap-3 sm:col-span-3"
      />
    </form>
  );
}
