import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { getCompoundProfile } from '@/lib/compounds/profile';
import type { ProfileFit } from '@/lib/compounds/profile-fits';
import { AppError } from '@/lib/errors';
import { FORECAST_CAUTION } from '@/lib/science/forecast/assemble';
import type { CompoundForecast } from '@/lib/validation/forecasts';
import { targetPotencies, type PotencyFit, type UseDependentFit } from './potency';
import { planCompoundForecast } from './request';
import { storedOrComputedPair } from './store';
import { potencyUncertainties, uncertaintyOf } from './uncertainty';
import { forecastView } from './view';

const potencyFit = (f: ProfileFit): PotencyFit => ({
  fitId: f.fitId,
  status: f.status,
  model: f.model,
  ic50_uM: f.ic50_uM,
  hill: f.hill,
  ic50LowerBound_uM: f.ic50LowerBound_uM,
  plate: { id: f.plateId, label: f.plateLabel, state: f.plateState },
});

/**
 * A compound's forecast at exposure across its screens: one potency per target from the profile
 * (approved plates first) on the preset and exposures of one screen (default: the first by name with an
 * approved fit, else the first by name). Stored without a plate and reused like a plate's forecast.
 */
export async function getCompoundForecast(
  actor: Actor,
  compoundId: string,
  options: { screenId?: string; at?: number } = {},
): Promise<CompoundForecast> {
  const profile = await getCompoundProfile(actor, compoundId);
  const screen = options.screenId
    ? profile.screens.find((s) => s.id === options.screenId)
    : (profile.screens.find((s) => s.hasApproved) ?? profile.screens[0]);
  if (!screen) {
    throw new AppError(
      'not_found',
      options.screenId
        ? `${profile.compound.identifier} has no fits in that screen.`
        : `${profile.compound.identifier} has no fits yet, so there is nothing to forecast.`,
    );
  }
  const chosen = new Map(profile.potencies.map((f) => [f.targetId, f]));
  const latest = new Map<string, ProfileFit>();
  // Each target's tonic fit gives its potency (Kr); the use-dependent fit of the same plate, Ki.
  for (const f of profile.fits)
    if (f.readout === 'tonic' && !latest.has(f.targetId)) latest.set(f.targetId, f);
  const targets = [...latest.values()].map((f) => ({
    id: f.targetId,
    name: f.target,
    conductance: f.conductance,
  }));
  const fitOf = (targetId: string) => {
    const f = chosen.get(targetId) ?? latest.get(targetId);
    return f ? potencyFit(f) : undefined;
  };
  const useDependentOf = (targetId: string): UseDependentFit | undefined => {
    const tonic = chosen.get(targetId) ?? latest.get(targetId);
    const f = tonic
      ? profile.fits.find(
          (x) => x.readout === 'use_dependent' && x.plateId === tonic.plateId && x.targetId === targetId,
        )
      : undefined;
    return f
      ? {
          fitId: f.fitId,
          status: f.status,
          model: f.model,
          ic50_uM: f.ic50_uM,
          hill: f.hill,
          readoutName: f.readoutName,
        }
      : undefined;
  };
  const potencies = targetPotencies(screen.neuronPreset, targets, fitOf, screen.exposures_uM, useDependentOf);
  const plan = planCompoundForecast(
    screen.neuronPreset,
    potencies,
    screen.exposures_uM,
    options.at,
    uncertaintyOf(potencies, await potencyUncertainties(potencies)),
  );
  const base = {
    compoundId,
    compound: profile.compound.identifier,
    screen: { id: screen.id, name: screen.name },
    preset: screen.neuronPreset,
    exposures_uM: screen.exposures_uM,
    targets: potencies,
    caution: FORECAST_CAUTION,
  };
  if ('reason' in plan) return { ...base, reason: plan.reason, forecast: null, stateDependent: null };
  const stored = await storedOrComputedPair({ plateId: null, compoundId, screenId: screen.id }, plan, {
    requestedBy: actor.id,
  });
  return {
    ...base,
    reason: null,
    forecast: forecastView(stored.tonic, screen.exposures_uM),
    stateDependent: stored.stateDependent ? forecastView(stored.stateDependent, screen.exposures_uM) : null,
  };
}
