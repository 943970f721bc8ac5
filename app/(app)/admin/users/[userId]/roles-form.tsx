'use client';

import { useEffect, useState } from 'react';
import { Field, SubmitRow } from '@/components/forms/field';
import { useFormAction } from '@/components/forms/use-form-action';
import { RoleCheckboxes } from '@/components/users/role-checkboxes';
import type { FormAction } from '@/lib/actions/validated-action';
import type { Role } from '@/lib/domain/roles';

/** Ticks the roles a user holds; the reason goes to the audit trail. */
export function RolesForm({ action, userId, roles }: { action: FormAction; userId: string; roles: Role[] }) {
  const { state, pending, formRef, onSubmit } = useFormAction(action);
  const [selected, setSelected] = useState<Role[]>(roles);
  const [reason, setReason] = useState('');
  useEffect(() => {
    if (state.ok) setReason(''); // eslint-disable-line react-hooks/set-state-in-effect -- a saved change clears its reason
  }, [state]);
  const errors = state.fieldErrors ?? {};
  return (
    <form ref={formRef} onSubmit={onSubmit} className="space-y-2" noValidate>
      <input type="hidden" name="userId" value={userId} />
      <RoleCheckboxes selected={selected} onChange={setSelected} errors={errors.roles} idPrefix="roles" />
      <Field
        label="Reason for the change"
        name="reason"
        id="roles-reason"
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        errors={errors.reason}
        hint="Kept in the audit trail."
      />
      <SubmitRow
        label="Save roles"
        pendingLabel="Saving…"
        pending={pending}
        state={state}
        className="flex flex-wrap items-center gap-3"
      />
    </form>
  );
}
