import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { AppError } from '@/lib/errors';
import { startPlateForecasts } from '@/lib/forecasts/plate-run';
import { plateJobs } from '@/lib/jobs/progress';
import { parseId } from '@/lib/validation/ids';
import { startForecastRunSchema } from '@/lib/validation/jobs';

/** The plate's fit state and its recent fit and forecast-run jobs with their progress. */
export const GET = withUser<{ plateId: string }>(async (_request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  return NextResponse.json(await plateJobs(actor, plateId), { headers: { 'Cache-Control': 'no-store' } });
});

/** Queues a forecast run over the plate (every forecast not yet stored); 202 with the job id. */
export const POST = withUser<{ plateId: string }>(async (request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  const body: unknown = await request.json().catch(() => {
    throw new AppError('invalid', 'Send the run as JSON, e.g. {} or {"at": 2}.');
  });
  const input = startForecastRunSchema.parse(body);
  const job = await startPlateForecasts(actor, plateId, input.at ?? null);
  return NextResponse.json(job, { status: 202 });
});
