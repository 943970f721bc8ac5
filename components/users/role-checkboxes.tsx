'use client';

import type { Role } from '@/lib/domain/roles';
import { ROLE_CHOICES } from './role-choices';

/** Role checkboxes (a user may hold several, or none to read results only), with errors announced. */
export function RoleCheckboxes({
  selected,
  onChange,
  errors,
  idPrefix = 'role',
}: {
  selected: Role[];
  onChange: (roles: Role[]) => void;
  errors?: string[] | undefined;
  idPrefix?: string;
}) {
  const toggle = (role: Role, on: boolean) =>
    onChange(on ? [...selected, role] : selected.filter((r) => r !== role));
  return (
    <fieldset aria-describedby={`${idPrefix}-error`}>
      <legend className="gw-label">Roles this person holds</legend>
      <p className="text-xs text-ink-500">None ticked: the person can read results but act on nothing.</p>
      <div className="mt-2 space-y-2">
        {ROLE_CHOICES.map(({ role, label, duty }) => (
          <label key={role} htmlFor={`${idPrefix}-${role}`} className="flex items-start gap-2 text-sm">
            <input
              id={`${idPrefix}-${role}`}
              type="checkbox"
              name="roles"
              value={role}
              checked={selected.includes(role)}
              onChange={(event) => toggle(role, event.target.checked)}
              className="mt-0.5 size-4 accent-lagoon-700"
            />
            <span>
              <span className="font-medium">{label}</span> <span className="text-ink-500">— {duty}</span>
            </span>
          </label>
        ))}
      </div>
      <p id={`${idPrefix}-error`} aria-live="polite" className="mt-1 min-h-4 text-xs text-signal-fail">
        {errors?.join(' ')}
      </p>
    </fieldset>
  );
}
