// Gatewell's parse worker: reads one upload in a throw-away thread and posts back plain values only.
// Started by parse-spreadsheet.ts with memory limits and a deadline; plain JavaScript on purpose.
// The workbook library is loaded only for workbooks and markup, so delimited text starts faster.
import { setPriority } from 'node:os';
import { parentPort, workerData } from 'node:worker_threads';
import { inflateRawSync } from 'node:zlib';
import { DelimitedTextError, parseDelimited } from './delimited-text.mjs';

/** Cached values of formula errors, by the error number the workbook stores. */
const ERROR_TEXT = {
  0: '#NULL!',
  7: '#DIV/0!',
  15: '#VALUE!',
  23: '#REF!',
  29: '#NAME?',
  36: '#NUM!',
  42: '#N/A',
  43: '#GETTING_DATA',
};

const READ_OPTIONS = {
  cellFormula: false,
  cellHTML: false,
  cellText: false,
  cellNF: false,
  cellStyles: false,
  cellDates: true,
  sheetStubs: false,
  bookVBA: false,
  bookFiles: false,
  bookDeps: false,
  dense: false,
  WTF: false,
};

class LimitError extends Error {
  /** @param {string} code @param {string} message */
  constructor(code, message) {
    super(message);
    this.code = code;
  }
}

/** @param {unknown} cell @returns {string | number | boolean | null} */
function plainValue(cell) {
  if (!cell || typeof cell !== 'object') return null;
  const { t: type, v: value } = /** @type {{ t?: unknown, v?: unknown }} */ (cell);
  if (type === 'n')
    return typeof value === 'number' ? (Number.isFinite(value) ? value : String(value)) : null;
  if (type === 's' || type === 'str')
    return typeof value === 'string' && value.trim() !== '' ? `${value}` : null;
  if (type === 'b') return value === true;
  if (type === 'd')
    return value instanceof Date && !Number.isNaN(value.getTime()) ? value.toISOString() : null;
  if (type === 'e') return typeof value === 'number' ? (ERROR_TEXT[value] ?? '#ERROR') : '#ERROR';
  return null;
}

/**
 * @param {typeof import('xlsx')} XLSX the workbook library (ES module build)
 * @param {string} name @param {Record<string, unknown>} sheet @param {number} maxRows @param {number} maxColumns
 */
function extractSheet(XLSX, name, sheet, maxRows, maxColumns) {
  /** @type {(string | number | boolean | null)[][]} */
  const sparse = [];
  let rowCount = 0;
  for (const key of Object.keys(sheet)) {
    if (key.startsWith('!')) continue;
    const value = plainValue(sheet[key]);
    if (value === null) continue;
    const { r, c } = XLSX.utils.decode_cell(key);
    if (!Number.isInteger(r) || !Number.isInteger(c) || r < 0 || c < 0) continue;
    if (r >= maxRows) throw new LimitError('too_many_rows', `sheet "${name}" has more than ${maxRows} rows`);
    if (c >= maxColumns)
      throw new LimitError('too_many_columns', `sheet "${name}" has more than ${maxColumns} columns`);
    const row = sparse[r] ?? (sparse[r] = []);
    row[c] = value;
    rowCount = Math.max(rowCount, r + 1);
  }
  const full = typeof sheet['!fullref'] === 'string' ? XLSX.utils.decode_range(sheet['!fullref']) : null;
  if (full && full.e.r >= maxRows)
    throw new LimitError('too_many_rows', `sheet "${name}" has more than ${maxRows} rows`);
  const rows = Array.from({ length: rowCount }, (_, r) => {
    const row = sparse[r] ?? [];
    return Array.from({ length: row.length }, (_, c) => row[c] ?? null);
  });
  return { name: `${name}`, rows, decimalComma: false };
}

const ZIP_END = 0x06054b50;
const ZIP_CENTRAL = 0x02014b50;
const ZIP_LOCAL = 0x04034b50;

