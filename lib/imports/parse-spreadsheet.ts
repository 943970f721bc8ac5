import 'server-only';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { checkPlainSheets } from './plain-sheets';
import { extensionOf, sniffUpload } from './sniff-upload';
import { emptyFileMessage } from './upload-messages';
import type { ParseSpreadsheetResult, SpreadsheetErrorCode, SpreadsheetFormat } from './spreadsheet-types';

/** Limits for one upload; every field is optional. */
export interface ParseSpreadsheetOptions {
  /** Largest accepted file, bytes. @default 10 MB (10 × 1024 × 1024) */
  maxBytes?: number;
  /** Wall-clock time the parse worker may take before it is stopped, ms. @default 10000 */
  timeoutMs?: number;
  /** Heap the parse worker may use, MB. @default 256 */
  maxMemoryMb?: number;
  /**
   * Most bytes the entries of a zip workbook (xlsx, ods) may unpack to in all, checked in the parse worker
   * before the workbook is read, so a small file that inflates hugely (a zip bomb) is refused at once.
   * @default 64 MB
   */
  maxInflatedBytes?: number;
  /** Most rows a sheet may have, header and title rows included. @default 20000 */
  maxRows?: number;
  /** Most columns a sheet may have. @default 200 */
  maxColumns?: number;
  /** Nice value of the parse thread (Linux: per thread), 0–19; higher yields the CPU to page requests. @default 10 */
  niceness?: number;
  /** The worker script. @default `<process.cwd()>/lib/imports/parse-worker.mjs` */
  workerPath?: string;
}

const MB = 1024 * 1024;
const DEFAULTS = {
  maxBytes: 10 * MB,
  maxInflatedBytes: 64 * MB,
  timeoutMs: 10_000,
  maxMemoryMb: 256,
  maxRows: 20_000,
  maxColumns: 200,
};
const DEFAULT_NICENESS = 10;

const startsKey = Symbol.for('gatewell.parseWorkerStarts');
const starts = globalThis as { [startsKey]?: number };

/**
 * How many parse worker threads this process has started (one per file read): what tests count to show
 * that an import reads its file once, whichever steps and jobs it passes through.
 */
export function parseWorkerStarts(): number {
  return starts[startsKey] ?? 0;
}

type WorkerReply = { ok: true; sheets: unknown } | { ok: false; code: SpreadsheetErrorCode; detail: string };

/** Reads an uploaded xlsx, xls or csv file into plain sheets, in a fresh worker thread with limits. */
export async function parseSpreadsheet(
  bytes: Uint8Array,
  filename: string,
  options: ParseSpreadsheetOptions = {},
): Promise<ParseSpreadsheetResult> {
  const limits = checkOptions(options);
  const fail = (code: SpreadsheetErrorCode, message: string): ParseSpreadsheetResult => ({
    ok: false,
    error: { code, message },
  });
  if (bytes.length === 0) return fail('empty_file', emptyFileMessage(filename));
  if (bytes.length > limits.maxBytes) {
    return fail(
      'too_large',
      `${filename} is ${sizeLabel(bytes.length)}; Gatewell reads files up to ${sizeLabel(limits.maxBytes)}.`,
    );
  }
  const sniffed = sniffUpload(bytes, filename);
  if (sniffed.kind === 'refused') return { ok: false, error: sniffed.error };
  const format: SpreadsheetFormat =
    sniffed.kind === 'workbook' ? sniffed.format : sniffed.kind === 'markup' ? 'markup' : 'csv';
  const job =
    sniffed.kind === 'workbook'
      ? { kind: 'workbook', format: sniffed.format, bytes }
      : { kind: sniffed.kind, text: sniffed.text, sheetName: sheetNameFor(filename) };
  const reply = await runWorker(
    {
      ...job,
      maxRows: limits.maxRows,
      maxColumns: limits.maxColumns,
      maxInflatedBytes: limits.maxInflatedBytes,
      niceness: limits.niceness,
    },
    limits,
  );
  if (
    !reply.ok &&
    format !== 'csv' &&
    /Unsupported ZIP file|Cannot find file|not a spreadsheet/i.test(reply.detail)
  ) {
    return fail(
      'not_spreadsheet',
      describeFailure('not_spreadsheet', reply.detail, filename, format, limits),
    );
  }
  if (!reply.ok) return fail(reply.code, describeFailure(reply.code, reply.detail, filename, format, limits));
  const sheets = checkPlainSheets(reply.sheets);
  if (!sheets)
    return fail(
      'unreadable',
      `${filename} could not be read: the parser returned something other than plain values.`,
    );
  return { ok: true, format, sheets };
}

