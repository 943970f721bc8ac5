import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { AppError } from '@/lib/errors';
import { getPlateHeader, listPlateFits, type FitRow, type PlateHeader } from '@/lib/plates/detail';
import { FORECAST_CAUTION } from '@/lib/science/forecast/assemble';
import type { CompoundForecast, PlateForecastList, TargetPotency } from '@/lib/validation/forecasts';
import { targetPotencies, type PotencyFit, type UseDependentFit } from './potency';
import { planCompoundForecast } from './request';
import { forecastInput, storedKeys, storedOrComputedPair } from './store';
import { potencyUncertainties, uncertaintyOf } from './uncertainty';
import { forecastView } from './view';

interface PlateContext {
  header: PlateHeader;
  exposures_uM: number[];
  compounds: { compoundId: string; compound: string; targets: TargetPotency[] }[];
}

/** The plate, its exposures (ascending) and each compound's potencies from this plate's fits. */
async function plateContext(actor: Actor, plateId: string): Promise<PlateContext> {
  const header = await getPlateHeader(actor, plateId);
  const fits = await listPlateFits(actor, plateId);
  const exposures_uM = [...header.exposures_uM].sort((a, b) => a - b);
  const plate = { id: header.id, label: header.label, state: header.state };
  const byCompound = new Map<
    string,
    { compound: string; fits: Map<string, FitRow>; useDependent: Map<string, FitRow> }
  >();
  // Each target's tonic fit gives its potency (Kr); its use-dependent fit, if any, Ki for the state-dependent case.
  for (const fit of fits) {
    const entry = byCompound.get(fit.compoundId) ?? {
      compound: fit.compound,
      fits: new Map(),
      useDependent: new Map(),
    };
    (fit.readout === 'tonic' ? entry.fits : entry.useDependent).set(fit.targetId, fit);
    byCompound.set(fit.compoundId, entry);
  }
  const useDependentFit = (f: FitRow): UseDependentFit => ({
    fitId: f.id,
    status: f.status as UseDependentFit['status'],
    model: f.model,
    ic50_uM: f.ic50_uM,
    hill: f.hill,
    readoutName: f.readoutName,
  });
  const compounds = [...byCompound]
    .filter(([, entry]) => entry.fits.size > 0)
    .map(([compoundId, { compound, fits: own, useDependent }]) => ({
      compoundId,
      compound,
      targets: targetPotencies(
        header.neuronPreset,
        header.targets,
        (targetId) => {
          const f = own.get(targetId);
          return f
            ? ({
                fitId: f.id,
                status: f.status,
                model: f.model,
                ic50_uM: f.ic50_uM,
                hill: f.hill,
                ic50LowerBound_uM: f.ic50LowerBound_uM,
                plate,
              } as PotencyFit)
            : undefined;
        },
        exposures_uM,
        (targetId) => {
          const f = useDependent.get(targetId);
          return f ? useDependentFit(f) : undefined;
        },
      ),
    }));
  return { header, exposures_uM, compounds };
}

/** Every compound of the plate with its potencies, whether it can be forecast, and whether its forecast is stored. */
export async function listPlateForecasts(actor: Actor, plateId: string): Promise<PlateForecastList> {
  const { header, exposures_uM, compounds } = await plateContext(actor, plateId);
  // A compound counts as stored when its forecast is, with the traces at any of the exposures.
  const uncertainty = await potencyUncertainties(compounds.flatMap((c) => c.targets));
  const plans = compounds.map((c) =>
    exposures_uM.map((_, at) =>
      planCompoundForecast(
        header.neuronPreset,
        c.targets,
        exposures_uM,
        at,
        uncertaintyOf(c.targets, uncertainty),
      ),
    ),
  );
  // Each variant's keys: the tonic forecast's and, when it has one, the state-dependent one's.
  const keys = plans.map((variants) =>
    variants.flatMap((p) =>
      'request' in p
        ? [[p.request, ...(p.stateRequest ? [p.stateRequest] : [])].map((r) => forecastInput(r).inputSha256)]
        : [],
    ),
  );
  const stored = await storedKeys(header.id, keys.flat(2));
  return {
    plate: { id: header.id, label: header.label, state: header.state },
    preset: header.neuronPreset,
    exposures_uM,
    compounds: compounds.map((c, i) => {
      const plan = plans[i]![0] ?? planCompoundForecast(header.neuronPreset, c.targets, exposures_uM);
      return {
        ...c,
        reason: 'reason' in plan ? plan.reason : null,
        stored: keys[i]!.some((variant) => variant.every((k) => stored.has(k))),
      };
    }),
    caution: FORECAST_CAUTION,
  };
}

/**
 * One compound's forecast on the plate, from this plate's fits at the screen's exposures and sweep,
 * with traces at exposure `at` (default the highest): reused when stored, otherwise computed by a
 * forecast job (or here, with `here: true`, when the caller is a job itself) and stored.
 */
export async function getPlateForecast(
  actor: Actor,
  plateId: string,
  compoundId: string,
  at?: number,
  options: { here?: boolean } = {},
): Promise<CompoundForecast> {
  const { header, exposures_uM, compounds } = await plateContext(actor, plateId);
  const entry = compounds.find((c) => c.compoundId === compoundId);
  if (!entry) throw new AppError('not_found', `No compound with that id is tested on plate ${header.label}.`);
  const plan = planCompoundForecast(
    header.neuronPreset,
    entry.targets,
    exposures_uM,
    at,
    uncertaintyOf(entry.targets, await potencyUncertainties(entry.targets)),
  );
  const base = {
    compoundId,
    compound: entry.compound,
    screen: { id: header.screenId, name: header.screenName },
    preset: header.neuronPreset,
    exposures_uM,
    targets: entry.targets,
    caution: FORECAST_CAUTION,
  };
  if ('reason' in plan) return { ...base, reason: plan.reason, forecast: null, stateDependent: null };
  const stored = await storedOrComputedPair(
    { plateId: header.id, compoundId, screenId: header.screenId },
    plan,
    { here: options.here ?? false, requestedBy: actor.id },
  );
  return {
    ...base,
    reason: null,
    forecast: forecastView(stored.tonic, exposures_uM),
    stateDependent: stored.stateDependent ? forecastView(stored.stateDependent, exposures_uM) : null,
  };
}
