// The demo scenario's invented compounds and targets (DESIGN.md, demo scenario). Every number here is invented.

/** Targets of the two demo screens: the sodium pain screen and the potassium counter-screen. */
export const DEMO_TARGETS = {
  'Nav1.7': { screen: 'Pain sodium screen', conductance: 'transient sodium', sign: -1, controlMedian_pA: 2500 },
  'Kv7.2': { screen: 'Potassium counter-screen', conductance: 'M-type potassium', sign: 1, controlMedian_pA: 900 },
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

/** A dozen invented sodium-channel blockers; some touch the potassium counter-target, some do not. */
export const DEMO_COMPOUNDS: DemoCompound[] = [
  { identifier: 'GW-0001', name: 'Demo blocker 1', molecularWeight: 342.4, truth: { 'Nav1.7': potency(0.045, 1.1), 'Kv7.2': potency(38, 1.0) } },
  { identifier: 'GW-0002', name: 'Demo blocker 2', molecularWeight: 368.9, truth: { 'Nav1.7': potency(0.21, 0.9), 'Kv7.2': potency(120, 1.0) } },
  { identifier: 'GW-0003', name: 'Demo blocker 3', molecularWeight: 301.3, truth: { 'Nav1.7': potency(1.3, 1.4), 'Kv7.2': potency(5.2, 1.1) } },
  { identifier: 'GW-0004', name: 'Demo blocker 4', molecularWeight: 415.5, truth: { 'Nav1.7': potency(0.018, 1.0), 'Kv7.2': potency(2.5, 0.8) } },
  { identifier: 'GW-0005', name: 'Demo blocker 5', molecularWeight: 289.7, truth: { 'Nav1.7': potency(3.8, 1.0), 'Kv7.2': potency(3000, 1.0) } },
  { identifier: 'GW-0006', name: 'Demo blocker 6', molecularWeight: 377.2, truth: { 'Nav1.7': potency(0.62, 1.8), 'Kv7.2': potency(45, 1.2) } },
  { identifier: 'GW-0007', name: 'Demo blocker 7', molecularWeight: 322.8, truth: { 'Nav1.7': potency(9.5, 0.65), 'Kv7.2': potency(9.0, 1.0) } },
  { identifier: 'GW-0008', name: 'Demo blocker 8', molecularWeight: 398.1, truth: { 'Nav1.7': potency(0.095, 1.2), 'Kv7.2': potency(3000, 1.0) } },
  { identifier: 'GW-0009', name: 'Demo blocker 9', molecularWeight: 276.3, truth: { 'Nav1.7': potency(60, 1.0), 'Kv7.2': potency(0.9, 1.3) } },
  { identifier: 'GW-0010', name: 'Demo blocker 10', molecularWeight: 351.0, truth: { 'Nav1.7': potency(0.33, 1.0), 'Kv7.2': potency(18, 0.9) } },
  { identifier: 'GW-0011', name: 'Demo blocker 11', molecularWeight: 310.6, truth: { 'Nav1.7': potency(5000, 1.0), 'Kv7.2': potency(3000, 1.0) } },
  { identifier: 'GW-0012', name: 'Demo blocker 12', molecularWeight: 433.9, truth: { 'Nav1.7': potency(2.1, 1.1), 'Kv7.2': potency(70, 1.0) } },
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
