'use client';

import { useActionState } from 'react';
import { SubmitRow } from '@/components/forms/field';
import { SelectField } from '@/components/forms/select-field';
import type { FormAction } from '@/lib/actions/validated-action';

/** Sets which conductance a target blocks in a preset other than the screen's current one. */
export function TargetMappingForm({
  action,
  screenId,
  targets,
  presets,
}: {
  action: FormAction;
  screenId: string;
  targets: { id: string; name: string }[];
  /** The other presets, each with its blockable conductances. */
  presets: { name: string; conductances: string[] }[];
}) {
  const [state, formAction, pending] = useActionState(action, {});
  const e = state.fieldErrors ?? {};
  const conductances = [...new Set(presets.flatMap((p) => p.conductances))];
  return (
    <form action={formAction} className="grid gap-x-4 gap-y-1 sm:grid-cols-3" noValidate>
      <input type="hidden" name="screenId" value={screenId} />
      <SelectField
        label="Target"
        name="targetId"
        options={targets.map((t) => ({ value: t.id, label: t.name }))}
        errors={e.targetId}
      />
      <SelectField
        label="In preset"
        name="preset"
        options={presets.map((p) => ({ value: p.name, label: `${p.name} (${p.conductances.join(', ')})` }))}
        errors={e.preset}
      />
      <SelectField
        label="Model conductance"
        name="conductance"
        id="mapping-conductance"
        options={conductances.map((c) => ({ value: c, label: c }))}
        errors={e.conductance}
      />
      <SubmitRow
        label="Save mapping"
        pendingLabel="Saving…"
        pending={pending}
        state={state}
        className="flex items-center gap-3 sm:col-span-3"
      />
    </form>
  );
}
