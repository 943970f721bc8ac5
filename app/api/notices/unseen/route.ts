import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { unseenNoticeCount } from '@/lib/notices/service';

export const dynamic = 'force-dynamic';

/**
 * How many of the signed-in person's notices are new: the header's bell asks on a timer and when the
 * window comes back into view. A background read: it does not keep the session alive.
 */
export const GET = withUser(
  async (_request, actor) =>
    NextResponse.json(
      { unseen: await unseenNoticeCount(actor) },
      { headers: { 'Cache-Control': 'no-store' } },
    ),
  { background: true },
);
