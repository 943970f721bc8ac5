// The forecast routes' query schemas: what they accept, and the exact messages people see otherwise.
import { describe, expect, test } from 'vitest';
import { compoundForecastQuerySchema, plateForecastQuerySchema } from '@/lib/validation/forecasts';

const AT = 'at must be the index of one of the screen’s exposures.';

describe('plate forecast query', () => {
  test.each([
    [{}, {}],
    [{ at: '' }, {}],
    [{ at: '2' }, { at: 2 }],
    [
      { compoundId: '6f1c9a52-8a43-4d5e-9b7e-2f0d7c1e4a10', at: '0' },
      { compoundId: '6f1c9a52-8a43-4d5e-9b7e-2f0d7c1e4a10', at: 0 },
    ],
  ])('accepts %j', (query, parsed) => {
    expect(plateForecastQuerySchema.parse(query)).toEqual(parsed);
  });

  test.each([
    [{ at: 'x' }, AT],
    [{ at: '-1' }, AT],
    [{ at: '1.5' }, AT],
    [{ compoundId: 'GW-0001' }, 'compoundId must be the id of a compound on this plate.'],
  ])('refuses %j', (query, message) => {
    expect(plateForecastQuerySchema.safeParse(query).error!.issues[0]!.message).toBe(message);
  });
});

test('compound forecast query refuses a screen that is not an id', () => {
  expect(compoundForecastQuerySchema.safeParse({ screenId: 'Pain' }).error!.issues[0]!.message).toBe(
    'screenId must be the id of a screen the compound was tested in.',
  );
});
