import 'server-only';
// Decoding uploaded delimited text: UTF-8 (with or without a byte-order mark) or UTF-16 with a mark.

/** Decoded text, or where the bytes stop being valid UTF-8 (0-based byte offset, 1-based line). */
export type DecodeTextResult =
  { ok: true; text: string } | { ok: false; offset: number; line: number; byte: number };

/** Decodes bytes as text, honouring a UTF-8 or UTF-16 byte-order mark; the mark is dropped. */
export function decodeText(bytes: Uint8Array): DecodeTextResult {
  if (bytes[0] === 0xff && bytes[1] === 0xfe) return decodeStrict(bytes.subarray(2), 'utf-16le');
  if (bytes[0] === 0xfe && bytes[1] === 0xff) return decodeStrict(bytes.subarray(2), 'utf-16be');
  const start = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  const body = bytes.subarray(start);
  const decoded = decodeStrict(body, 'utf-8');
  if (decoded.ok) return decoded;
  const offset = firstInvalidUtf8(body) + start;
  let line = 1;
  for (let i = 0; i < offset; i += 1) if (bytes[i] === 0x0a) line += 1;
  return { ok: false, offset, line, byte: bytes[offset] ?? 0 };
}

function decodeStrict(bytes: Uint8Array, encoding: string): DecodeTextResult {
  try {
    // ignoreBOM keeps a second mark as text; the first was already removed above.
    return { ok: true, text: new TextDecoder(encoding, { fatal: true, ignoreBOM: true }).decode(bytes) };
  } catch {
    return { ok: false, offset: 0, line: 1, byte: bytes[0] ?? 0 };
  }
}

/** Offset of the first byte that does not begin a well-formed UTF-8 sequence, or the length if none. */
export function firstInvalidUtf8(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const lead = bytes[i] ?? 0;
    if (lead < 0x80) {
      i += 1;
      continue;
    }
    const extra =
      lead >= 0xc2 && lead <= 0xdf
        ? 1
        : lead >= 0xe0 && lead <= 0xef
          ? 2
          : lead >= 0xf0 && lead <= 0xf4
            ? 3
            : 0;
    if (extra === 0 || i + extra >= bytes.length) return i;
    const [low, high] = secondByteRange(lead);
    const second = bytes[i + 1] ?? 0;
    if (second < low || second > high) return i;
    for (let k = 2; k <= extra; k += 1) {
      const next = bytes[i + k] ?? 0;
      if (next < 0x80 || next > 0xbf) return i;
    }
    i += extra + 1;
  }
  return bytes.length;
}

// Overlong forms, surrogates and code points above U+10FFFF are excluded by narrowing the second byte.
function secondByteRange(lead: number): [number, number] {
  if (lead === 0xe0) return [0xa0, 0xbf];
  if (lead === 0xed) return [0x80, 0x9f];
  if (lead === 0xf0) return [0x90, 0xbf];
  if (lead === 0xf4) return [0x80, 0x8f];
  return [0x80, 0xbf];
}
