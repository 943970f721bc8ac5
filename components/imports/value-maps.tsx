'use client';

import type { ColumnMapping } from '@/lib/imports/mapping-schema';
import { normaliseLabel } from '@/lib/imports/normalise-text';
import {
  guessRoleValue,
  ROLE_CHOICES,
  ROLE_CHOICE_LABEL,
  valueKey,
  type RoleChoice,
} from '@/lib/imports/role-words';

/** The values a column holds, from the inspection (by 0-based column index of the header row). */
function columnValues(headers: string[], values: Record<string, string[]>, header: string | null): string[] {
  if (header === null) return [];
  const index = headers.findIndex((h) => normaliseLabel(h) === normaliseLabel(header));
  return index < 0 ? [] : (values[String(index)] ?? []);
}

/** What a role value means now: the mapping's value map (case and spaces ignored), else Gatewell's guess. */
export function roleChoiceFor(mapping: ColumnMapping, value: string): RoleChoice | null {
  const key = valueKey(value);
  const mapped = Object.entries(mapping.roleValues).find(([written]) => valueKey(written) === key)?.[1];
  return mapped ?? guessRoleValue(value);
}

/** The screen target a file's target value maps to now: the same name, the mapping, or a remembered alias. */
export function targetFor(
  mapping: ColumnMapping,
  value: string,
  targets: string[],
  aliases: Record<string, string>,
): string | null {
  const key = normaliseLabel(value);
  const same = targets.find((t) => normaliseLabel(t) === key);
  if (same) return same;
  const mapped = Object.entries(mapping.targetValues).find(
    ([written]) => normaliseLabel(written) === key,
  )?.[1];
  const alias = Object.entries(aliases).find(([written]) => normaliseLabel(written) === key)?.[1];
  const name = mapped ?? alias ?? null;
  return name && targets.includes(name) ? name : null;
}

/**
 * The value maps: each value of the role column → negative control, positive control, test or empty; or,
 * with no role column, the compounds that are the controls; and each target value → a screen target.
 */
export function ValueMaps({
  headers,
  values,
  mapping,
  onChange,
  targets,
  targetAliases,
}: {
  headers: string[];
  values: Record<string, string[]>;
  mapping: ColumnMapping;
  onChange: (next: ColumnMapping) => void;
  targets: string[];
  targetAliases: Record<string, string>;
}) {
  const roleValues = columnValues(headers, values, mapping.columns.role);
  const targetValues = columnValues(headers, values, mapping.columns.target);
  const compounds = columnValues(headers, values, mapping.columns.compound);
  const setRole = (value: string, choice: string) => {
    const next = Object.fromEntries(
      Object.entries(mapping.roleValues).filter(([written]) => valueKey(written) !== valueKey(value)),
    );
    if (choice !== '') next[value] = choice as RoleChoice;
    onChange({ ...mapping, roleValues: next });
  };
  const setTarget = (value: string, name: string) => {
    const next = Object.fromEntries(
      Object.entries(mapping.targetValues).filter(
        ([written]) => normaliseLabel(written) !== normaliseLabel(value),
      ),
    );
    if (name !== '') next[value] = name;
    onChange({ ...mapping, targetValues: next });
  };
  const setControls = (side: 'negative' | 'positive', chosen: string[]) =>
    onChange({ ...mapping, controls: { ...mapping.controls, [side]: chosen } });
  const unknownRoles = roleValues.filter((value) => roleChoiceFor(mapping, value) === null);

  return (
    <div className="grid gap-6 lg:grid-cols-2">
      {mapping.columns.role !== null ? (
        <fieldset className="space-y-2" aria-label="Values of the role column">
          <legend className="gw-label">What each value of “{mapping.columns.role}” means</legend>
          {roleValues.length === 0 ? (
            <p className="text-sm text-ink-700">The column holds no values below the header row.</p>
          ) : (
            <table className="text-sm">
              <tbody>
                {roleValues.map((value) => {
                  const choice = roleChoiceFor(mapping, value);
                  return (
                    <tr key={value}>
                      <th scope="row" className="py-1 pr-4 text-left font-mono font-normal">
                        {value}
                      </th>
                      <td className="py-1">
                        <select
                          aria-label={`Role of the value “${value}”`}
                          className={`gw-input ${choice === null ? 'border-signal-fail' : ''}`}
                          value={choice ?? ''}
                          onChange={(e) => setRole(value, e.target.value)}
                        >
                          <option value="">— choose what it means —</option>
                          {ROLE_CHOICES.map((c) => (
                            <option key={c} value={c}>
                              {ROLE_CHOICE_LABEL[c]}
                            </option>
                          ))}
                        </select>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          )}
          {unknownRoles.length > 0 ? (
            <p className="text-sm text-signal-fail">
              Gatewell does not know {unknownRoles.map((v) => `“${v}”`).join(', ')}: choose what each means,
              or the file cannot be imported.
            </p>
          ) : null}
        </fieldset>
      ) : (
        <fieldset className="space-y-2" aria-label="Control wells">
          <legend className="gw-label">Control wells (the file has no role column)</legend>
          {(['negative', 'positive'] as const).map((side) => (
            <div key={side}>
              <label htmlFor={`controls-${side}`} className="text-sm">
                Compounds that are the {side} control
              </label>
              <select
                id={`controls-${side}`}
                multiple
                size={Math.min(6, Math.max(2, compounds.length))}
                className="gw-input mt-1 w-full"
                value={mapping.controls[side]}
                onChange={(e) =>
                  setControls(
                    side,
                    [...e.target.selectedOptions].map((o) => o.value),
                  )
                }
              >
                {compounds.map((c) => (
                  <option key={c} value={c}>
                    {c}
                  </option>
                ))}
              </select>
            </div>
          ))}
          <label className="flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              checked={mapping.controls.zeroConcentration}
              onChange={(e) =>
                onChange({
                  ...mapping,
                  controls: { ...mapping.controls, zeroConcentration: e.target.checked },
                })
              }
            />
            Concentration 0 (or none written) marks a negative control
          </label>
        </fieldset>
      )}
      {mapping.columns.target !== null && targetValues.length > 0 ? (
        <fieldset className="space-y-2" aria-label="Values of the target column">
          <legend className="gw-label">
            The screen’s target for each value of “{mapping.columns.target}”
          </legend>
          <table className="text-sm">
            <tbody>
              {targetValues.map((value) => {
                const name = targetFor(mapping, value, targets, targetAliases);
                return (
                  <tr key={value}>
                    <th scope="row" className="py-1 pr-4 text-left font-mono font-normal">
                      {value}
                    </th>
                    <td className="py-1">
                      <select
                        aria-label={`Screen target for the value “${value}”`}
                        className={`gw-input ${name === null ? 'border-signal-fail' : ''}`}
                        value={name ?? ''}
                        onChange={(e) => setTarget(value, e.target.value)}
                      >
                        <option value="">— not one of the screen’s targets —</option>
                        {targets.map((t) => (
                          <option key={t} value={t}>
                            {t}
                          </option>
                        ))}
                      </select>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </fieldset>
      ) : null}
    </div>
  );
}