function checkOptions(options: ParseSpreadsheetOptions) {
  const merged = { ...DEFAULTS, ...stripUndefined(options) };
  for (const key of Object.keys(DEFAULTS) as (keyof typeof DEFAULTS)[]) {
    if (!Number.isInteger(merged[key]) || merged[key] <= 0)
      throw new RangeError(`parseSpreadsheet: ${key} must be a positive integer`);
  }
  const niceness = options.niceness ?? DEFAULT_NICENESS;
  if (!Number.isInteger(niceness) || niceness < 0 || niceness > 19)
    throw new RangeError('parseSpreadsheet: niceness must be a whole number from 0 to 19');
  return {
    ...merged,
    niceness,
    workerPath: options.workerPath ?? path.join(process.cwd(), 'lib', 'imports', 'parse-worker.mjs'),
  };
}

function stripUndefined(options: ParseSpreadsheetOptions): Partial<typeof DEFAULTS> {
  return Object.fromEntries(
    Object.entries(options).filter(([key, value]) => value !== undefined && key in DEFAULTS),
  );
}

/** "812 bytes", "3.4 KB", "10 MB", "10.2 MB". */
function sizeLabel(bytes: number): string {
  const [value, unit] =
    bytes < 1024 ? [bytes, 'bytes'] : bytes < MB ? [bytes / 1024, 'KB'] : [bytes / MB, 'MB'];
  return `${Number.isInteger(value) ? value : value.toFixed(1)} ${unit}`;
}

function sheetNameFor(filename: string): string {
  const base = path.basename(filename);
  const stem = extensionOf(base) ? base.slice(0, base.lastIndexOf('.')) : base;
  return stem.trim().slice(0, 31) || 'Sheet1';
}

function runWorker(workerData: object, limits: ReturnType<typeof checkOptions>): Promise<WorkerReply> {
  return new Promise((resolve) => {
    let settled = false;
    const worker = new Worker(limits.workerPath, {
      workerData,
      env: {},
      execArgv: [],
      resourceLimits: {
        maxOldGenerationSizeMb: limits.maxMemoryMb,
        maxYoungGenerationSizeMb: 32,
        stackSizeMb: 4,
      },
    });
    starts[startsKey] = parseWorkerStarts() + 1;
    const settle = (reply: WorkerReply) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      void worker.terminate();
      resolve(reply);
    };
    const timer = setTimeout(() => settle({ ok: false, code: 'timed_out', detail: '' }), limits.timeoutMs);
    worker.once('message', (message: WorkerReply) => settle(message));
    worker.once('error', (error: Error & { code?: string }) =>
      settle({
        ok: false,
        code: error.code === 'ERR_WORKER_OUT_OF_MEMORY' ? 'too_complex' : 'unreadable',
        detail: error.message,
      }),
    );
    worker.once('exit', (exitCode) =>
      settle({ ok: false, code: 'unreadable', detail: `the parser stopped (exit code ${exitCode})` }),
    );
  });
}

function describeFailure(
  code: SpreadsheetErrorCode,
  detail: string,
  filename: string,
  format: SpreadsheetFormat,
  limits: ReturnType<typeof checkOptions>,
): string {
  switch (code) {
    case 'timed_out':
      return `${filename} took longer than ${limits.timeoutMs / 1000} s to read and was stopped. Remove extra sheets or rows and upload it again.`;
    case 'too_large':
      // The file's own size is checked before the worker starts: from the worker, this is what it unpacks to.
      return `${filename} unpacks to more than ${sizeLabel(limits.maxInflatedBytes)}; Gatewell reads workbooks that unpack to at most ${sizeLabel(limits.maxInflatedBytes)}. Remove extra sheets or rows and upload it again.`;
    case 'too_complex':
      return `${filename} needs more than ${limits.maxMemoryMb} MB of memory to read and was stopped. Remove extra sheets or rows and upload it again.`;
    case 'too_many_rows':
    case 'too_many_columns':
      return `${filename} is too big to import: ${detail}.`;
    case 'not_spreadsheet':
      return `${filename} holds no readable workbook: it is not an xlsx or xls spreadsheet, or it is damaged.`;
    default:
      if (/password/i.test(detail))
        return `${filename} is password-protected. Save it without a password and upload it again.`;
      if (format === 'csv') return `${filename} could not be read as CSV: ${detail}.`;
      return `${filename} looks like an ${format === 'markup' ? 'xls (table markup)' : format} file but could not be read; it may be damaged or not a workbook (${detail}).`;
  }
}
