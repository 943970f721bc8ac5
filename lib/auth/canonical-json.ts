import 'server-only';
import { createHash } from 'node:crypto';

/**
 * JSON with object keys sorted at every depth and no insignificant whitespace, so that the same
 * content always gives the same text (and the same hash) whatever order its keys were built in.
 * Values that JSON cannot carry faithfully (non-finite numbers, bigint, functions) are refused.
 */
export function canonicalJson(value: unknown): string {
  const text = encode(value, '$');
  if (text === undefined) throw new TypeError('Signed content must be a JSON value, not undefined.');
  return text;
}

function encode(value: unknown, path: string): string | undefined {
  if (value === null) return 'null';
  if (value === undefined || typeof value === 'function' || typeof value === 'symbol') return undefined;
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new TypeError(`Signed content holds a non-finite number at ${path}.`);
    return JSON.stringify(value);
  }
  if (typeof value === 'bigint')
    throw new TypeError(`Signed content holds a bigint at ${path}; convert it to a string.`);
  if (typeof value === 'string' || typeof value === 'boolean') return JSON.stringify(value);
  const withJson = value as { toJSON?: () => unknown };
  if (typeof withJson.toJSON === 'function') return encode(withJson.toJSON(), path);
  if (Array.isArray(value)) {
    return `[${value.map((item, index) => encode(item, `${path}[${index}]`) ?? 'null').join(',')}]`;
  }
  const entries = Object.keys(value as object)
    .sort()
    .flatMap((key) => {
      const encoded = encode((value as Record<string, unknown>)[key], `${path}.${key}`);
      return encoded === undefined ? [] : [`${JSON.stringify(key)}:${encoded}`];
    });
  return `{${entries.join(',')}}`;
}

/** Lower-case hex SHA-256 of the canonical JSON of the content. */
export function contentSha256(content: unknown): string {
  return createHash('sha256').update(canonicalJson(content), 'utf8').digest('hex');
}
