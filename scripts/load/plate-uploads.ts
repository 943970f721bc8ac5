// Plate exports for the importers: the demo plans in turn, each upload with its own seed and plate name,
// so no two files share a SHA-256 (Gatewell refuses a file already imported for the screen).
import { createHash, randomBytes } from 'node:crypto';
import { makeDemoPlate } from '../demo-plates/make-demo-plate';
import { PLATE_PLANS, type PlatePlan } from '../demo-plates/plate-plans';

/** One generated export, ready to post. */
export interface PlateUpload {
  plan: PlatePlan;
  label: string;
  bytes: Uint8Array;
  sha256: string;
  /** Screen and data sheet the demo manifest names. */
  screen: string;
  dataSheet: string;
}

/** What the commit route needs besides the file: the screen, the sheet and the column mapping inspect proposed. */
export interface CommitTarget {
  screenId: string;
  sheet: string;
  mapping: unknown;
}

/** An encoded `multipart/form-data` request body. */
export interface EncodedForm {
  body: Buffer;
  contentType: string;
}

const mediaType = (file: string) =>
  file.endsWith('.csv') ? 'text/csv' : 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** Export number `n` of a run: plan n mod 4 with seed `firstSeed + n`, labelled `<tag>-<n>`. */
export function makeUpload(n: number, firstSeed: number, tag: string): PlateUpload {
  const label = `${tag}-${String(n + 1).padStart(4, '0')}`;
  const plan = { ...PLATE_PLANS[n % PLATE_PLANS.length]!, seed: (firstSeed + n) >>> 0, plateName: label };
  const plate = makeDemoPlate(plan);
  const sha256 = createHash('sha256').update(plate.bytes).digest('hex');
  return {
    plan,
    label,
    bytes: plate.bytes,
    sha256,
    screen: plate.manifest.screen,
    dataSheet: plate.manifest.dataSheet,
  };
}

/** A `multipart/form-data` body of text fields and one file under "file", encoded synchronously. */
export function encodeForm(fields: [string, string][], upload: PlateUpload): EncodedForm {
  const boundary = `gatewell-load-${randomBytes(12).toString('hex')}`;
  const parts = fields.map(([name, value]) =>
    Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`),
  );
  parts.push(
    Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${upload.plan.file}"\r\nContent-Type: ${mediaType(upload.plan.file)}\r\n\r\n`,
    ),
    Buffer.from(upload.bytes),
    Buffer.from(`\r\n--${boundary}--\r\n`),
  );
  return { body: Buffer.concat(parts), contentType: `multipart/form-data; boundary=${boundary}` };
}

/** The commit request of one upload, as the import page sends it. */
export function encodeCommit(upload: PlateUpload, target: CommitTarget): EncodedForm {
  return encodeForm(
    [
      ['screenId', target.screenId],
      ['sheet', target.sheet],
      ['mapping', JSON.stringify(target.mapping)],
      ['format', ''],
      ['label', upload.label],
    ],
    upload,
  );
}

/** Posts one upload to the inspect route (which keeps a draft the load never commits) and returns the sheet and mapping it proposes. */
export async function inspectUpload(
  baseUrl: string,
  cookie: string,
  upload: PlateUpload,
  screenId: string,
): Promise<CommitTarget> {
  const { body, contentType } = encodeForm([['screenId', screenId]], upload);
  const answer = await fetch(new URL('/api/imports/inspect', baseUrl), {
    method: 'POST',
    body: new Uint8Array(body),
    headers: { cookie, origin: new URL(baseUrl).origin, 'content-type': contentType },
  });
  const json = (await answer.json()) as {
    sheets?: { name: string; guess: { mapping: unknown } }[];
    message?: string;
  };
  if (answer.status !== 200)
    throw new Error(`inspecting ${upload.plan.file} answered ${answer.status}: ${json.message ?? ''}`);
  const sheet = json.sheets?.find((s) => s.name === upload.dataSheet);
  if (!sheet) throw new Error(`inspecting ${upload.plan.file} found no sheet ${upload.dataSheet}`);
  return { screenId, sheet: sheet.name, mapping: sheet.guess.mapping };
}
