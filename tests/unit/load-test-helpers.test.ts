// The pieces of scripts/load-test.ts that decide its figures and its requests.
import { describe, expect, test } from 'vitest';
import { encodeCommit, makeUpload } from '@/scripts/load/plate-uploads';
import { hiddenFields } from '@/scripts/load/sign-in';
import { groupFigures, missedTargets, percentile } from '@/scripts/load/summary';

describe('load test figures', () => {
  // Nearest-rank worked example of the Wikipedia article "Percentile" (list 15, 20, 35, 40, 50).
  test.each([
    [5, 15],
    [30, 20],
    [40, 20],
    [50, 35],
    [100, 50],
  ])('percentile %i of 15, 20, 35, 40, 50 is %i', (p, value) => {
    expect(percentile([15, 20, 35, 40, 50], p)).toBe(value);
  });

  test('errors count refused answers, socket errors and timeouts; targets name what was missed', () => {
    const samples = [200, 200, 201, 500, 307].map((status, i) => ({ route: 'r', status, ms: 10 * (i + 1) }));
    const figures = groupFigures({ samples, socketErrors: 1, timeouts: 2, seconds: 2, firstRefusals: [] });
    expect(figures).toMatchObject({
      answers: 5,
      perSecond: 2.5,
      non2xx: 2,
      statuses: { 500: 1, 307: 1 },
      errors: 5,
      p50: 30,
      max: 50,
    });
    expect(missedTargets(figures, null, 100)).toEqual(['5 read error(s)']);
    expect(missedTargets({ ...figures, errors: 0 }, { ...figures, errors: 0 }, 40)).toEqual([
      'reads p95 50.0 ms is not under 40 ms',
    ]);
    expect(missedTargets(null, { ...figures, errors: 0 }, 40)).toEqual([]);
    expect(missedTargets({ ...figures, answers: 0, errors: 0 }, null, 40)).toEqual(['no read was answered']);
  });
});

describe('load test requests', () => {
  test('the sign-in form yields its hidden fields with entities decoded', () => {
    const html =
      '<form action="" method="POST"><input type="hidden" name="$ACTION_REF_1"/>' +
      '<input type="hidden" name="$ACTION_1:0" value="{&quot;id&quot;:&quot;abc&quot;}"/><input id="email" type="email" name="email"/></form>';
    expect(hiddenFields(html)).toEqual([
      ['$ACTION_REF_1', ''],
      ['$ACTION_1:0', '{"id":"abc"}'],
    ]);
  });

  test('uploads differ in content and label, and the same number and seed give the same file', () => {
    const uploads = Array.from({ length: 8 }, (_, n) => makeUpload(n, 1234, 'T'));
    expect(new Set(uploads.map((u) => u.sha256)).size).toBe(8);
    expect(uploads.map((u) => u.label)).toEqual([
      'T-0001',
      'T-0002',
      'T-0003',
      'T-0004',
      'T-0005',
      'T-0006',
      'T-0007',
      'T-0008',
    ]);
    expect(makeUpload(3, 1234, 'T').sha256).toBe(uploads[3]!.sha256);
  });

  test('a commit body reads back as the form the import page sends', async () => {
    const upload = makeUpload(2, 99, 'T');
    const { body, contentType } = encodeCommit(upload, {
      screenId: 'screen-id',
      sheet: 'Readouts',
      mapping: { version: 1, note: 'a "quoted" word' },
    });
    const form = await new Response(new Uint8Array(body), {
      headers: { 'content-type': contentType },
    }).formData();
    expect(Object.fromEntries([...form.entries()].filter(([key]) => key !== 'file'))).toEqual({
      screenId: 'screen-id',
      sheet: 'Readouts',
      mapping: '{"version":1,"note":"a \\"quoted\\" word"}',
      format: '',
      label: 'T-0003',
    });
    const file = form.get('file') as File;
    expect(file.name).toBe(upload.plan.file);
    expect(new Uint8Array(await file.arrayBuffer())).toEqual(upload.bytes);
  });
});
