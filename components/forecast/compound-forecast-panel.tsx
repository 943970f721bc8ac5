'use client';

import { useState } from 'react';
import { useCompoundForecast } from './forecast-data';
import { ForecastDetail } from './forecast-detail';
import { ForecastComputing, ForecastFailed } from './forecast-status';

export interface ForecastScreen {
  id: string;
  name: string;
  neuronPreset: string;
  exposures_uM: number[];
  hasApproved: boolean;
}

/**
 * The compound's forecast at exposure: one potency per target across its screens, on the preset and
 * exposures of a chosen screen; computed on the server when first asked for, then stored.
 */
export function CompoundForecastPanel({
  compoundId,
  screens,
}: {
  compoundId: string;
  screens: ForecastScreen[];
}) {
  const [screenId, setScreenId] = useState((screens.find((s) => s.hasApproved) ?? screens[0])!.id);
  const [chosenAt, setChosenAt] = useState<number | null>(null);
  const screen = screens.find((s) => s.id === screenId)!;
  const at = screen.exposures_uM.length
    ? Math.min(chosenAt ?? Infinity, screen.exposures_uM.length - 1)
    : null;
  const forecast = useCompoundForecast(compoundId, screenId, at);
  const shown = forecast.data?.screen.id === screenId ? forecast.data : undefined;
  return (
    <div className="space-y-4">
      {screens.length > 1 ? (
        <div className="max-w-md">
          <label htmlFor="forecast-screen" className="gw-label">
            Preset and exposures of
          </label>
          <select
            id="forecast-screen"
            className="gw-input mt-1"
            value={screenId}
            onChange={(e) => {
              setScreenId(e.target.value);
              setChosenAt(null);
            }}
          >
            {screens.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name} ({s.neuronPreset},{' '}
                {s.exposures_uM.length ? s.exposures_uM.join(', ') + ' µM' : 'no exposures'})
              </option>
            ))}
          </select>
        </div>
      ) : null}
      {at === null ? (
        <p className="gw-card border-dashed p-5 text-sm text-ink-700">
          {screen.name} has no exposures of interest. An admin adds them on the screen’s page; the forecast
          runs at those concentrations.
        </p>
      ) : forecast.error ? (
        <ForecastFailed message={forecast.error.message} onRetry={() => forecast.mutate()} />
      ) : !shown ? (
        <ForecastComputing>
          Computing the forecast at exposure: control and every concentration of the sweep, with traces…
        </ForecastComputing>
      ) : (
        <ForecastDetail data={shown} at={at} onAt={setChosenAt} busy={forecast.isLoading} showPlate />
      )}
    </div>
  );
}
