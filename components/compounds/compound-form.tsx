'use client';

import { useActionState } from 'react';
import { Field, SubmitRow } from '@/components/forms/field';
import type { FormAction } from '@/lib/actions/validated-action';
import type { CompoundRecord } from '@/lib/compounds/service';

/** Registration or edit form of a compound's identity fields. */
export function CompoundForm({
  action,
  compound,
  submitLabel,
}: {
  action: FormAction;
  compound?: CompoundRecord;
  submitLabel: string;
}) {
  const [state, formAction, pending] = useActionState(action, {});
  const errors = state.fieldErrors ?? {};
  return (
    <form action={formAction} className="grid gap-x-4 gap-y-1 sm:grid-cols-2" noValidate>
      {compound ? <input type="hidden" name="compoundId" value={compound.id} /> : null}
      <Field
        label="Identifier"
        name="identifier"
        required
        defaultValue={compound?.identifier}
        errors={errors.identifier}
        hint="Unique in Gatewell, e.g. GW-0042"
      />
      <Field label="Name" name="name" defaultValue={compound?.name} errors={errors.name} hint="Optional" />
      <div className="sm:col-span-2">
        <Field
          label="SMILES"
          name="smiles"
          defaultValue={compound?.smiles}
          errors={errors.smiles}
          className="gw-input mt-1 font-mono"
        />
      </div>
      <Field
        label="Molecular weight (g/mol)"
        name="molecularWeight"
        inputMode="decimal"
        defaultValue={compound?.molecularWeight ?? ''}
        errors={errors.molecularWeight}
      />
      <SubmitRow
        label={submitLabel}
        pendingLabel="Saving…"
        pending={pending}
        state={state}
        className="flex items-end gap-3 pb-5 sm:col-span-2"
      />
    </form>
  );
}
