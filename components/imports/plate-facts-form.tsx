'use client';

import { PLATE_FACTS, PLATE_FACT_LABEL, type PlateFact } from '@/lib/imports/import-fields';
import type { ColumnMapping, FactLocator } from '@/lib/imports/mapping-schema';
import type { FoundFacts } from './import-api';

type Kind = '' | 'key' | 'cell';

/**
 * Where the plate barcode and the other plate facts are written outside the table: beside a key (on one
 * sheet or any) or in one cell. Shows what the guess found; the check step shows what the mapping finds.
 */
export function PlateFactsForm({
  sheets,
  mapping,
  guessed,
  found,
  onChange,
}: {
  sheets: string[];
  mapping: ColumnMapping;
  /** The locators as guessed, so the values found for them can be shown while they are unchanged. */
  guessed: ColumnMapping['facts'];
  found: FoundFacts;
  onChange: (next: ColumnMapping) => void;
}) {
  const set = (fact: PlateFact, locator: FactLocator | null) =>
    onChange({ ...mapping, facts: { ...mapping.facts, [fact]: locator } });
  const setKind = (fact: PlateFact, kind: Kind) => {
    if (kind === '') return set(fact, null);
    const current = mapping.facts[fact];
    if (kind === 'key')
      set(fact, { kind, sheet: current?.sheet ?? null, key: current?.kind === 'key' ? current.key : '' });
    else
      set(fact, {
        kind,
        sheet: current?.sheet ?? sheets[0] ?? '',
        address: current?.kind === 'cell' ? current.address : '',
      });
  };
  return (
    <fieldset className="space-y-2" aria-label="Plate facts outside the table">
      <legend className="gw-label">
        Plate facts outside the table (the barcode becomes the plate’s label)
      </legend>
      <table className="text-sm">
        <tbody>
          {PLATE_FACTS.map((fact) => {
            const locator = mapping.facts[fact];
            const unchanged = JSON.stringify(locator) === JSON.stringify(guessed[fact]);
            return (
              <tr key={fact}>
                <th scope="row" className="py-1 pr-3 text-left font-medium">
                  {PLATE_FACT_LABEL[fact]}
                </th>
                <td className="py-1 pr-2">
                  <select
                    aria-label={`Where the ${PLATE_FACT_LABEL[fact]} is written`}
                    className="gw-input"
                    value={locator?.kind ?? ''}
                    onChange={(e) => setKind(fact, e.target.value as Kind)}
                  >
                    <option value="">— not in this file —</option>
                    <option value="key">beside a key</option>
                    <option value="cell">in a cell</option>
                  </select>
                </td>
                {locator ? (
                  <>
                    <td className="py-1 pr-2">
                      <select
                        aria-label={`Sheet of the ${PLATE_FACT_LABEL[fact]}`}
                        className="gw-input"
                        value={locator.sheet ?? ''}
                        onChange={(e) =>
                          set(fact, {
                            ...locator,
                            sheet: e.target.value === '' ? null : e.target.value,
                          } as FactLocator)
                        }
                      >
                        {locator.kind === 'key' ? <option value="">any sheet</option> : null}
                        {sheets.map((s) => (
                          <option key={s} value={s}>
                            {s}
                          </option>
                        ))}
                      </select>
                    </td>
                    <td className="py-1 pr-2">
                      <input
                        aria-label={
                          locator.kind === 'key'
                            ? `Key of the ${PLATE_FACT_LABEL[fact]}`
                            : `Cell of the ${PLATE_FACT_LABEL[fact]} (like B2)`
                        }
                        className="gw-input w-36"
                        value={locator.kind === 'key' ? locator.key : locator.address}
                        placeholder={locator.kind === 'key' ? 'e.g. Barcode' : 'e.g. B2'}
                        onChange={(e) =>
                          set(
                            fact,
                            locator.kind === 'key'
                              ? { ...locator, key: e.target.value }
                              : { ...locator, address: e.target.value.toUpperCase() },
                          )
                        }
                      />
                    </td>
                    <td className="py-1 font-mono text-ink-700">{unchanged ? (found[fact] ?? '') : ''}</td>
                  </>
                ) : null}
              </tr>
            );
          })}
        </tbody>
      </table>
    </fieldset>
  );
}
