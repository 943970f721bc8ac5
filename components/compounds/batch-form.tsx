'use client';

import { useActionState } from 'react';
import { Field, SubmitRow } from '@/components/forms/field';
import type { FormAction } from '@/lib/actions/validated-action';

/** Adds a batch (lot) to a compound. */
export function BatchForm({ action, compoundId }: { action: FormAction; compoundId: string }) {
  const [state, formAction, pending] = useActionState(action, {});
  const errors = state.fieldErrors ?? {};
  return (
    <form action={formAction} className="grid gap-x-4 gap-y-1 sm:grid-cols-4" noValidate>
      <input type="hidden" name="compoundId" value={compoundId} />
      <Field label="Batch / lot" name="lot" required errors={errors.lot} />
      <Field label="Purity (%)" name="purity_percent" inputMode="decimal" errors={errors.purity_percent} />
      <Field
        label="Stock (mM)"
        name="stockConcentration_mM"
        inputMode="decimal"
        errors={errors.stockConcentration_mM}
      />
      <Field label="Solvent" name="solvent" defaultValue="DMSO" errors={errors.solvent} />
      <SubmitRow
        label="Add batch"
        pendingLabel="Adding…"
        pending={pending}
        state={state}
        className="flex items-center gap-3 sm:col-span-4"
      />
    </form>
  );
}
