import { describe, expect, test } from 'vitest';
import { uploadedFile } from '@/lib/api/upload';

// A chosen file of 0 bytes is a file and is told it is empty; only a form without a file is asked for one.
describe('uploadedFile', () => {
  test('no file, or the nameless empty part a form sends when none is chosen, asks for a file', async () => {
    const choose = { code: 'invalid', message: 'Choose a file to upload (xlsx, xls or csv).' };
    await expect(uploadedFile(null)).rejects.toMatchObject(choose);
    await expect(uploadedFile(new File([], ''))).rejects.toMatchObject(choose);
  });

  test('a chosen file of 0 bytes is told the file is empty', async () => {
    await expect(uploadedFile(new File([], 'plate-07.xlsx'))).rejects.toMatchObject({
      code: 'invalid',
      message:
        'plate-07.xlsx is empty (0 bytes): the file holds nothing to import. Export the plate from the instrument again and upload that file.',
      details: { code: 'empty_file' },
    });
  });

  test('a file with bytes is read with its name and type', async () => {
    const file = new File(['Well\nA01\n'], 'plate.csv', { type: 'text/csv' });
    const read = await uploadedFile(file);
    expect(read).toMatchObject({ filename: 'plate.csv', mediaType: 'text/csv' });
    expect(new TextDecoder().decode(read.bytes)).toBe('Well\nA01\n');
  });
});
