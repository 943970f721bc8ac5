import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { fitsSettled, freshPotassiumExport, signedInContext } from './support';

/**
 * The plate map's colourings, legends, keyboard and well facts; the chemist's compound map; a 1536-well
 * map; the dose-response plot's tested range, band, hollow excluded wells and SVG download. One plate of
 * the demo potassium export and one invented 1536-well export, both imported here through the one-request
 * import, so the demo plates other tests use stay as they are.
 */

interface WellJson {
  id: string;
  position: string;
  rowIndex: number;
  columnIndex: number;
  role: 'vehicle' | 'reference' | 'test';
  compound: string | null;
  concentration_uM: number | null;
  fractionalBlock: number | null;
  excluded: boolean;
  qcReasons: unknown[];
}

const SHOTS = 'test-results';

async function importPlate(page: Page, name: string, buffer: Buffer, label: string): Promise<string> {
  const origin = new URL(page.url()).origin;
  const response = await page.request.post('/api/imports/plate', {
    headers: { origin },
    multipart: { screen: 'Potassium counter-screen', label, file: { name, mimeType: 'text/csv', buffer } },
    timeout: 120_000,
  });
  expect(response.status(), await response.text()).toBe(201);
  return ((await response.json()) as { plateId: string }).plateId;
}

async function wellsOf(page: Page, plateId: string): Promise<WellJson[]> {
  return ((await (await page.request.get(`/api/plates/${plateId}/wells`)).json()) as { wells: WellJson[] })
    .wells;
}

/** The fill the map drew for a well, by its position. */
const fillOf = (page: Page, position: string) =>
  page.locator(`[role="grid"] [data-well="${position}"]`).first().getAttribute('data-fill');

/**
 * An invented 1536-well export in the demo potassium layout (one row per well): vehicle in columns 1–2,
 * reference blocker in 47–48, the twelve demo compounds down the columns between at eight concentrations.
 */
function export1536(): Buffer {
  const header =
    'Well,Well type,Compound,Conc (µM),Target,I control (pA),I compound (pA),Rseal (GΩ),Rs (MΩ),Cm (pF)';
  const series = [0.01, 0.03, 0.1, 0.3, 1, 3, 10, 30];
  const letters = (r: number) => (r < 26 ? String.fromCharCode(65 + r) : `A${String.fromCharCode(39 + r)}`);
  const lines = [header];
  for (let r = 0; r < 32; r += 1)
    for (let c = 0; c < 48; c += 1) {
      const well = `${letters(r)}${String(c + 1).padStart(2, '0')}`;
      const index = r + 32 * (c - 2);
      const kind = c < 2 ? 'VEH' : c >= 46 ? 'REF' : 'TEST';
      const compound =
        kind === 'VEH'
          ? 'DMSO'
          : kind === 'REF'
            ? 'REF'
            : `GW-${String((Math.floor(index / 8) % 12) + 1).padStart(4, '0')}`;
      const conc = kind === 'VEH' ? '' : kind === 'REF' ? '1' : String(series[index % 8]);
      const ratio = kind === 'VEH' ? 0.95 : kind === 'REF' ? 0.03 : 0.9 - 0.1 * (index % 8);
      lines.push(`${well},${kind},${compound},${conc},Kv7.2,900,${(900 * ratio).toFixed(1)},1.5,5,18`);
    }
  return Buffer.from(lines.join('\n') + '\n', 'utf8');
}

