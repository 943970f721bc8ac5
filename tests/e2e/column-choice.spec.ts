import { expect, test, type Page } from '@playwright/test';
import { queryOne, shootAtTwoSizes, signedInContext } from './support';

// The wells grid keeps each person's column choice on the server: a column hidden, one moved and one
// widened in one browser are there on the next visit and in another browser of the same person, and
// "Reset columns" brings back the grid's own columns everywhere.

test.describe.configure({ timeout: 120_000 });

const ownLayout = () =>
  queryOne<{ columns: { id: string; hidden: boolean; width: number | null }[] }>(
    `select l.columns from user_grid_layouts l join users u on u.id = l.user_id
      where u.email = 'approver@gatewell.test' and l.grid = 'plate-wells'`,
  );

/** The header texts of the wells grid, left to right (the pinned well column first). */
const headers = (page: Page) =>
  page
    .getByRole('region', { name: /^Wells of / })
    .locator('.ag-header-cell')
    .evaluateAll((cells) =>
      cells
        .map((c) => ({ x: c.getBoundingClientRect().left, text: c.textContent?.trim() ?? '' }))
        .sort((a, b) => a.x - b.x)
        .map((c) => c.text),
    );

const headerWidth = (page: Page, colId: string) =>
  page
    .getByRole('region', { name: /^Wells of / })
    .locator(`.ag-header-cell[col-id="${colId}"]`)
    .evaluate((c) => c.getBoundingClientRect().width);

