import 'server-only';
import { decodeText } from './text-decoding';
import type { SpreadsheetError } from './spreadsheet-types';

/** What the uploaded bytes are, judged by their content; the file name only shapes messages. */
export type SniffResult =
  | { kind: 'workbook'; format: 'xlsx' | 'xls' }
  | { kind: 'markup'; text: string }
  | { kind: 'delimited'; text: string }
  | { kind: 'refused'; error: SpreadsheetError };

const KNOWN_BINARIES: { label: string; magic: number[] }[] = [
  { label: 'a PNG image', magic: [0x89, 0x50, 0x4e, 0x47] },
  { label: 'a JPEG image', magic: [0xff, 0xd8, 0xff] },
  { label: 'a GIF image', magic: [0x47, 0x49, 0x46, 0x38] },
  { label: 'a PDF document', magic: [0x25, 0x50, 0x44, 0x46] },
  { label: 'a gzip archive', magic: [0x1f, 0x8b] },
];
const ZIP = [0x50, 0x4b, 0x03, 0x04];
const COMPOUND_FILE = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];
const TEXT_EXTENSIONS = new Set(['csv', 'tsv', 'txt']);

/** Recognises an xlsx (ZIP) or xls (compound file) workbook, markup tables, or delimited text. */
export function sniffUpload(bytes: Uint8Array, filename: string): SniffResult {
  if (startsWith(bytes, ZIP)) return { kind: 'workbook', format: 'xlsx' };
  if (startsWith(bytes, COMPOUND_FILE)) return { kind: 'workbook', format: 'xls' };
  const known = KNOWN_BINARIES.find((entry) => startsWith(bytes, entry.magic));
  if (known)
    return refuse(`${filename} is ${known.label}, not a spreadsheet. Upload an xlsx, xls or csv file.`);
  const extension = extensionOf(filename);
  const head = bytes.subarray(0, 8192);
  const utf16 = (head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff);
  if (!utf16 && head.includes(0)) {
    return refuse(
      `${filename} holds binary data that is not a spreadsheet Gatewell can read. Upload an xlsx, xls or csv file.`,
    );
  }
  const decoded = decodeText(bytes);
  if (!decoded.ok) {
    if (!TEXT_EXTENSIONS.has(extension))
      return refuse(`${filename} is not a spreadsheet: it is neither an xlsx or xls workbook nor text.`);
    const byte = decoded.byte.toString(16).toUpperCase().padStart(2, '0');
    return {
      kind: 'refused',
      error: {
        code: 'not_utf8',
        message: `${filename} is not valid UTF-8 text: byte 0x${byte} at offset ${decoded.offset} (line ${decoded.line}) cannot be read. Save the file as CSV with UTF-8 encoding and upload it again.`,
      },
    };
  }
  const text = decoded.text;
  const markup = /^\s*</.test(text.slice(0, 1024));
  if (markup && (extension === 'xls' || /<table[\s>]/i.test(text.slice(0, 65_536))))
    return { kind: 'markup', text };
  // A file named as text is taken at its word; any other name (a text file saved or renamed as .xlsx)
  // must show columns: a CSV named .xlsx is read as the CSV it is, prose is refused by name.
  if (TEXT_EXTENSIONS.has(extension) || looksLikeTable(text)) return { kind: 'delimited', text };
  return refuse(
    `${filename} is text, not a spreadsheet: its lines are not split into columns by commas, semicolons or tabs. Upload the export the instrument wrote (xlsx, xls or csv).`,
  );
}

/** How many of the first lines are looked at to judge whether text is a table. */
const LINES_LOOKED_AT = 50;
/** A cell of this many words or more reads as a sentence, not a header or a value. */
const SENTENCE_WORDS = 6;
/**
 * Cells a line of a table has at least: prose lines of one comma each ("Regards, Ann") split into two,
 * while every plate export has more columns than that (well, compound, concentration, currents…).
 */
const TABLE_CELLS = 3;

/**
 * True when text is laid out in columns: for one separator (tab, semicolon or comma), two neighbouring
 * lines split into the same number (3 or more) of cells, most of which read as values, not sentences;
 * or, for text of one line, that line splits into 2 or more. Title rows above and summary rows below a table do not matter.
 */
export function looksLikeTable(text: string): boolean {
  const lines = text
    .slice(0, 65_536)
    .split(/\r\n|\n|\r/)
    .filter((line) => line.trim() !== '')
    .slice(0, LINES_LOOKED_AT);
  if (/^sep=.$/i.test(lines[0] ?? '')) lines.shift();
  return ['\t', ';', ','].some((separator) => {
    const counts = lines.map((line) => tableCells(line, separator));
    if (counts.length === 1) return counts[0]! >= 2;
    return counts.some((count, i) => count >= TABLE_CELLS && count === counts[i + 1]);
  });
}

/** The number of cells a line splits into (quotes respected), or 0 when half of them read as sentences. */
function tableCells(line: string, separator: string): number {
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (const ch of line) {
    if (ch === '"') quoted = !quoted;
    else if (ch === separator && !quoted) {
      cells.push(cell);
      cell = '';
    } else cell += ch;
  }
  cells.push(cell);
  const sentences = cells.filter((c) => c.trim().split(/\s+/).length >= SENTENCE_WORDS).length;
  return sentences * 2 >= cells.length ? 0 : cells.length;
}

/** The lower-case extension of a file name, without the dot; empty when there is none. */
export function extensionOf(filename: string): string {
  const dot = filename.lastIndexOf('.');
  return dot < 0 ? '' : filename.slice(dot + 1).toLowerCase();
}

function startsWith(bytes: Uint8Array, magic: number[]): boolean {
  return bytes.length >= magic.length && magic.every((value, i) => bytes[i] === value);
}

function refuse(message: string): SniffResult {
  return { kind: 'refused', error: { code: 'not_spreadsheet', message } };
}
