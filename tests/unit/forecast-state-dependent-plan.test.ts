// The app's forecast plan with two block readouts (issue 20 point 2): a target's tonic fit gives Kr and its
// use-dependent fit Ki, and the state-dependent request is the tonic one plus Ki (modulated receptor, Bean,
// Cohen & Tsien 1983, J Gen Physiol 81:613; authors and pages from memory). Checks: with Kr = Ki the
// closed form's shift is 0, so the state-dependent forecast must equal the tonic one exactly; with Ki ≪ Kr
// the blocker binds inactivated channels and a firing cell loses more of its rate than tonic block says
// (the paper's use dependence; the sign is what the model must show, no published number is compared).
import { randomUUID } from 'node:crypto';
import { describe, expect, test } from 'vitest';
import { targetPotencies, type PotencyFit, type UseDependentFit } from '@/lib/forecasts/potency';
import { planCompoundForecast, type PlannedForecast } from '@/lib/forecasts/request';
import { computeForecast } from '@/lib/science/forecast/forecast';

const nav = { id: randomUUID(), name: 'Nav1.7', conductance: 'gNa' };
const kv = { id: randomUUID(), name: 'Kv7.2', conductance: 'gK' };

const tonicFit = (ic50_uM: number): PotencyFit => ({
  fitId: randomUUID(),
  status: 'fitted',
  model: 'hill2',
  ic50_uM,
  hill: 1,
  ic50LowerBound_uM: null,
  plate: null,
});
const useFit = (ic50_uM: number | null, status: UseDependentFit['status'] = 'fitted'): UseDependentFit => ({
  fitId: randomUUID(),
  status,
  model: 'hill2',
  ic50_uM,
  hill: 1,
  readoutName: '10th pulse',
});

function plan(preset: string, kr: number, ki: number | null, exposures: number[]) {
  const potencies = targetPotencies(
    preset,
    [nav],
    () => tonicFit(kr),
    exposures,
    () => (ki === null ? undefined : useFit(ki)),
  );
  const planned = planCompoundForecast(preset, potencies, exposures);
  if ('reason' in planned) throw new Error(planned.reason);
  return { potencies, planned: planned as PlannedForecast };
}

/** The planned request without its traces and bands (the measures are what is compared). */
const lean = <T extends object>(r: T) => ({ ...r, trace: false as const, uncertainty: undefined });

describe('state-dependent forecast fed from the tonic and use-dependent fits', () => {
  test('no use-dependent fit: no state-dependent request', () => {
    const { potencies, planned } = plan('hh-squid-1952', 10, null, [1]);
    expect(potencies[0]!.stateDependence).toBeNull();
    expect(planned.stateRequest).toBeNull();
  });

  test('the use-dependent IC50 enters as Ki beside the tonic IC50 as Kr, the rest of the request unchanged', () => {
    const { potencies, planned } = plan('hh-squid-1952', 10, 0.3, [0.3, 1]);
    expect(potencies[0]!.stateDependence).toMatchObject({ inactivatedIc50_uM: 0.3, ic50_uM: 0.3 });
    expect(potencies[0]!.stateDependence!.note).toBe(
      'State-dependent case: tonic IC50 as Kr (resting channels), 10th pulse IC50 0.3 µM as Ki (inactivated channels).',
    );
    expect(planned.stateRequest!.potencies).toEqual({ gNa: { ic50: 10, hill: 1, inactivatedIc50: 0.3 } });
    expect({ ...planned.stateRequest, potencies: null }).toEqual({ ...planned.request, potencies: null });
  });

  test('Kr = Ki: the state-dependent forecast equals the tonic one', () => {
    const { planned } = plan('hh-squid-1952', 3, 3, [1, 3]);
    expect(planned.stateRequest!.potencies!.gNa!.inactivatedIc50).toBe(3);
    const tonic = computeForecast(lean(planned.request));
    const state = computeForecast(lean(planned.stateRequest!));
    expect(state.conditions.map((c) => c.measures)).toEqual(tonic.conditions.map((c) => c.measures));
    expect(state.control.measures).toEqual(tonic.control.measures);
  });

  // Where the model shows it: the fast-spiking preset. At its reference drive (2 × rheobase) the squid
  // axon does not fire repetitively even at control, and the regular-spiking preset's rate rises a little
  // under small inactivation shifts (lib/science/neuron/README.md), so neither can show a fall.
  test.each(['wang-buzsaki-1996'])(
    '%s: a use-dependent blocker (Ki = Kr/33) lowers the rate at the reference drive further than tonic block',
    (preset) => {
      const { planned } = plan(preset, 10, 0.3, [0.1, 1]);
      const tonic = computeForecast(lean(planned.request));
      const state = computeForecast(lean(planned.stateRequest!));
      const control = tonic.control.measures.referenceRate_Hz!;
      expect(state.control.measures.referenceRate_Hz).toBe(control);
      for (const c of [0.1, 1]) {
        const at = (f: typeof tonic) => f.conditions.find((x) => x.concentration === c)!;
        // The same tonic block at the same concentration: only the inactivation shift differs.
        expect(at(state).block.gNa).toBe(at(tonic).block.gNa);
        const tonicRate = at(tonic).measures.referenceRate_Hz!;
        expect(tonicRate).toBeGreaterThan(0);
        expect(control - at(state).measures.referenceRate_Hz!).toBeGreaterThan(control - tonicRate);
      }
    },
  );

  test('a conductance without an inactivation gate, or a use-dependent fit without an IC50, stays tonic', () => {
    const potencies = targetPotencies(
      'hh-squid-1952',
      [nav, kv],
      () => tonicFit(2),
      [1],
      (id) => (id === kv.id ? useFit(0.5) : useFit(null, 'inactive')),
    );
    const [kvP, navP] = potencies;
    expect(kvP!.stateDependence).toMatchObject({ inactivatedIc50_uM: null });
    expect(kvP!.stateDependence!.note).toBe(
      'gK has no inactivation gate in preset hh-squid-1952: the state-dependent case takes its tonic block only.',
    );
    expect(navP!.stateDependence!.note).toBe(
      'The 10th pulse fit gives no IC50 (inactive): the state-dependent case takes its tonic block only.',
    );
    const planned = planCompoundForecast('hh-squid-1952', potencies, [1]);
    expect('request' in planned && planned.stateRequest).toBeNull();
  });
});
