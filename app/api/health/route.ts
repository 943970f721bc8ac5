import { NextResponse } from 'next/server';
import { checkHealth } from '@/lib/health';

export const dynamic = 'force-dynamic';

/** Database connectivity and migration state, for operators and start-up scripts. No sign-in needed. */
export async function GET() {
  const report = await checkHealth();
  return NextResponse.json(report, { status: report.status === 'ok' ? 200 : 503 });
}
