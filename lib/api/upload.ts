import 'server-only';
import type { NextRequest } from 'next/server';
import type { ZodType, z } from 'zod';
import { AppError } from '@/lib/errors';
import { emptyFileMessage } from '@/lib/imports/upload-messages';
import { MAX_UPLOAD_BYTES } from '@/lib/validation/imports';

/** A file as uploaded: its bytes, name and media type. */
export interface UploadedBytes {
  bytes: Uint8Array;
  filename: string;
  mediaType: string;
}

const TOO_LARGE = 'The file is larger than 10 MB; Gatewell reads files up to 10 MB.';
/** The most a form may hold: the largest file and room for the other fields and the multipart framing. */
const MAX_FORM_BYTES = MAX_UPLOAD_BYTES + 64 * 1024;

/**
 * The request body, read chunk by chunk and refused with 413 as soon as it passes the form limit (the
 * rest is not read). A body sent in chunks declares no size, so the declared size alone cannot stop it.
 */
async function readCappedBody(request: NextRequest): Promise<Uint8Array<ArrayBuffer>> {
  const chunks: Uint8Array[] = [];
  let size = 0;
  const reader = request.body?.getReader();
  if (!reader) return new Uint8Array(0);
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > MAX_FORM_BYTES) {
      await reader.cancel().catch(() => undefined);
      throw new AppError('too_large', TOO_LARGE);
    }
    chunks.push(value);
  }
  const body = new Uint8Array(size);
  let at = 0;
  for (const chunk of chunks) {
    body.set(chunk, at);
    at += chunk.byteLength;
  }
  return body;
}

/** A posted form (multipart or url-encoded): its text fields and the file under "file", when one was sent. */
export async function readForm(
  request: NextRequest,
): Promise<{ fields: Record<string, string>; file: File | null }> {
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > MAX_FORM_BYTES) throw new AppError('too_large', TOO_LARGE);
  const body = await readCappedBody(request);
  let form: FormData;
  try {
    const contentType = request.headers.get('content-type') ?? '';
    form = await new Response(body, { headers: { 'content-type': contentType } }).formData();
  } catch {
    throw new AppError('invalid', 'The request could not be read as a form.');
  }
  const file = form.get('file');
  const fields = Object.fromEntries(
    [...form.entries()].filter(
      (entry): entry is [string, string] => entry[0] !== 'file' && typeof entry[1] === 'string',
    ),
  );
  return { fields, file: file instanceof File ? file : null };
}

/**
 * The sent file, size-checked; refused when missing or empty. A form with no file chosen sends a nameless
 * part of 0 bytes; a chosen file of 0 bytes has its name and is told it is empty.
 */
export async function uploadedFile(file: File | null): Promise<UploadedBytes> {
  if (!file || (file.size === 0 && file.name === ''))
    throw new AppError('invalid', 'Choose a file to upload (xlsx, xls or csv).', {
      fieldErrors: { file: ['Choose a file.'] },
    });
  if (file.size === 0) {
    const message = emptyFileMessage(file.name.slice(0, 255));
    throw new AppError('invalid', message, { code: 'empty_file', fieldErrors: { file: [message] } });
  }
  if (file.size > MAX_UPLOAD_BYTES)
    throw new AppError('too_large', `${file.name} is larger than 10 MB; Gatewell reads files up to 10 MB.`);
  return {
    bytes: new Uint8Array(await file.arrayBuffer()),
    filename: file.name.slice(0, 255),
    mediaType: file.type || 'application/octet-stream',
  };
}

/** Reads a multipart upload: the file under "file" (size-checked) and the other fields through a zod schema. */
export async function readUpload<Schema extends ZodType>(request: NextRequest, schema: Schema) {
  const form = await readForm(request);
  const fields: z.infer<Schema> = schema.parse(form.fields);
  return { fields, ...(await uploadedFile(form.file)) };
}

/**
 * Reads the fields of a step that names an import draft instead of sending the file: a file sent
 * anyway is refused, as the draft already holds it.
 */
export async function readDraftFields<Schema extends ZodType>(
  request: NextRequest,
  schema: Schema,
): Promise<z.infer<Schema>> {
  const form = await readForm(request);
  if (form.file)
    throw new AppError(
      'invalid',
      'Send the draftId that inspect answered instead of the file: the file is read once, at inspect.',
    );
  return schema.parse(form.fields);
}
