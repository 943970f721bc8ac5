import { gateTable } from './gate-tables';
import { gateInfTau, type CompiledModel } from './model';

/**
 * One integrator step for one model: gates from t−dt/2 to t+dt/2 at V(t), then V from t to t+dt
 * with the gates held. Returns V(t+dt) and updates the gates in place.
 */
export type MembraneStep = (gates: Float64Array, v_mV: number, current_uA_cm2: number) => number;

type StepFactory = (
  coef: Float64Array,
  vMin: number,
  inv: number,
  intervals: number,
  gMax: Float64Array,
  erev: Float64Array,
  dtOverC: number,
  exactGates: (gates: Float64Array, v: number) => void,
  instantGates: (gates: Float64Array, v: number) => void,
  shift: Float64Array,
) => MembraneStep;

const factories = new Map<string, StepFactory>();

/**
 * The step is generated as straight-line code for the model's layout (gate count, which gates each
 * conductance uses and their integer powers), so the loop does no indirection: about 1.5× faster
 * than a generic loop over the layout. Only integers from the compiled layout enter the source;
 * conductances, reversal potentials and rate tables are passed in as arrays.
 */
function stepFactory(model: CompiledModel): StepFactory {
  const nGates = model.gates.length;
  const stride = nGates * 2;
  const instantLayout = model.gates.map((g) => (g.kinetics.kind === 'instantaneous' ? 1 : 0)).join('');
  const shifted = model.gates.flatMap((g, j) => (g.shift_mV !== 0 ? [j] : []));
  const layout = `${nGates}|${instantLayout}|${shifted.join(',')}|${Array.from(model.termStart).join(',')}|${Array.from(model.termGate).join(',')}|${Array.from(model.termPower).join(',')}`;
  const hit = factories.get(layout);
  if (hit) return hit;
  const lines: string[] = [];
  lines.push('return function step(x, v, I) {');
  lines.push('  const u = (v - vMin) * inv;');
  // A shifted gate (state-dependent block) is looked up in the unshifted table at V − shift.
  for (const j of shifted) lines.push(`  const u${j} = (v - shift[${j}] - vMin) * inv;`);
  const inRange = ['u', ...shifted.map((j) => `u${j}`)].map((u) => `${u} >= 0 && ${u} < intervals`);
  lines.push(`  if (${inRange.join(' && ')}) {`);
  lines.push(`    const i = u | 0; const f = u - i; const b = i * ${stride};`);
  for (let j = 0; j < nGates; j++) {
    const a = 2 * j;
    if (shifted.includes(j)) {
      lines.push(
        `    { const i${j} = u${j} | 0; const f${j} = u${j} - i${j}; const p = i${j} * ${stride} + ${a}; x[${j}] = (coef[p] + f${j} * (coef[p + ${stride}] - coef[p])) * x[${j}] + coef[p + 1] + f${j} * (coef[p + ${stride + 1}] - coef[p + 1]); }`,
      );
      continue;
    }
    lines.push(
      `    { const p = b + ${a}; x[${j}] = (coef[p] + f * (coef[p + ${stride}] - coef[p])) * x[${j}] + coef[p + 1] + f * (coef[p + ${stride + 1}] - coef[p + 1]); }`,
    );
  }
  lines.push('  } else exactGates(x, v);');
  const instant = model.gates.flatMap((g, j) => (g.kinetics.kind === 'instantaneous' ? [j] : []));
  const declare = instant.length > 0 ? 'let' : 'const';
  for (let j = 0; j < nGates; j++) lines.push(`  ${declare} x${j} = x[${j}];`);
  const weights: string[] = [];
  const sums: string[] = [];
  for (let k = 0; k < model.g_mS_cm2.length; k++) {
    const factors = [`gMax[${k}]`];
    for (let t = model.termStart[k]!; t < model.termStart[k + 1]!; t++) {
      const gate = Number(model.termGate[t]);
      for (let p = 0; p < Number(model.termPower[t]); p++) factors.push(`x${gate}`);
    }
    sums.push(`w${k} = ${factors.join(' * ')};`);
    weights.push(`w${k}`);
  }
  sums.push(`g = ${weights.join(' + ')};`);
  sums.push(`gE = ${weights.map((w, k) => `${w} * erev[${k}]`).join(' + ')};`);
  sums.push('vInf = (I + gE) / g;');
  lines.push(`  let ${[...weights, 'g', 'gE', 'vInf'].join(', ')};`);
  for (const line of sums) lines.push(`  ${line}`);
  if (instant.length > 0) {
    // Instantaneous gates (x = x∞(V)) are taken at V(t) above; the corrector takes them at the midpoint
    // of the predicted step and repeats the V step, which keeps the scheme second order.
    lines.push('  const vm = 0.5 * (v + vInf + (v - vInf) * Math.exp(-dtOverC * g));');
    lines.push('  const um = (vm - vMin) * inv;');
    lines.push('  if (um >= 0 && um < intervals) {');
    lines.push(`    const i = um | 0; const f = um - i; const b = i * ${stride};`);
    for (const j of instant) {
      const a = 2 * j;
      lines.push(`    { const p = b + ${a + 1}; x[${j}] = coef[p] + f * (coef[p + ${stride}] - coef[p]); }`);
    }
    lines.push('  } else instantGates(x, vm);');
    for (const j of instant) lines.push(`  x${j} = x[${j}];`);
    for (const line of sums) lines.push(`  ${line}`);
  }
  lines.push('  return vInf + (v - vInf) * Math.exp(-dtOverC * g);');
  lines.push('};');
  const factory = new Function(
    'coef',
    'vMin',
    'inv',
    'intervals',
    'gMax',
    'erev',
    'dtOverC',
    'exactGates',
    'instantGates',
    'shift',
    lines.join('\n'),
  ) as StepFactory;
  factories.set(layout, factory);
  return factory;
}

/** The step function of a model for time step dt, with tabulated or exact rates. */
export function membraneStep(
  model: CompiledModel,
  dt_ms: number,
  rates: 'table' | 'exact' = 'table',
): MembraneStep {
  const table = rates === 'table' ? gateTable(model, dt_ms) : null;
  const infTau = new Float64Array(2);
  const exactGates = (x: Float64Array, v: number) => {
    for (let j = 0; j < x.length; j++) {
      gateInfTau(model.gates[j]!, v, infTau);
      const inf = infTau[0]!;
      x[j] = inf + (x[j]! - inf) * Math.exp(-dt_ms / infTau[1]!);
    }
  };
  const instantGates = (x: Float64Array, v: number) => {
    for (let j = 0; j < x.length; j++) {
      if (model.gates[j]!.kinetics.kind !== 'instantaneous') continue;
      gateInfTau(model.gates[j]!, v, infTau);
      x[j] = infTau[0]!;
    }
  };
  return stepFactory(model)(
    table?.coefficients ?? new Float64Array(0),
    table?.vMin_mV ?? 0,
    table?.invStep_per_mV ?? 0,
    table?.intervals ?? 0,
    model.g_mS_cm2,
    model.reversal_mV,
    dt_ms / model.capacitance_uF_cm2,
    exactGates,
    instantGates,
    Float64Array.from(model.gates, (g) => g.shift_mV),
  );
}
