import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { listTemplates } from '@/lib/plates/templates';

/** Saved column mappings, by name. */
export const GET = withUser(async (_request, actor) =>
  NextResponse.json({ templates: await listTemplates(actor) }),
);
