import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { getPlateForecast, listPlateForecasts } from '@/lib/forecasts/plate-forecast';
import { plateForecastQuerySchema } from '@/lib/validation/forecasts';
import { parseId } from '@/lib/validation/ids';

/**
 * Without compoundId: every compound of the plate with its potencies and whether a forecast is stored.
 * With compoundId (and optionally at, the exposure for the traces): that compound's forecast, reused
 * from the forecasts table when the same input was computed before, otherwise computed and stored.
 */
export const GET = withUser<{ plateId: string }>(async (request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  const query = plateForecastQuerySchema.parse(Object.fromEntries(request.nextUrl.searchParams));
  if (!query.compoundId) return NextResponse.json(await listPlateForecasts(actor, plateId));
  return NextResponse.json(await getPlateForecast(actor, plateId, query.compoundId, query.at));
});
