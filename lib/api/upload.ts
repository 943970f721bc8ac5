import 'server-only';
import type { NextRequest } from 'next/server';
import type { ZodType, z } from 'zod';
import { AppError } from '@/lib/errors';
import { MAX_UPLOAD_BYTES } from '@/lib/validation/imports';

/** Reads a multipart upload: the file under "file" (size-checked) and the other fields through a zod schema. */
export async function readUpload<Schema extends ZodType>(request: NextRequest, schema: Schema) {
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > MAX_UPLOAD_BYTES + 64 * 1024) throw new AppError('too_large', 'The file is larger than 10 MB; Gatewell reads files up to 10 MB.');
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    throw new AppError('invalid', 'The upload could not be read as a form with a file.');
  }
  const file = form.get('file');
  if (!(file instanceof File) || file.size === 0) throw new AppError('invalid', 'Choose a file to upload (xlsx, xls or csv).', { fieldErrors: { file: ['Choose a file.'] } });
  if (file.size > MAX_UPLOAD_BYTES) throw new AppError('too_large', `${file.name} is larger than 10 MB; Gatewell reads files up to 10 MB.`);
  const fields = Object.fromEntries([...form.entries()].filter(([key, value]) => key !== 'file' && typeof value === 'string'));
  const parsed: z.infer<Schema> = schema.parse(fields);
  return { fields: parsed, bytes: new Uint8Array(await file.arrayBuffer()), filename: file.name.slice(0, 255), mediaType: file.type || 'application/octet-stream' };
}