/**
 * Refuses a zip container (xlsx, ods) whose entries unpack to more than `limit` bytes in all, before the
 * workbook library reads it: first by the sizes the central directory declares, then by inflating each
 * deflated entry with the rest of the allowance as its output cap, since a declared size can lie.
 * A container this cannot walk is left to the workbook library, which refuses it with its own message.
 * @param {Uint8Array} bytes @param {number} limit bytes
 */
function checkInflatedSize(bytes, limit) {
  const zip = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const tooLarge = () => new LimitError('too_large', `its workbook unpacks to more than ${limit} bytes`);
  let end = -1;
  for (let i = zip.length - 22; i >= Math.max(0, zip.length - 22 - 0xffff); i--) {
    if (zip.readUInt32LE(i) === ZIP_END) {
      end = i;
      break;
    }
  }
  if (end < 0) return;
  const entries = zip.readUInt16LE(end + 10);
  let at = zip.readUInt32LE(end + 16);
  let declared = 0;
  let inflated = 0;
  for (let n = 0; n < entries; n++) {
    if (at + 46 > zip.length || zip.readUInt32LE(at) !== ZIP_CENTRAL) return;
    const method = zip.readUInt16LE(at + 10);
    const compressedSize = zip.readUInt32LE(at + 20);
    // 0xffffffff stands for a ZIP64 size, which no workbook of a plate needs: counted as over the limit.
    declared += zip.readUInt32LE(at + 24);
    if (declared > limit) throw tooLarge();
    const local = zip.readUInt32LE(at + 42);
    at += 46 + zip.readUInt16LE(at + 28) + zip.readUInt16LE(at + 30) + zip.readUInt16LE(at + 32);
    if (local + 30 > zip.length || zip.readUInt32LE(local) !== ZIP_LOCAL) continue;
    const start = local + 30 + zip.readUInt16LE(local + 26) + zip.readUInt16LE(local + 28);
    const data = zip.subarray(start, Math.min(zip.length, start + compressedSize));
    if (method === 0) inflated += data.length;
    else if (method === 8) {
      try {
        inflated += inflateRawSync(data, { maxOutputLength: Math.max(1, limit - inflated + 1) }).length;
      } catch (error) {
        if (/** @type {{ code?: string }} */ (error).code === 'ERR_BUFFER_TOO_LARGE') throw tooLarge();
        return; // damaged data: the workbook library refuses it with its own message
      }
    }
    if (inflated > limit) throw tooLarge();
  }
}

async function run() {
  const { kind, format, bytes, text, sheetName, maxRows, maxColumns, maxInflatedBytes } = workerData;
  if (kind === 'delimited') {
    const { rows, delimiter } = parseDelimited(text, { maxRows, maxColumns });
    return [{ name: sheetName, rows, decimalComma: delimiter === ';' }];
  }
  // The ES module build loads several times faster than the CommonJS one; code pages matter only to xls.
  if (kind === 'workbook' && format === 'xlsx') checkInflatedSize(bytes, maxInflatedBytes);
  const XLSX = await import('xlsx/xlsx.mjs');
  if (format === 'xls') XLSX.set_cptable(await import('xlsx/dist/cpexcel.full.mjs'));
  const options = { ...READ_OPTIONS, sheetRows: maxRows + 1 };
  const book =
    kind === 'markup'
      ? XLSX.read(text, { ...options, type: 'string' })
      : XLSX.read(bytes, { ...options, type: 'array' });
  return book.SheetNames.map((name) =>
    extractSheet(XLSX, name, book.Sheets[name] ?? {}, maxRows, maxColumns),
  );
}

// Reading a file is background work beside the people reading pages: on Linux the nice value belongs to
// each thread (setpriority(2), NOTES), so this lowers the parse thread alone, not the web server.
try {
  setPriority(workerData.niceness ?? 0);
} catch {
  // Not allowed or not supported here: the parse runs at the server's own priority.
}

try {
  parentPort?.postMessage({ ok: true, sheets: await run() });
} catch (error) {
  const code = error instanceof LimitError || error instanceof DelimitedTextError ? error.code : 'unreadable';
  const detail = error instanceof Error ? error.message : String(error);
  parentPort?.postMessage({ ok: false, code, detail: detail.slice(0, 300) });
}
