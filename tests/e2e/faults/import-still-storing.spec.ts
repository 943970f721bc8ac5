import { expect, test } from '@playwright/test';
import pg from 'pg';
import { freshPotassiumExport, queryOne, screenshot, signedInContext } from '../support';

// A worker that takes an import and is held up storing it (here: a session holding a SHARE lock on
// plates, so the worker's insert waits) answers the person after a minute with "still storing" (202)
// instead of leaving the page waiting; the plate arrives once the worker gets through. The minute is
// the server's own wait for a running import (lib/plates/import-jobs.ts).
test('an import still being stored after a minute says so in the wizard, and the plate arrives later', async ({
  browser,
}) => {
  test.setTimeout(180_000);
  const label = `KV-SLOW-${Date.now() % 100_000}`;
  const { context, page } = await signedInContext(browser, 'biologist');
  const blocker = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await blocker.connect();
  try {
    await page.goto('/plates/import');
    await page.getByLabel('Screen').selectOption({ label: 'Potassium counter-screen (Kv7.2)' });
    await page
      .getByLabel(/Instrument export/)
      .setInputFiles({ name: 'kv-slow.csv', mimeType: 'text/csv', buffer: freshPotassiumExport() });
    await page.getByRole('button', { name: 'Read file' }).click();
    await expect(page.getByLabel('well position')).not.toHaveValue('');
    await page.getByRole('button', { name: 'Check every row' }).click();
    await expect(page.getByRole('region', { name: 'Preview of every row' })).toBeVisible();
    await page.getByLabel('Plate label').fill(label);

    await blocker.query('begin');
    await blocker.query('lock table plates in share mode');
    await page.getByRole('button', { name: 'Store plate' }).click();
    const notice = page.getByRole('status').filter({ hasText: 'still storing' });
    await expect(notice).toBeVisible({ timeout: 90_000 });
    await expect(notice.getByRole('link', { name: 'Open the plate list' })).toHaveAttribute(
      'href',
      '/plates',
    );
    await expect(page.getByRole('button', { name: 'Store plate' })).toBeDisabled();
    await screenshot(page, 'import-still-storing');
    const job = await queryOne<{ state: string }>(
      "select state from compute_jobs where kind = 'plate-import' order by created_at desc limit 1",
    );
    expect(job?.state).toBe('running');
    expect(await queryOne('select id from plates where label = $1', [label])).toBeUndefined();

    await blocker.query('rollback');
    await expect
      .poll(
        async () => (await queryOne<{ id: string }>('select id from plates where label = $1', [label]))?.id,
        { timeout: 30_000 },
      )
      .toBeTruthy();
    await notice.getByRole('link', { name: 'Open the plate list' }).click();
    await expect(page.getByRole('link', { name: label })).toBeVisible();
  } finally {
    await blocker.end();
    await context.close();
  }
});
