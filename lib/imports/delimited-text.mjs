// Gatewell's reader for delimited text (csv, tsv): plain JavaScript so the parse worker runs it as is.

const CANDIDATES = [',', ';', '\t'];

/** A refusal raised while reading delimited text; `code` matches the spreadsheet error codes. */
export class DelimitedTextError extends Error {
  /** @param {string} code @param {string} message */
  constructor(code, message) {
    super(message);
    this.code = code;
  }
}

/**
 * Splits text into rows of fields (quotes as in RFC 4180: "" inside quotes is one quote; quoted fields
 * may hold delimiters and line breaks). A first line `sep=;` chooses the delimiter; otherwise comma,
 * semicolon or tab is guessed from the first lines. Empty fields become null.
 * @param {string} text
 * @param {{ maxRows: number, maxColumns: number }} limits
 * @returns {{ rows: (string | null)[][], delimiter: string }}
 */
export function parseDelimited(text, limits) {
  let body = text;
  let delimiter;
  const hint = /^sep=(.)\r?\n/.exec(body.slice(0, 8));
  if (hint) {
    delimiter = hint[1];
    body = body.slice(hint[0].length);
  } else {
    delimiter = guessDelimiter(body);
  }
  return { rows: splitRows(body, delimiter, limits), delimiter };
}

/**
 * Scores each candidate by its best (count per line × lines with that count), so a separator that
 * recurs consistently beats decimal commas scattered through semicolon-separated rows.
 * @param {string} text
 */
function guessDelimiter(text) {
  const lines = text
    .slice(0, 65536)
    .split(/\r\n|\n|\r/, 20)
    .filter((line) => line.trim() !== '')
    .map((line) => line.replace(/"[^"]*"/g, ''));
  let best = ',';
  let bestScore = 0;
  for (const candidate of CANDIDATES) {
    /** @type {Map<number, number>} */
    const frequency = new Map();
    for (const line of lines) {
      const count = line.split(candidate).length - 1;
      if (count > 0) frequency.set(count, (frequency.get(count) ?? 0) + 1);
    }
    const score = Math.max(0, ...[...frequency].map(([count, lineCount]) => count * lineCount));
    if (score > bestScore) {
      best = candidate;
      bestScore = score;
    }
  }
  return best;
}

/**
 * @param {string} text
 * @param {string} delimiter
 * @param {{ maxRows: number, maxColumns: number }} limits
 */
function splitRows(text, delimiter, limits) {
  /** @type {(string | null)[][]} */
  const rows = [];
  /** @type {(string | null)[]} */
  let row = [];
  let i = 0;
  const n = text.length;
  const endRow = () => {
    if (rows.length >= limits.maxRows) {
      throw new DelimitedTextError('too_many_rows', `it has more than ${limits.maxRows} rows`);
    }
    rows.push(row);
    row = [];
  };
  const pushField = (/** @type {string} */ value) => {
    if (row.length >= limits.maxColumns) {
      throw new DelimitedTextError(
        'too_many_columns',
        `row ${rows.length + 1} has more than ${limits.maxColumns} columns`,
      );
    }
    row.push(value === '' ? null : value);
  };
  while (i < n) {
    let value = '';
    if (text[i] === '"') {
      const startRow = rows.length + 1;
      i += 1;
      for (;;) {
        const close = text.indexOf('"', i);
        if (close < 0)
          throw new DelimitedTextError(
            'unreadable',
            `a quoted field that starts on row ${startRow} is never closed`,
          );
        value += text.slice(i, close);
        i = close + 1;
        if (text[i] !== '"') break;
        value += '"';
        i += 1;
      }
    }
    let end = i;
    while (end < n && text[end] !== delimiter && text[end] !== '\n' && text[end] !== '\r') end += 1;
    value += text.slice(i, end);
    pushField(value);
    i = end;
    if (i >= n) break;
    if (text[i] === delimiter) {
      i += 1;
      if (i >= n) pushField('');
      continue;
    }
    i += text[i] === '\r' && text[i + 1] === '\n' ? 2 : 1;
    if (row.length === 1 && row[0] === null) row = [];
    endRow();
  }
  if (row.length > 0) {
    if (row.length === 1 && row[0] === null) row = [];
    endRow();
  }
  return rows;
}
