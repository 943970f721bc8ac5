import { describe, expect, test } from 'vitest';
import { z } from 'zod';
import {
  commitFieldsSchema,
  commitFileFieldsSchema,
  draftSheetsSchema,
  previewFieldsSchema,
} from '@/lib/validation/imports';

// The fields of the import steps after inspect name a draft, not a file (issue 17); the messages are the
// ones people and scripts read.
const mapping = JSON.stringify({ version: 1, headerRow: 1 });
const draftId = '3f1c2d4e-5a6b-4c7d-8e9f-0a1b2c3d4e5f';
const fieldErrors = (error: z.ZodError) => z.flattenError(error).fieldErrors as Record<string, string[]>;

describe('preview and commit fields', () => {
  test('a preview without a draft id asks for the one inspect answered', () => {
    const parsed = previewFieldsSchema.safeParse({ sheet: 'Plate', mapping });
    expect(parsed.success).toBe(false);
    expect(fieldErrors(parsed.error!).draftId).toEqual([
      'Read the file first: send the draftId that inspect answered.',
    ]);
  });

  test('a commit of a draft needs no screen; a commit of a file needs the screen and no draft', () => {
    expect(
      commitFieldsSchema.parse({ draftId, sheet: 'Plate', mapping, label: ' P-1 ', format: '384' }),
    ).toMatchObject({ draftId, label: 'P-1', format: 384 });
    expect(
      commitFileFieldsSchema.parse({ screenId: draftId, sheet: 'Plate', mapping, label: 'P-1' }),
    ).not.toHaveProperty('draftId');
    expect(
      fieldErrors(commitFileFieldsSchema.safeParse({ sheet: 'Plate', mapping, label: 'P-1' }).error!)
        .screenId,
    ).toEqual(['Choose a screen.']);
  });
});

describe("a draft's sheets read back from the database", () => {
  test.each([
    ['text, numbers, booleans and blanks', [['Well', 1.5, true, null]], true],
    ['an object in a cell', [['Well', { formula: '1+1' }]], false],
    ['a row that is not a list', ['Well'], false],
  ])('%s: accepted %s', (_name, rows, ok) => {
    expect(draftSheetsSchema.safeParse([{ name: 'Plate', rows, decimalComma: false }]).success).toBe(ok);
  });

  test('no sheets at all is refused', () => {
    expect(draftSheetsSchema.safeParse([]).success).toBe(false);
  });
});
