'use client';

import { useMemo, useState } from 'react';
import type { WellRowView } from '@/lib/validation/plates';
import { usePlateWells } from './plate-data';
import { PlateMap } from './plate-map';

/**
 * The compound map a chemist verifies: the plate coloured by compound and by concentration, one map
 * above the other, each with its legend and the facts of the well pointed at. Read only.
 */
export function VerificationMaps({ plateId, format }: { plateId: string; format: number }) {
  const { data, error } = usePlateWells(plateId);
  const targets = useMemo(() => [...new Set(data?.wells.map((w) => w.target))], [data]);
  const [target, setTarget] = useState<string | null>(null);
  const current = target ?? targets[0] ?? '';
  // Compound and concentration belong to the well; the wells answer has a row per well and target.
  const wells = useMemo<WellRowView[]>(
    () => data?.wells.filter((w) => w.target === current) ?? [],
    [data, current],
  );
  return (
    <section aria-labelledby="verify-map-heading" className="space-y-4">
      <div className="flex flex-wrap items-end gap-4">
        <h2 id="verify-map-heading" className="mr-auto text-lg font-semibold">
          Compound map to verify
        </h2>
        {targets.length > 1 ? (
          <label className="text-sm">
            Facts of target{' '}
            <select
              className="gw-input inline-block w-auto"
              value={current}
              onChange={(e) => setTarget(e.target.value)}
            >
              {targets.map((t) => (
                <option key={t}>{t}</option>
              ))}
            </select>
          </label>
        ) : null}
      </div>
      <p className="text-sm text-ink-700">
        Each well should hold the compound and the concentration the export claims. Point at a well or move
        through the map with the arrow keys to read its facts.
      </p>
      {error ? (
        <p role="alert" className="text-signal-fail">
          The wells could not be loaded: {error.message}
        </p>
      ) : !data ? (
        <p role="status" className="text-sm text-ink-500">
          Loading wells…
        </p>
      ) : (
        <div className="space-y-8">
          <PlateMap format={format} wells={wells} mode="compound" label={`Compound map, ${format} wells`} />
          <PlateMap
            format={format}
            wells={wells}
            mode="concentration"
            label={`Concentration map, ${format} wells`}
          />
        </div>
      )}
    </section>
  );
}
