'use client';

import { useCallback, useMemo, useState } from 'react';
import type { WellRowView } from '@/lib/validation/plates';
import { usePlateWells } from './plate-data';
import { PlateMap, WellFactsBox } from './plate-map';

/**
 * The compound map a chemist verifies: the plate coloured by compound and by concentration side by side
 * (one above the other on narrow screens), each with its legend, and one box with the facts of the well
 * last pointed at or focused in either map. Read only.
 */
export function VerificationMaps({ plateId, format }: { plateId: string; format: number }) {
  const { data, error } = usePlateWells(plateId);
  const targets = useMemo(() => [...new Set(data?.wells.map((w) => w.target))], [data]);
  const [target, setTarget] = useState<string | null>(null);
  const [shown, setShown] = useState<WellRowView | undefined>(undefined);
  const show = useCallback((well: WellRowView | undefined) => {
    if (well) setShown(well);
  }, []);
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
        <div
          className={`grid items-start gap-6 ${
            // 1536 wells need the width: one map above the other, the facts beside them.
            format === 1536
              ? 'xl:grid-cols-[minmax(0,1fr)_13rem] xl:[&>section]:col-start-2 xl:[&>section]:row-start-1'
              : 'lg:grid-cols-2 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)_13rem] lg:[&>section]:col-span-2 xl:[&>section]:col-span-1'
          }`}
        >
          <PlateMap
            format={format}
            wells={wells}
            mode="compound"
            label={`Compound map, ${format} wells`}
            onShow={show}
          />
          <PlateMap
            format={format}
            wells={wells}
            mode="concentration"
            label={`Concentration map, ${format} wells`}
            onShow={show}
          />
          <WellFactsBox well={shown} />
        </div>
      )}
    </section>
  );
}
