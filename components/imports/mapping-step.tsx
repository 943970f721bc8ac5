'use client';

import {
  FIELD_LABEL,
  IMPORT_FIELDS,
  REQUIRED_FIELDS,
  UNIT_FIELDS,
  type ImportField,
  type UnitField,
} from '@/lib/imports/import-fields';
import type { ColumnMapping } from '@/lib/imports/mapping-schema';
import { UNIT_LABEL, unitsOf, type QuantityKind } from '@/lib/imports/units';
import { ReadingSettings, type ReadingSample } from './reading-settings';

const UNIT_KIND: Record<UnitField, QuantityKind> = {
  concentration: 'concentration',
  controlCurrent: 'current',
  compoundCurrent: 'current',
  useDependentControlCurrent: 'current',
  useDependentCompoundCurrent: 'current',
  sealResistance: 'sealResistance',
  seriesResistance: 'seriesResistance',
  capacitance: 'capacitance',
};

const isUnitField = (field: ImportField): field is UnitField =>
  (UNIT_FIELDS as readonly string[]).includes(field);

/** One row per field: the column that feeds it and, for quantities, the unit when the header does not say. */
export function MappingStep({
  headers,
  mapping,
  onChange,
  sample,
}: {
  headers: string[];
  mapping: ColumnMapping;
  onChange: (next: ColumnMapping) => void;
  /** Rows under the header and the guess, for the reading section's hints. */
  sample?: ReadingSample;
}) {
  const named = headers.filter((h) => h.trim() !== '');
  const setColumn = (field: ImportField, value: string) =>
    onChange({ ...mapping, columns: { ...mapping.columns, [field]: value === '' ? null : value } });
  const setUnit = (field: UnitField, value: string) =>
    onChange({ ...mapping, units: { ...mapping.units, [field]: value } as ColumnMapping['units'] });
  return (
    <table className="min-w-full text-sm">
      <caption className="sr-only">Column for each field</caption>
      <thead className="text-left text-xs uppercase tracking-wide text-ink-700">
        <tr>
          <th scope="col" className="py-2 pr-4">
            Field
          </th>
          <th scope="col" className="py-2 pr-4">
            Column in the file
          </th>
          <th scope="col" className="py-2">
            Unit if the header gives none
          </th>
        </tr>
      </thead>
      <tbody className="divide-y divide-ink-100">
        {IMPORT_FIELDS.map((field) => {
          const required = REQUIRED_FIELDS.includes(field) && !(field === 'target' && mapping.fixedTarget);
          const id = `map-${field}`;
          return (
            <tr key={field}>
              <th scope="row" className="py-1.5 pr-4 text-left font-medium">
                <label htmlFor={id}>{FIELD_LABEL[field]}</label>
                {required ? (
                  <span className="text-signal-fail" aria-label="required">
                    {' '}
                    *
                  </span>
                ) : null}
              </th>
              <td className="py-1.5 pr-4">
                <select
                  id={id}
                  className="gw-input"
                  value={mapping.columns[field] ?? ''}
                  onChange={(e) => setColumn(field, e.target.value)}
                >
                  <option value="">— not in this file —</option>
                  {named.map((header) => (
                    <option key={header} value={header}>
                      {header}
                    </option>
                  ))}
                </select>
              </td>
              <td className="py-1.5">
                {isUnitField(field) ? (
                  <select
                    aria-label={`Unit of ${FIELD_LABEL[field]}`}
                    className="gw-input"
                    value={
                      mapping.units[field] ??
                      (field === 'useDependentControlCurrent'
                        ? mapping.units.controlCurrent
                        : mapping.units.compoundCurrent)
                    }
                    onChange={(e) => setUnit(field, e.target.value)}
                  >
                    {unitsOf(UNIT_KIND[field]).map((unit) => (
                      <option key={unit} value={unit}>
                        {UNIT_LABEL[unit]}
                      </option>
                    ))}
                  </select>
                ) : null}
              </td>
            </tr>
          );
        })}
      </tbody>
      <tfoot>
        <tr>
          <td colSpan={3} className="pt-3">
            <ReadingSettings headers={headers} mapping={mapping} sample={sample} onChange={onChange} />
          </td>
        </tr>
      </tfoot>
    </table>
  );
}
