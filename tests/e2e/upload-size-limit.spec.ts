import http from 'node:http';
import { expect, test, type Page } from '@playwright/test';
import { DEMO, freshPotassiumExport, queryOne, signIn } from './support';

// Uploads over the 10 MB limit are refused before their body is read whole, and nothing is written (no
// draft, no stored file). Each request below sends only part of its body and leaves the connection open:
// the answer can only come if the server refused without waiting for the rest. These fail if the route
// read the whole body first (no answer: the test times out) or if it kept anything.

const MB = 1024 * 1024;
const TOO_LARGE = {
  error: 'too_large',
  message: 'The file is larger than 10 MB; Gatewell reads files up to 10 MB.',
};

interface Upload {
  url: URL;
  cookie: string;
  boundary: string;
  /** The multipart head up to the file's bytes: the screen field, then the file part's header. */
  head: (filename: string) => Buffer;
}

/** A biologist signed in, and the pieces of a multipart upload to the screen's inspect route. */
async function uploadAs(
  page: Page,
  baseURL: string | undefined,
  screenName: string,
  boundary: string,
): Promise<Upload> {
  await signIn(page, DEMO.biologist.email, DEMO.biologist.password);
  const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
  const screen = await queryOne<{ id: string }>('select id from screens where name = $1', [screenName]);
  return {
    url: new URL('/api/imports/inspect', baseURL),
    cookie,
    boundary,
    head: (filename) =>
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="screenId"\r\n\r\n${screen!.id}\r\n` +
          `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: text/csv\r\n\r\n`,
      ),
  };
}

/** Drafts and stored files: what an upload would write. */
const storedUploads = () =>
  queryOne<{ drafts: number; files: number }>(
    'select (select count(*)::int from import_drafts) as drafts, (select count(*)::int from uploaded_files) as files',
  );

/**
 * Posts the parts, with a declared Content-Length or chunked (no declared size), and ends the body only
 * when asked. Resolves with the answer, whenever it comes.
 */
function post(
  upload: Upload,
  parts: Buffer[],
  body: { declaredLength: number } | { chunked: true; end: boolean },
): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const request = http.request(upload.url, {
      method: 'POST',
      headers: {
        cookie: upload.cookie,
        origin: upload.url.origin,
        'content-type': `multipart/form-data; boundary=${upload.boundary}`,
        ...('declaredLength' in body
          ? { 'content-length': String(body.declaredLength) }
          : { 'transfer-encoding': 'chunked' }),
      },
    });
    request.on('response', (response) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => {
        resolve({ status: response.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8') });
        request.destroy();
      });
    });
    request.on('error', reject);
    for (const part of parts) request.write(part);
    if ('end' in body && body.end) request.end();
  });
}

// The request declares 11 MB and sends 256 KB of it.
test('an upload declared over 10 MB is refused with 413 before its body is read, and nothing is written', async ({
  page,
  baseURL,
}) => {
  const upload = await uploadAs(page, baseURL, 'Pain sodium screen', 'gatewell-size-limit');
  const before = await storedUploads();
  const head = upload.head('huge.csv');
  const declared = 11 * MB;
  const sent = head.length + 256 * 1024;
  const answer = await post(upload, [head, Buffer.alloc(sent - head.length, 0x41)], {
    declaredLength: declared,
  });
  expect(sent).toBeLessThan(declared / 40);
  expect(answer.status).toBe(413);
  expect(JSON.parse(answer.body)).toMatchObject(TOO_LARGE);
  expect(await storedUploads()).toEqual(before);
});

// A body sent in chunks declares no size: the route reads it with a cap and refuses it with 413 as soon as
// it passes the limit. The request below sends 10.5 MB of file in 64 KB chunks and never ends. A small
// file sent the same way is read as usual, so the refusal is the size's and not the chunking's.
test('an upload sent in chunks without a declared size is refused with 413 once it passes 10 MB, and nothing is written', async ({
  page,
  baseURL,
}) => {
  const upload = await uploadAs(page, baseURL, 'Potassium counter-screen', 'gatewell-chunked-limit');
  const before = await storedUploads();

  const chunk = Buffer.alloc(64 * 1024, 0x41);
  const huge = [upload.head('huge.csv'), ...Array.from({ length: (10.5 * MB) / chunk.length }, () => chunk)];
  const refused = await post(upload, huge, { chunked: true, end: false });
  expect(refused.status).toBe(413);
  expect(JSON.parse(refused.body)).toMatchObject(TOO_LARGE);
  expect(await storedUploads()).toEqual(before);

  const closing = Buffer.from(`\r\n--${upload.boundary}--\r\n`);
  const small = [upload.head('kv-chunked.csv'), freshPotassiumExport(), closing];
  const read = await post(upload, small, { chunked: true, end: true });
  expect(read.status, read.body).toBe(200);
  expect(JSON.parse(read.body)).toMatchObject({ draftId: expect.any(String) });
});