test('a column choice follows the person to another browser, and resets', async ({ browser }) => {
  // A plate of the demo data the approver reads; no layout kept for the approver yet.
  const plate = (await queryOne<{ id: string }>(
    `select id from plates where format = 96 order by imported_at limit 1`,
  ))!;
  await queryOne(
    `delete from user_grid_layouts where user_id = (select id from users where email = 'approver@gatewell.test')`,
  );

  const first = await signedInContext(browser, 'approver');
  const page = first.page;
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto(`/plates/${plate.id}`);
  const grid = page.getByRole('region', { name: /^Wells of / });
  await expect(grid.getByRole('columnheader', { name: 'Seal resistance (GΩ)' })).toBeVisible();
  await expect(page.getByText('The grid’s own columns')).toBeVisible();
  const before = await headers(page);
  expect(before.slice(0, 3)).toEqual(['Well', 'Role', 'Compound']);
  const roleWidth = await headerWidth(page, 'role');

  // Hide a column and move one, through the columns menu.
  await page.getByText(/^Columns \(12 of 12 shown\)$/).click();
  const menu = page.getByRole('group', { name: 'Columns of the wells grid' });
  await menu.getByRole('checkbox', { name: 'Seal resistance (GΩ)' }).uncheck();
  await menu.getByRole('button', { name: 'Move Compound earlier' }).click();
  await expect(menu.getByRole('checkbox', { name: /^Well/ })).toBeDisabled();
  expect((await headers(page)).slice(0, 3)).toEqual(['Well', 'Compound', 'Role']);
  await page.getByText(/^Columns \(11 of 12 shown\)$/).click();
  await expect(grid.getByRole('columnheader', { name: 'Seal resistance (GΩ)' })).toHaveCount(0);
  // Widen the role column by dragging its header's edge 80 px.
  const edge = grid.locator('.ag-header-cell[col-id="role"] .ag-header-cell-resize');
  const box = (await edge.boundingBox())!;
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width / 2 + 40, box.y + box.height / 2, { steps: 4 });
  await page.mouse.move(box.x + box.width / 2 + 80, box.y + box.height / 2, { steps: 4 });
  await page.mouse.up();
  await expect(page.getByText('Column choice saved for you.')).toBeVisible();
  await expect(page.getByText('Your own column choice')).toBeVisible();
  // The grid itself still shows the moved order after the renders the menu, the drag and the save
  // caused (a grid that rebuilt its columns on a render put them back in their defined order).
  expect((await headers(page)).slice(0, 3)).toEqual(['Well', 'Compound', 'Role']);

  // Kept on the server: the order, the hidden column, the width chosen.
  await expect
    .poll(async () => (await ownLayout())?.columns.find((c) => c.id === 'role')?.width ?? 0)
    .toBeGreaterThan(roleWidth + 60);
  const kept = (await ownLayout())!.columns;
  expect(kept.slice(0, 3).map((c) => c.id)).toEqual(['position', 'compound', 'role']);
  expect(kept.find((c) => c.id === 'sealResistance_GOhm')?.hidden).toBe(true);
  expect(kept.filter((c) => c.hidden).map((c) => c.id)).toEqual(['sealResistance_GOhm']);

  // Another browser of the same person opens on it.
  const second = await signedInContext(browser, 'approver');
  const other = second.page;
  await other.setViewportSize({ width: 1440, height: 900 });
  await other.goto(`/plates/${plate.id}`);
  const otherGrid = other.getByRole('region', { name: /^Wells of / });
  await expect(otherGrid.getByRole('columnheader', { name: 'Concentration (µM)' })).toBeVisible();
  await expect(otherGrid.getByRole('columnheader', { name: 'Seal resistance (GΩ)' })).toHaveCount(0);
  expect((await headers(other)).slice(0, 3)).toEqual(['Well', 'Compound', 'Role']);
  expect(await headerWidth(other, 'role')).toBeGreaterThan(roleWidth + 60);
  await expect(other.getByText('Your own column choice')).toBeVisible();
  await shootAtTwoSizes(other, 'wells-grid-own-columns');
  await other.getByText(/^Columns \(11 of 12 shown\)$/).click();
  const otherMenu = other.getByRole('group', { name: 'Columns of the wells grid' });
  for (const [width, height] of [
    [1440, 900],
    [1024, 768],
  ] as const) {
    await other.setViewportSize({ width, height });
    // The open menu in view, whatever the window's height.
    await otherMenu.scrollIntoViewIfNeeded();
    await other.screenshot({
      path: `test-output/screenshots/wells-grid-columns-menu-${width}x${height}.png`,
    });
  }
  await other.getByText(/^Columns \(11 of 12 shown\)$/).click();

  // Reset: the grid's own columns at once, forgotten on the server, and so on the next visit.
  const reset = other.getByRole('button', { name: 'Reset columns' });
  await reset.click();
  await expect(other.getByText('Columns reset to the grid’s own.')).toBeVisible();
  await expect(otherGrid.getByRole('columnheader', { name: 'Seal resistance (GΩ)' })).toBeVisible();
  expect(await headers(other)).toEqual(before);
  expect(await ownLayout()).toBeUndefined();
  await page.reload();
  await expect(grid.getByRole('columnheader', { name: 'Seal resistance (GΩ)' })).toBeVisible();
  expect(await headers(page)).toEqual(before);
  await expect(page.getByText('The grid’s own columns')).toBeVisible();

  await first.context.close();
  await second.context.close();
});

test('a layout naming a column twice or hiding the well column is refused, nothing kept', async ({
  browser,
}) => {
  await queryOne(
    `delete from user_grid_layouts where user_id = (select id from users where email = 'approver@gatewell.test')`,
  );
  const { context, page } = await signedInContext(browser, 'approver');
  await page.goto('/');
  const origin = new URL(page.url()).origin;
  for (const columns of [
    [
      { id: 'role', hidden: false, width: null },
      { id: 'role', hidden: true, width: null },
    ],
    [{ id: 'position', hidden: true, width: null }],
    [{ id: 'no-such-column', hidden: false, width: null }],
    [{ id: 'role', hidden: false, width: 5 }],
  ]) {
    const answer = await page.request.put('/api/grid-layouts/plate-wells', {
      headers: { origin },
      data: { columns },
    });
    expect(answer.status(), JSON.stringify(columns)).toBe(422);
  }
  expect(
    (await page.request.put('/api/grid-layouts/no-such-grid', { headers: { origin }, data: {} })).status(),
  ).toBe(404);
  expect(await ownLayout()).toBeUndefined();
  await context.close();
});
