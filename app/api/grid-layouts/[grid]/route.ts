import { NextResponse } from 'next/server';
import { withUser } from '@/lib/api/handler';
import { AppError } from '@/lib/errors';
import { resetGridLayout, saveGridLayout } from '@/lib/preferences/grid-layouts';
import { gridLayoutSchema, gridNameSchema } from '@/lib/validation/grid-layouts';

const gridOf = (value: string) => {
  const parsed = gridNameSchema.safeParse(value);
  if (!parsed.success) throw new AppError('not_found', 'No such grid.');
  return parsed.data;
};

/** Keeps the signed-in person's layout of the grid; answers the layout as kept. */
export const PUT = withUser<{ grid: string }>(async (request, actor, { params }) => {
  const grid = gridOf((await params).grid);
  const body: unknown = await request.json().catch(() => {
    throw new AppError('invalid', 'Send the layout as JSON: {"columns": [{"id", "hidden", "width"}]}.');
  });
  const input = gridLayoutSchema(grid).parse(body);
  return NextResponse.json({ columns: await saveGridLayout(actor, grid, input.columns) });
});

/** Forgets the signed-in person's layout of the grid: its own columns again. */
export const DELETE = withUser<{ grid: string }>(async (_request, actor, { params }) => {
  await resetGridLayout(actor, gridOf((await params).grid));
  return new NextResponse(null, { status: 204 });
});
