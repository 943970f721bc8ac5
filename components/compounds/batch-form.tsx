'use client';

import { useActionState } from 'react';
import { Field, FormMessage } from '@/components/forms/field';
import type { ActionState } from '@/lib/actions/validated-action';

type Action = (state: ActionState, formData: FormData) => Promise<ActionState>;

/** Adds a batch (lot) to a compound. */
export function BatchForm({ action, compoundId }: { action: Action; compoundId: string }) {
  const [state, formAction, pending] = useActionState(action, {});
  const errors = state.fieldErrors ?? {};
  return (
    <form action={formAction} className="grid gap-x-4 gap-y-1 sm:grid-cols-4" noValidate>
      <input type="hidden" name="compoundId" value={compoundId} />
      <Field label="Batch / lot" name="lot" required errors={errors.lot} />
      <Field label="Purity (%)" name="purity_percent" inputMode="decimal" errors={errors.purity_percent} />
      <Field label="Stock (mM)" name="stockConcentration_mM" inputMode="decimal" errors={errors.stockConcentration_mM} />
      <Field label="Solvent" name="solvent" defaultValue="DMSO" errors={errors.solvent} />
      <div className="flex items-center gap-3 sm:col-span-4">
        <button type="submit" className="gw-button" disabled={pending}>{pending ? 'Adding…' : 'Add batch'}</button>
        <FormMessage ok={state.ok} message={state.message} />
      </div>
    </form>
  );
}
