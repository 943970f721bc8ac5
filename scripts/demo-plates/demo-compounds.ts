// The demo scenario's invented compounds and targets (DESIGN.md, demo scenario). Every number here is invented.

/** Targets of the two demo screens: the sodium pain screen and the potassium counter-screen. */
export const DEMO_TARGETS = {
  'Nav1.7': {
    screen: 'Pain sodium screen',
    conductance: 'transient sodium',
    sign: -1,
    controlMedian_pA: 2500,
  },
  'Kv7.2': {
    screen: 'Potassium counter-screen',
    conductance: 'M-type potassium',
    sign: 1,
    controlMedian_pA: 900,
  },
} as const;

export type DemoTarget = keyof typeof DEMO_TARGETS;

/** True potency of one compound on one target: IC50 (µM) and Hill slope. */
export interface TruePotency {
  ic50_uM: number;
  hillSlope: number;
}

/** An invented compound with its true potency on each demo target. */
export interface DemoCompound {
  identifier: string;
  name: string;
  /** Invented molecular weight, g/mol. */
  molecularWeight: number;
  truth: Record<DemoTarget, TruePotency>;
}

const potency = (ic50_uM: number, hillSlope: number): TruePotency => ({ ic50_uM, hillSlope });

/** The identifier of demo compound `n` (GW-0001 …). */
export const demoCompoundId = (n: number) => `GW-${String(n).padStart(4, '0')}`;

/** Demo compound `n`: its molecular weight (g/mol) and its true potency on Nav1.7 and on Kv7.2. */
const compound = (n: number, molecularWeight: number, nav: TruePotency, kv: TruePotency): DemoCompound => ({
  identifier: demoCompoundId(n),
  name: `Demo blocker ${n}`,
  molecularWeight,
  truth: { 'Nav1.7': nav, 'Kv7.2': kv },
});

/** A dozen invented sodium-channel blockers; some touch the potassium counter-target, some do not. */
export const DEMO_COMPOUNDS: DemoCompound[] = [
  compound(1, 342.4, potency(0.045, 1.1), potency(38, 1.0)),
  compound(2, 368.9, potency(0.21, 0.9), potency(120, 1.0)),
  compound(3, 301.3, potency(1.3, 1.4), potency(5.2, 1.1)),
  compound(4, 415.5, potency(0.018, 1.0), potency(2.5, 0.8)),
  compound(5, 289.7, potency(3.8, 1.0), potency(3000, 1.0)),
  compound(6, 377.2, potency(0.62, 1.8), potency(45, 1.2)),
  compound(7, 322.8, potency(9.5, 0.65), potency(9.0, 1.0)),
  compound(8, 398.1, potency(0.095, 1.2), potency(3000, 1.0)),
  compound(9, 276.3, potency(60, 1.0), potency(0.9, 1.3)),
  compound(10, 351.0, potency(0.33, 1.0), potency(18, 0.9)),
  compound(11, 310.6, potency(5000, 1.0), potency(3000, 1.0)),
  compound(12, 433.9, potency(2.1, 1.1), potency(70, 1.0)),
];

/** Identifier of vehicle wells (0 % block) and of the invented reference blocker (full block). */
export const VEHICLE_IDENTIFIER = 'DMSO';
export const REFERENCE_IDENTIFIER = 'REF';
/** Concentration written for reference wells, µM (invented). */
export const REFERENCE_CONCENTRATION_UM = 1;

/** Fractional block of simple pore block: `1 / (1 + (IC50 / C)^n)`. */
export function trueBlock(concentration_uM: number, truth: TruePotency): number {
  return 1 / (1 + (truth.ic50_uM / concentration_uM) ** truth.hillSlope);
}
