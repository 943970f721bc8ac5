'use client';

import { useRef, useState } from 'react';
import { useSWRConfig } from 'swr';
import type { PlateForecastList } from '@/lib/validation/forecasts';
import { fetchCompoundForecast, plateForecastKey, plateForecastListKey } from './forecast-data';

interface Run {
  done: number;
  total: number;
  current: string | null;
  error: string | null;
}

/**
 * Forecasts every compound of the plate that has a usable IC50 and no stored forecast, one after
 * another, with a progress count; the page stays usable meanwhile and the run can be stopped.
 */
export function ForecastAll({ list, at }: { list: PlateForecastList; at: number }) {
  const { mutate } = useSWRConfig();
  const [run, setRun] = useState<Run | null>(null);
  const stop = useRef(false);
  const todo = list.compounds.filter((c) => c.reason === null && !c.stored);
  const running = run !== null && run.current !== null;

  async function start() {
    stop.current = false;
    const queue = [...todo];
    let done = 0;
    for (const c of queue) {
      if (stop.current) break;
      setRun({ done, total: queue.length, current: c.compound, error: null });
      const key = plateForecastKey(list.plate.id, c.compoundId, at);
      try {
        await mutate(key, fetchCompoundForecast(key), { revalidate: false });
      } catch (e) {
        setRun({ done, total: queue.length, current: null, error: `${c.compound}: ${e instanceof Error ? e.message : 'the forecast failed.'}` });
        await mutate(plateForecastListKey(list.plate.id));
        return;
      }
      done++;
    }
    setRun({ done, total: queue.length, current: null, error: null });
    await mutate(plateForecastListKey(list.plate.id));
  }

  return (
    <div className="space-y-2 text-sm">
      {running ? (
        <button type="button" className="gw-button-quiet w-full" onClick={() => { stop.current = true; }}>Stop after this compound</button>
      ) : (
        <button type="button" className="gw-button w-full" onClick={start} disabled={todo.length === 0}>
          {todo.length ? `Forecast the ${todo.length} not yet computed` : 'Every forecast is stored'}
        </button>
      )}
      <div role="status" aria-live="polite" className="min-h-5 text-xs text-ink-700">
        {run && run.current ? (
          <>
            <progress className="w-full accent-lagoon-700" max={run.total} value={run.done} />
            Forecasting {run.done + 1} of {run.total}: {run.current}…
          </>
        ) : run?.error ? (
          <span className="text-signal-fail">Stopped at {run.error}</span>
        ) : run ? (
          `${run.done} of ${run.total} forecasts computed and stored.`
        ) : null}
      </div>
    </div>
  );
}
