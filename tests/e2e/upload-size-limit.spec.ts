import http from 'node:http';
import { expect, test } from '@playwright/test';
import { DEMO, freshPotassiumExport, queryOne, signIn } from './support';

// An upload over the 10 MB limit is refused from its declared size, before its body is read: the request
// below declares 11 MB and sends only 256 KB, then waits with the connection open. The answer can only come
// if the server refused without waiting for the rest; and nothing is written (no draft, no stored file).
// This fails if the route read the whole body first (no answer: the test times out) or if it kept anything.

const MB = 1024 * 1024;

test('an upload declared over 10 MB is refused with 413 before its body is read, and nothing is written', async ({
  page,
  baseURL,
}) => {
  await signIn(page, DEMO.biologist.email, DEMO.biologist.password);
  const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
  const screen = await queryOne<{ id: string }>('select id from screens where name = $1', [
    'Pain sodium screen',
  ]);
  const counts = () =>
    queryOne<{ drafts: number; files: number }>(
      'select (select count(*)::int from import_drafts) as drafts, (select count(*)::int from uploaded_files) as files',
    );
  const before = await counts();

  const boundary = 'gatewell-size-limit';
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="screenId"\r\n\r\n${screen!.id}\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="huge.csv"\r\nContent-Type: text/csv\r\n\r\n`,
  );
  const declared = 11 * MB;
  const sent = head.length + 256 * 1024;
  const url = new URL('/api/imports/inspect', baseURL);
  const answer = await new Promise<{ status: number; body: string }>((resolve, reject) => {
    const request = http.request(url, {
      method: 'POST',
      headers: {
        cookie,
        origin: url.origin,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'content-length': String(declared),
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
    // Part of the body only; the rest is never sent, and the request is never ended.
    request.write(head);
    request.write(Buffer.alloc(sent - head.length, 0x41));
  });
  expect(sent).toBeLessThan(declared / 40);
  expect(answer.status).toBe(413);
  expect(JSON.parse(answer.body)).toMatchObject({
    error: 'too_large',
    message: 'The file is larger than 10 MB; Gatewell reads files up to 10 MB.',
  });
  expect(await counts()).toEqual(before);
});

/** Posts a multipart body in chunks (Transfer-Encoding: chunked, no declared size); ends it only when asked. */
function postChunked(
  url: URL,
  cookie: string,
  boundary: string,
  parts: Buffer[],
  end: boolean,
): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const request = http.request(url, {
      method: 'POST',
      headers: {
        cookie,
        origin: url.origin,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'transfer-encoding': 'chunked',
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
    if (end) request.end();
  });
}

// A body sent in chunks declares no size: the route reads it with a cap and refuses it with 413 as soon as
// it passes the limit. The request below sends 10.5 MB of file in 64 KB chunks and never ends: the answer
// can only come if the server stopped at the limit instead of waiting for the whole body. A small file
// sent the same way is read as usual, so the refusal is the size's and not the chunking's.
test('an upload sent in chunks without a declared size is refused with 413 once it passes 10 MB, and nothing is written', async ({
  page,
  baseURL,
}) => {
  await signIn(page, DEMO.biologist.email, DEMO.biologist.password);
  const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
  const screen = await queryOne<{ id: string }>('select id from screens where name = $1', [
    'Potassium counter-screen',
  ]);
  const counts = () =>
    queryOne<{ drafts: number; files: number }>(
      'select (select count(*)::int from import_drafts) as drafts, (select count(*)::int from uploaded_files) as files',
    );
  const before = await counts();
  const boundary = 'gatewell-chunked-limit';
  const head = (filename: string) =>
    Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="screenId"\r\n\r\n${screen!.id}\r\n` +
        `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: text/csv\r\n\r\n`,
    );
  const url = new URL('/api/imports/inspect', baseURL);

  const chunk = Buffer.alloc(64 * 1024, 0x41);
  const huge = [head('huge.csv'), ...Array.from({ length: (10.5 * MB) / chunk.length }, () => chunk)];
  const refused = await postChunked(url, cookie, boundary, huge, false);
  expect(refused.status).toBe(413);
  expect(JSON.parse(refused.body)).toMatchObject({
    error: 'too_large',
    message: 'The file is larger than 10 MB; Gatewell reads files up to 10 MB.',
  });
  expect(await counts()).toEqual(before);

  const small = [head('kv-chunked.csv'), freshPotassiumExport(), Buffer.from(`\r\n--${boundary}--\r\n`)];
  const read = await postChunked(url, cookie, boundary, small, true);
  expect(read.status, read.body).toBe(200);
  expect(JSON.parse(read.body)).toMatchObject({ draftId: expect.any(String) });
});
