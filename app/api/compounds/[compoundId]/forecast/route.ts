import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { getCompoundForecast } from '@/lib/forecasts/compound-forecast';
import { compoundForecastQuerySchema } from '@/lib/validation/forecasts';
import { parseId } from '@/lib/validation/ids';

/** The compound's forecast at exposure from its profile potencies (approved plates first), reused when stored. */
export const GET = withUser<{ compoundId: string }>(async (request, actor, { params }) => {
  const compoundId = parseId((await params).compoundId, 'compound');
  const query = compoundForecastQuerySchema.parse(Object.fromEntries(request.nextUrl.searchParams));
  return NextResponse.json(await getCompoundForecast(actor, compoundId, query));
});
