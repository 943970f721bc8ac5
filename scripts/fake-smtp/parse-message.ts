// Reads the parts of a received e-mail that Gatewell's tests and people look at: headers, subject and
// the plain text, with quoted-printable, base64 and encoded-word headers decoded (UTF-8 assumed).

export interface ParsedMessage {
  headers: Record<string, string>;
  subject: string;
  text: string;
}

function splitHead(raw: string): { head: string; body: string } {
  const at = raw.search(/\r?\n\r?\n/);
  if (at < 0) return { head: raw, body: '' };
  return { head: raw.slice(0, at), body: raw.slice(at).replace(/^\r?\n\r?\n/, '') };
}

function parseHeaders(head: string): Record<string, string> {
  const headers: Record<string, string> = {};
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon > 0) headers[line.slice(0, colon).trim().toLowerCase()] = line.slice(colon + 1).trim();
  }
  return headers;
}

function decodeQuotedPrintable(text: string): string {
  const bytes: number[] = [];
  const soft = text.replace(/=\r?\n/g, '');
  for (let i = 0; i < soft.length; i++) {
    const hex = soft.slice(i + 1, i + 3);
    if (soft[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else bytes.push(...Buffer.from(soft[i]!, 'utf8'));
  }
  return Buffer.from(bytes).toString('utf8');
}

/** Decodes =?UTF-8?Q?…?= and =?UTF-8?B?…?= words of a header. */
export function decodeHeader(value: string): string {
  return value.replace(
    /=\?[^?]+\?([QqBb])\?([^?]*)\?=(\s+(?==\?))?/g,
    (_all, encoding: string, data: string) =>
      encoding.toUpperCase() === 'B'
        ? Buffer.from(data, 'base64').toString('utf8')
        : decodeQuotedPrintable(data.replace(/_/g, ' ')),
  );
}

function decodeBody(headers: Record<string, string>, body: string): string {
  const encoding = (headers['content-transfer-encoding'] ?? '').toLowerCase();
  if (encoding === 'quoted-printable') return decodeQuotedPrintable(body);
  if (encoding === 'base64') return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
  return body;
}

/** The first text/plain part of a (possibly multipart) entity. */
function plainText(headers: Record<string, string>, body: string): string {
  const type = headers['content-type'] ?? 'text/plain';
  const boundary = /boundary="?([^";]+)"?/i.exec(type)?.[1];
  if (!/^multipart\//i.test(type) || !boundary)
    return /^text\/plain/i.test(type) ? decodeBody(headers, body) : '';
  for (const part of body.split(`--${boundary}`).slice(1)) {
    if (part.startsWith('--')) break;
    const { head, body: partBody } = splitHead(part.replace(/^\r?\n/, ''));
    const text = plainText(parseHeaders(head), partBody.replace(/\r?\n$/, ''));
    if (text) return text;
  }
  return '';
}

export function parseMessage(raw: string): ParsedMessage {
  const { head, body } = splitHead(raw);
  const headers = parseHeaders(head);
  return {
    headers,
    subject: decodeHeader(headers.subject ?? ''),
    text: plainText(headers, body).replace(/\r\n/g, '\n'),
  };
}
