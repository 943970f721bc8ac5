import 'server-only';
import type { Transaction } from 'sequelize';
import { contentSha256 } from '@/lib/auth/canonical-json';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import type { ForecastResult } from '@/lib/science/forecast/assemble';
import { runForecast } from '@/lib/compute/forecast-pool';
import {
  ForecastRequestError,
  parseForecastRequest,
  type ForecastRequest,
} from '@/lib/science/forecast/request-schema';
import type { ForecastPayload } from '@/lib/jobs/payloads';
import { waitForJob } from '@/lib/jobs/progress';
import { enqueueJob } from '@/lib/jobs/queue';
import { Forecast } from '@/models';
import { lockForecastInput, selectStoredForecast, selectStoredKeys } from './queries';
import { FORECAST_ENGINE } from './request';

export interface StoredForecast {
  result: ForecastResult;
  inputSha256: string;
  computedAt: string;
  /** True when an earlier computation of the same input was found and nothing was computed. */
  reused: boolean;
}

export interface ForecastOwner {
  plateId: string | null;
  compoundId: string;
  screenId: string;
}

/** The stored input of a forecast request and its key (SHA-256 of the canonical JSON). */
export function forecastInput(request: ForecastRequest): {
  input: Record<string, unknown>;
  inputSha256: string;
} {
  const input = { engine: FORECAST_ENGINE, request };
  return { input, inputSha256: contentSha256(input) };
}

async function findStored(owner: ForecastOwner, inputSha256: string, transaction?: Transaction) {
  const row = await selectStoredForecast(owner, inputSha256, transaction);
  return row
    ? { result: row.result, inputSha256, computedAt: new Date(row.computedAt).toISOString(), reused: true }
    : null;
}

/** Which of these keys already have a stored forecast for the owner's plate and compounds. */
export async function storedKeys(plateId: string, inputSha256s: string[]): Promise<Set<string>> {
  if (inputSha256s.length === 0) return new Set();
  const rows = await selectStoredKeys(plateId, inputSha256s);
  return new Set(rows.map((r) => r.sha));
}

/**
 * Computes a forecast here, on this process's worker threads, and stores it (the forecast job's work,
 * runForecastJob). Two computations racing for the same input store one row.
 */
export async function computeAndStoreForecast(
  owner: ForecastOwner,
  request: ForecastRequest,
): Promise<StoredForecast> {
  const { input, inputSha256 } = forecastInput(request);
  const found = await findStored(owner, inputSha256);
  if (found) return found;
  let computed: ForecastResult;
  try {
    // Stored as JSON; the answer is the same JSON whether computed now or read back later.
    computed = JSON.parse(JSON.stringify(await runForecast(request))) as ForecastResult;
  } catch (error) {
    if (error instanceof ForecastRequestError)
      throw new AppError('invalid', `The forecast cannot run: ${error.message}`);
    throw error;
  }
  return db().transaction(async (transaction) => {
    await lockForecastInput(inputSha256, transaction);
    const raced = await findStored(owner, inputSha256, transaction);
    if (raced) return raced;
    const row = await Forecast.create(
      {
        plateId: owner.plateId,
        compoundId: owner.compoundId,
        screenId: owner.screenId,
        preset: request.preset,
        inputSha256,
        input,
        result: computed as unknown as Record<string, unknown>,
      },
      { transaction },
    );
    return {
      result: computed,
      inputSha256,
      computedAt: new Date(row.computedAt).toISOString(),
      reused: false,
    };
  });
}

/** How long a web request waits for a queued forecast before answering that it is still queued. */
export const FORECAST_WAIT_MS = 45_000;

/** The forecast job's handler (lib/jobs/registry.ts): computes and stores the forecast here. */
export async function runForecastJob(payload: ForecastPayload): Promise<string> {
  const stored = await computeAndStoreForecast(payload.owner, payload.request);
  return stored.reused ? 'Already stored.' : 'Computed and stored.';
}

/**
 * The forecast of a request: the stored one when the same input was computed before; otherwise a
 * forecast job is queued (or joined, when someone asked for the same input a moment ago) and its
 * result awaited. `here: true` computes in this process instead (used by jobs themselves).
 */
export async function storedOrComputedForecast(
  owner: ForecastOwner,
  request: ForecastRequest,
  options: { here?: boolean; requestedBy?: string | null } = {},
): Promise<StoredForecast> {
  if (options.here) return computeAndStoreForecast(owner, request);
  const { inputSha256 } = forecastInput(request);
  const found = await findStored(owner, inputSha256);
  if (found) return found;
  try {
    parseForecastRequest(request);
  } catch (error) {
    if (error instanceof ForecastRequestError)
      throw new AppError('invalid', `The forecast cannot run: ${error.message}`);
    throw error;
  }
  const job = await enqueueJob({
    kind: 'forecast',
    key: `forecast:${owner.plateId ?? 'profile'}:${owner.compoundId}:${inputSha256}`,
    data: { owner, request },
    plateId: owner.plateId,
    compoundId: owner.compoundId,
    requestedBy: options.requestedBy ?? null,
    joinRunning: true,
  });
  const finished = await waitForJob(job.id, FORECAST_WAIT_MS);
  if (finished.state === 'failed')
    throw new AppError('invalid', `The forecast failed: ${finished.message ?? 'no reason was given.'}`);
  const stored = finished.state === 'done' ? await findStored(owner, inputSha256) : null;
  if (!stored) {
    throw new AppError(
      'unavailable',
      'The forecast is queued but no worker has finished it yet; it will be stored when one does. Try again in a minute.',
      { jobId: job.id },
    );
  }
  return { ...stored, reused: false };
}

/**
 * The tonic-only forecast of a plan and, when it has one, its state-dependent twin (each its own stored
 * input, so a tonic forecast stored before use-dependent readouts existed is reused as it is).
 */
export async function storedOrComputedPair(
  owner: ForecastOwner,
  plan: { request: ForecastRequest; stateRequest: ForecastRequest | null },
  options: { here?: boolean; requestedBy?: string | null } = {},
): Promise<{ tonic: StoredForecast; stateDependent: StoredForecast | null }> {
  const [tonic, stateDependent] = await Promise.all([
    storedOrComputedForecast(owner, plan.request, options),
    plan.stateRequest ? storedOrComputedForecast(owner, plan.stateRequest, options) : null,
  ]);
  return { tonic, stateDependent };
}
