// Figures of a load run: latency percentiles, error counts and requests per second, per group and route.
import type { Sample, Tally } from './run-people';

/** The p-th percentile (0 < p ≤ 100) of ascending values by the nearest-rank method; NaN when empty. */
export function percentile(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.max(0, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

export interface LatencyFigures {
  answers: number;
  p50: number;
  p95: number;
  p99: number;
  max: number;
}

export interface GroupFigures extends LatencyFigures {
  perSecond: number;
  non2xx: number;
  /** 304 answers: a body the person's browser held, asked again with its tag (counted as answered). */
  notModified: number;
  /** Non-2xx answers by status, e.g. { 500: 2 } (304 is not one of them). */
  statuses: Record<number, number>;
  socketErrors: number;
  timeouts: number;
  errors: number;
}

/** Percentiles of every answer's latency, whatever its status. */
export function latencyFigures(samples: readonly Sample[]): LatencyFigures {
  const sorted = samples.map((s) => s.ms).sort((a, b) => a - b);
  return {
    answers: sorted.length,
    p50: percentile(sorted, 50),
    p95: percentile(sorted, 95),
    p99: percentile(sorted, 99),
    max: sorted.at(-1) ?? Number.NaN,
  };
}

/** Whether an answer is refused: outside 2xx, except 304 for a body the browser's cache holds (a request without an answer has no status and is counted as a timeout or socket error instead). */
const refused = (status: number) => (status < 200 || status > 299) && status !== 304;

/** The figures of one group of people. */
export function groupFigures(tally: Tally): GroupFigures {
  const statuses: Record<number, number> = {};
  for (const { status } of tally.samples) if (refused(status)) statuses[status] = (statuses[status] ?? 0) + 1;
  const non2xx = Object.values(statuses).reduce((sum, count) => sum + count, 0);
  return {
    ...latencyFigures(tally.samples),
    perSecond: tally.seconds > 0 ? tally.samples.length / tally.seconds : 0,
    non2xx,
    notModified: tally.samples.filter((sample) => sample.status === 304).length,
    statuses,
    socketErrors: tally.socketErrors,
    timeouts: tally.timeouts,
    errors: non2xx + tally.socketErrors + tally.timeouts,
  };
}

/** Latency figures per route, in the order routes first answered. */
export function routeFigures(samples: readonly Sample[]): [string, LatencyFigures][] {
  const byRoute = new Map<string, Sample[]>();
  for (const sample of samples) {
    const list = byRoute.get(sample.route);
    if (list) list.push(sample);
    else byRoute.set(sample.route, [sample]);
  }
  return [...byRoute].map(([route, list]) => [route, latencyFigures(list)]);
}

const ms = (value: number) => (Number.isNaN(value) ? '—' : value.toFixed(1));

/** One report line of a group: answers, rate, percentiles and every kind of error. */
export function groupLine(name: string, figures: GroupFigures): string {
  const statuses = Object.entries(figures.statuses)
    .map(([status, count]) => `${status}×${count}`)
    .join(' ');
  return (
    `${name.padEnd(8)} ${String(figures.answers).padStart(6)} answers  ${figures.perSecond.toFixed(1).padStart(6)} req/s  ` +
    `p50 ${ms(figures.p50).padStart(7)}  p95 ${ms(figures.p95).padStart(7)}  p99 ${ms(figures.p99).padStart(7)}  max ${ms(figures.max).padStart(7)} ms  ` +
    `${figures.notModified ? `304 (browser's copy) ${figures.notModified}  ` : ''}` +
    `errors ${figures.errors} (non-2xx ${figures.non2xx}${statuses ? ` [${statuses}]` : ''}, socket ${figures.socketErrors}, timeouts ${figures.timeouts})`
  );
}

/** One report line of a route. */
export function routeLine(route: string, figures: LatencyFigures): string {
  return `  ${route.padEnd(30)} ${String(figures.answers).padStart(6)}  p50 ${ms(figures.p50).padStart(7)}  p95 ${ms(figures.p95).padStart(7)}  p99 ${ms(figures.p99).padStart(7)} ms`;
}

/**
 * Why the run misses its targets (reads p95 under the limit, no error in either group); empty when it
 * meets them. A group left out of the run is null.
 */
export function missedTargets(
  reads: GroupFigures | null,
  imports: GroupFigures | null,
  readP95LimitMs: number,
): string[] {
  const missed: string[] = [];
  if (reads && reads.answers === 0) missed.push('no read was answered');
  else if (reads && !(reads.p95 < readP95LimitMs))
    missed.push(`reads p95 ${ms(reads.p95)} ms is not under ${readP95LimitMs} ms`);
  if (reads && reads.errors > 0) missed.push(`${reads.errors} read error(s)`);
  if (imports && imports.errors > 0) missed.push(`${imports.errors} import error(s)`);
  if (imports && imports.answers === 0) missed.push('no import was answered');
  return missed;
}