test('plate map colourings, keyboard and facts; compound map; 1536 wells; plots and SVG', async ({
  browser,
}) => {
  test.setTimeout(240_000);
  const { context, page } = await signedInContext(browser, 'biologist');
  const tag = randomBytes(3).toString('hex');
  const plateId = await importPlate(page, 'kv-map.csv', freshPotassiumExport(), `MAP-96-${tag}`);
  await fitsSettled(page, plateId);
  let wells = await wellsOf(page, plateId);

  // Exclude one well of a compound the fits use, so the map and the plot have an excluded well.
  const victim = wells.find(
    (w) => w.role === 'test' && w.compound === 'GW-0009' && w.qcReasons.length === 0,
  )!;
  const excluded = await page.request.post(`/api/plates/${plateId}/exclusions`, {
    headers: { origin: new URL(page.url()).origin },
    data: { wellIds: [victim.id], excluded: true, reason: 'map e2e: bubble in the well' },
  });
  expect(excluded.status(), await excluded.text()).toBe(200);
  await fitsSettled(page, plateId);
  wells = await wellsOf(page, plateId);

  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto(`/plates/${plateId}`);
  const map = page.getByRole('grid', { name: /Plate map of Kv7.2/ });
  await expect(map).toBeVisible();
  const legend = page.getByTestId('map-legend');
  const pick = (test: (w: WellJson) => boolean) => wells.find(test)!;
  const tests = wells.filter((w) => w.role === 'test');
  // Pairs of wells whose facts differ under each colouring (read from the wells answer, not from colours).
  const a = tests[0]!;
  const otherCompound = pick((w) => w.role === 'test' && w.compound !== a.compound);
  const sameCompound = pick((w) => w.role === 'test' && w.compound === a.compound && w.id !== a.id);
  const otherConcentration = pick(
    (w) => w.role === 'test' && w.concentration_uM !== a.concentration_uM && !w.excluded,
  );
  const vehicle = pick((w) => w.role === 'vehicle');
  const kept = pick((w) => !w.excluded && w.qcReasons.length === 0);
  const lowBlock = tests
    .filter((w) => w.fractionalBlock !== null)
    .sort((x, y) => x.fractionalBlock! - y.fractionalBlock!);

  const modes: [string, string, [WellJson, WellJson][]][] = [
    ['Fractional block', '100 %', [[lowBlock[0]!, lowBlock.at(-1)!]]],
    ['QC status', 'QC failed', [[victim, kept]]],
    [
      'Compound',
      otherCompound.compound!,
      [
        [a, otherCompound],
        [a, vehicle],
      ],
    ],
    [
      'Concentration',
      'No concentration (vehicle)',
      [
        [a, otherConcentration],
        [a, vehicle],
      ],
    ],
    ['Role', 'Reference blocker', [[a, vehicle]]],
    ['Excluded wells', 'Kept', [[victim, kept]]],
  ];
  for (const [mode, legendText, pairs] of modes) {
    await page.getByRole('radio', { name: mode, exact: true }).check();
    await expect(
      page.getByRole('grid', { name: new RegExp(`coloured by ${mode.toLowerCase()}$`) }),
    ).toBeVisible();
    await expect(page.getByRole('group', { name: `Legend: ${mode}` })).toBeVisible();
    await expect(legend).toContainText(legendText);
    for (const [x, y] of pairs)
      expect(await fillOf(page, x.position), `${mode}: ${x.position} vs ${y.position}`).not.toBe(
        await fillOf(page, y.position),
      );
  }
  // Wells with the same compound share its colour, and the legend names every compound of the plate.
  await page.getByRole('radio', { name: 'Compound', exact: true }).check();
  expect(await fillOf(page, a.position)).toBe(await fillOf(page, sameCompound.position));
  for (const compound of new Set(tests.map((w) => w.compound!))) await expect(legend).toContainText(compound);

  // The keyboard moves the focus and the facts box follows; the pointer shows a well's facts too.
  const at = (r: number, c: number) => pick((w) => w.rowIndex === r && w.columnIndex === c);
  const facts = page.getByRole('region', { name: 'Well facts' });
  await map.focus();
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('ArrowDown');
  await expect(facts).toContainText(at(1, 1).position);
  await expect(facts).toContainText(at(1, 1).compound ?? 'vehicle');
  await expect(map).toHaveAttribute('aria-activedescendant', `well-${at(1, 1).id}`);
  await page.keyboard.press('End');
  await expect(facts).toContainText(at(1, 11).position);
  await page.locator(`[data-well="${victim.position}"]`).hover();
  await expect(facts).toContainText(victim.position);
  await expect(facts).toContainText('map e2e: bubble in the well');

  // The wells grid: full headers with units, not cut; the well column pinned; wells filtered by QC.
  const grid = page.getByRole('region', { name: 'Wells of Kv7.2' });
  for (const header of ['Concentration (µM)', 'Current with compound (pA)', 'Seal resistance (GΩ)'])
    await expect(grid.getByRole('columnheader', { name: header })).toBeVisible();
  const cut = await grid
    .locator('.ag-header-cell-text')
    .evaluateAll((cells) => cells.filter((c) => c.scrollWidth > c.clientWidth + 1).map((c) => c.textContent));
  expect(cut).toEqual([]);
  await expect(
    grid.locator('.ag-grid-pinned-left-cells').getByRole('columnheader', { name: 'Well' }),
  ).toBeVisible();
  const failing = wells.filter((w) => w.qcReasons.length > 0).length;
  expect(failing).toBeGreaterThan(0);
  await page.getByLabel('Wells by QC').selectOption({ label: 'QC failed, any reason' });
  await expect(page.getByText(`${failing} of ${wells.length} wells shown`)).toBeVisible();
  await page.getByLabel('Wells by QC').selectOption({ label: 'All wells' });
  await page.screenshot({ path: `${SHOTS}/plate-map-1440x900.png`, fullPage: true });
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.screenshot({ path: `${SHOTS}/plate-map-1024x768.png`, fullPage: true });

  // The fit of GW-0009: solid across the tested range, dashed beyond, band in the legend, excluded hollow.
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto(`/plates/${plateId}/fits`);
  const card = page.getByRole('article').filter({ hasText: 'GW-0009' });
  const plot = card.locator('svg[role="img"]');
  await expect(plot.locator('[data-part="within"]')).toHaveCount(1);
  await expect(plot.locator('[data-part="below"]')).toHaveAttribute('stroke-dasharray', /\d/);
  await expect(plot.locator('[data-part="above"]')).toHaveAttribute('stroke-dasharray', /\d/);
  await expect(plot.locator('[data-part="within"]')).not.toHaveAttribute('stroke-dasharray', /./);
  const ends = await plot.evaluate((svg) => {
    const xs = [...svg.querySelectorAll('circle[data-well]')].map((c) => Number(c.getAttribute('cx')));
    const d = svg.querySelector('[data-part="within"]')!.getAttribute('d')!;
    const numbers = d.match(/-?\d+(\.\d+)?(e-?\d+)?/g)!.map(Number);
    return { lo: Math.min(...xs), hi: Math.max(...xs), first: numbers[0]!, last: numbers.at(-2)! };
  });
  expect(ends.first).toBeCloseTo(ends.lo, 1);
  expect(ends.last).toBeCloseTo(ends.hi, 1);
  await expect(plot.locator('[data-part="band"]')).toHaveCount(1);
  await expect(plot).toContainText('95 % confidence band');
  // The fits answer carries each fit's estimates, not curve points; asked again with its tag it is 304.
  const fitsAnswer = await page.request.get(`/api/plates/${plateId}/fits`);
  const fitsTag = fitsAnswer.headers()['etag']!;
  expect(fitsTag).toMatch(/^"[\w-]+"$/);
  expect(fitsAnswer.headers()['cache-control']).toBe('private, no-cache');
  expect(JSON.stringify(await fitsAnswer.json())).not.toContain('"curve"');
  const again = await page.request.get(`/api/plates/${plateId}/fits`, {
    headers: { 'if-none-match': fitsTag },
  });
  expect(again.status()).toBe(304);
  expect(await again.text()).toBe('');
  await expect(plot).toContainText('Concentration (µM, log scale)');
  await expect(plot).toContainText('Fractional block (%)');
  const hollow = plot.locator('circle[data-well="excluded"]');
  await expect(hollow).toHaveCount(1);
  await expect(hollow).toHaveAttribute('fill', '#ffffff');
  await expect(hollow.locator('title')).toContainText(victim.position);

  const [download] = await Promise.all([
    page.waitForEvent('download'),
    card.getByRole('button', { name: 'Download SVG of GW-0009 on Kv7.2' }).click(),
  ]);
  expect(download.suggestedFilename()).toMatch(/\.svg$/);
  const svgText = readFileSync((await download.path())!, 'utf8');
  expect(svgText).toMatch(/^<\?xml[^>]*\?>\s*<svg [^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
  for (const text of [
    '95 % confidence band',
    'Fitted curve, tested range',
    'Beyond tested range',
    'Excluded well (hollow)',
  ])
    expect(svgText).toContain(text);
  const parsed = await page.evaluate((text) => {
    const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
    return { error: doc.getElementsByTagName('parsererror').length, root: doc.documentElement.localName };
  }, svgText);
  expect(parsed).toEqual({ error: 0, root: 'svg' });
  await page.screenshot({ path: `${SHOTS}/plate-fits-1440x900.png`, fullPage: true });

  // A 1536-well plate: every well drawn, the map inside the page at both sizes.
  const bigId = await importPlate(page, 'kv-1536.csv', export1536(), `MAP-1536-${tag}`);
  await page.goto(`/plates/${bigId}`);
  const big = page.getByRole('grid', { name: /1536 wells/ });
  await expect(big.getByRole('gridcell')).toHaveCount(1536);
  for (const [width, height] of [
    [1440, 900],
    [1024, 768],
  ] as const) {
    await page.setViewportSize({ width, height });
    const box = (await big.boundingBox())!;
    const main = (await page.locator('main').boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(main.x + main.width + 0.5);
    // 48 columns across the drawn width: each well at least 12 px wide on screen (common practice, no source).
    expect(box.width / 49).toBeGreaterThanOrEqual(12);
    await page.screenshot({ path: `${SHOTS}/plate-map-1536-${width}x${height}.png`, fullPage: true });
  }
  await context.close();

  // The chemist's view of the plate waiting for verification opens on compound and concentration maps.
  const chemist = await signedInContext(browser, 'chemist');
  await chemist.page.setViewportSize({ width: 1440, height: 900 });
  await chemist.page.goto(`/plates/${plateId}/history`);
  const headings = chemist.page.getByRole('heading', { level: 2 });
  await expect(headings.first()).toHaveText('Compound map to verify');
  await expect(
    chemist.page.getByRole('grid', { name: /^Compound map, 96 wells, coloured by compound$/ }),
  ).toBeVisible();
  await expect(
    chemist.page.getByRole('grid', { name: /^Concentration map, 96 wells, coloured by concentration$/ }),
  ).toBeVisible();
  await expect(chemist.page.getByRole('group', { name: 'Legend: Compound' })).toContainText('GW-0009');
  await expect(chemist.page.getByRole('group', { name: 'Legend: Concentration' })).toContainText('µM');
  await chemist.page.screenshot({ path: `${SHOTS}/verify-map-1440x900.png`, fullPage: true });
  await chemist.page.setViewportSize({ width: 1024, height: 768 });
  await chemist.page.screenshot({ path: `${SHOTS}/verify-map-1024x768.png`, fullPage: true });
  await chemist.page.goto(`/plates/${plateId}`);
  await expect(chemist.page.getByRole('radio', { name: 'Compound', exact: true })).toBeChecked();
  await chemist.context.close();
});
