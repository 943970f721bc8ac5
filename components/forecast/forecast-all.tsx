'use client';

import { useEffect, useRef, useState } from 'react';
import { useSWRConfig } from 'swr';
import { postJson } from '@/components/plates/plate-data';
import { isOpen, plateJobsKey, usePlateJobs } from '@/components/plates/plate-jobs';
import type { PlateForecastList } from '@/lib/validation/forecasts';
import { plateForecastListKey } from './forecast-data';
import { BusyButton } from '@/components/ui/busy-button';

/**
 * Queues a forecast run over the plate: every compound with a usable IC50 and no stored forecast,
 * computed by a worker one after another. The progress comes from the job, so it goes on when the
 * page is closed, and anyone who opens the plate sees it.
 */
export function ForecastAll({ list, at }: { list: PlateForecastList; at: number }) {
  const { mutate } = useSWRConfig();
  const jobs = usePlateJobs(list.plate.id, false);
  const [error, setError] = useState<string | null>(null);
  const [starting, setStarting] = useState(false);
  const run = jobs.data?.jobs.find((j) => j.kind === 'plate-forecasts');
  const todo = list.compounds.filter((c) => c.reason === null && !c.stored);
  const running = isOpen(run);

  // Stored flags change as the run goes: refresh the compound list at each step and at the end.
  const seen = useRef<string | null>(null);
  const step = run ? `${run.id}:${run.state}:${run.done}` : null;
  useEffect(() => {
    if (seen.current !== null && step !== seen.current) void mutate(plateForecastListKey(list.plate.id));
    seen.current = step;
  }, [step, list.plate.id, mutate]);

  async function start() {
    setError(null);
    setStarting(true);
    try {
      await postJson(plateJobsKey(list.plate.id), { at });
      await jobs.mutate();
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The run could not be queued.');
    } finally {
      setStarting(false);
    }
  }

  return (
    <div className="space-y-2 text-sm">
      <BusyButton
        className="gw-button w-full justify-center"
        onClick={start}
        busy={starting || running}
        busyLabel={running ? 'Forecast run under way' : 'Queuing the run…'}
        disabled={todo.length === 0}
      >
        {running
          ? 'Forecast run under way'
          : todo.length
            ? `Forecast the ${todo.length} not yet computed`
            : 'Every forecast is stored'}
      </BusyButton>
      <div role="status" aria-live="polite" className="min-h-5 text-xs text-ink-700">
        {error ? (
          <span className="text-signal-fail">{error}</span>
        ) : run && running ? (
          <>
            <progress className="w-full accent-lagoon-700" max={run.total ?? 1} value={run.done} />
            {run.state === 'queued'
              ? `Queued: ${run.total ?? '?'} forecast(s) wait for a worker…`
              : `Forecasting ${Math.min(run.done + 1, run.total ?? run.done + 1)} of ${run.total ?? '?'}…`}
          </>
        ) : run?.state === 'failed' ? (
          <span className="text-signal-fail">
            The last run stopped after {run.done} of {run.total ?? '?'}: {run.message}
          </span>
        ) : run?.state === 'done' ? (
          `Last run: ${run.done} of ${run.total ?? run.done} forecasts computed and stored.`
        ) : null}
      </div>
    </div>
  );
}
