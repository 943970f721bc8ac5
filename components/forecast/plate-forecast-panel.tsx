'use client';

import { AppLink } from '@/components/ui/app-link';
import { useEffect, useState } from 'react';
import { CompoundPicker } from './compound-picker';
import { ForecastAll } from './forecast-all';
import { ForecastCaution } from './forecast-caution';
import { usePlateForecast, usePlateForecastList } from './forecast-data';
import { ForecastDetail } from './forecast-detail';
import { ForecastComputing, ForecastFailed } from './forecast-status';

/** The plate's forecast tab: pick a compound, see its forecast (computed on the server when first asked for). */
export function PlateForecastPanel({ plateId }: { plateId: string }) {
  const list = usePlateForecastList(plateId);
  const [picked, setPicked] = useState<string | null>(null);
  const [chosenAt, setChosenAt] = useState<number | null>(null);
  const compounds = list.data?.compounds ?? [];
  const exposures = list.data?.exposures_uM ?? [];
  const selected =
    picked ?? compounds.find((c) => c.reason === null)?.compoundId ?? compounds[0]?.compoundId ?? null;
  const at = exposures.length ? (chosenAt ?? exposures.length - 1) : null;
  const forecast = usePlateForecast(plateId, selected, at);
  const refreshList = list.mutate;
  const computedNow =
    forecast.data?.forecast && !forecast.data.forecast.reused ? forecast.data.forecast.inputSha256 : null;
  useEffect(() => {
    if (computedNow) void refreshList();
  }, [computedNow, refreshList]);

  if (list.error)
    return (
      <p role="alert" className="text-signal-fail">
        The forecast tab could not be loaded: {list.error.message}
      </p>
    );
  if (!list.data)
    return (
      <p role="status" className="text-sm text-ink-500">
        Loading the plate’s compounds…
      </p>
    );
  const entry = compounds.find((c) => c.compoundId === selected);
  const shown = forecast.data?.compoundId === selected ? forecast.data : undefined;
  return (
    <div className="space-y-5">
      <ForecastCaution preset={list.data.preset} />
      {!compounds.length ? (
        <p className="gw-card border-dashed p-6 text-sm text-ink-700">
          This plate has no fitted test compounds, so there is nothing to forecast. Check the{' '}
          <AppLink className="underline" href={`/plates/${plateId}`}>
            wells and QC
          </AppLink>
          : fits appear once test wells pass QC.
        </p>
      ) : (
        <div className="grid gap-6 lg:grid-cols-[13rem_minmax(0,1fr)]">
          <div className="space-y-4">
            <CompoundPicker compounds={compounds} selected={selected} onPick={setPicked} />
            {at !== null ? <ForecastAll list={list.data} at={at} /> : null}
          </div>
          <section aria-labelledby="forecast-compound" className="min-w-0 space-y-4">
            <header className="flex flex-wrap items-baseline justify-between gap-2">
              <h3 id="forecast-compound" className="text-lg font-semibold">
                <span className="font-mono">{entry?.compound}</span> on {list.data.plate.label}
              </h3>
              {entry ? (
                <AppLink
                  className="text-sm text-lagoon-700 underline"
                  href={`/compounds/${entry.compoundId}/profile`}
                >
                  Compound profile across plates
                </AppLink>
              ) : null}
            </header>
            {at === null ? (
              <p className="gw-card border-dashed p-5 text-sm text-ink-700">{entry?.reason}</p>
            ) : forecast.error ? (
              <ForecastFailed message={forecast.error.message} onRetry={() => forecast.mutate()} />
            ) : !shown ? (
              <ForecastComputing>
                Computing the forecast of <span className="font-mono">{entry?.compound}</span>: control and
                every concentration of the sweep, with traces…
              </ForecastComputing>
            ) : (
              <ForecastDetail data={shown} at={at} onAt={setChosenAt} busy={forecast.isLoading} />
            )}
          </section>
        </div>
      )}
    </div>
  );
}
