// Bytes of a sheet file to text, the same for the command line and the app. Sheet files are
// JSON, which RFC 8259 section 8.1 requires to be UTF-8; files saved by editors that add a
// byte-order mark (UTF-8 or UTF-16, Unicode 15 section 23.8) or write UTF-16 are accepted too.
// Anything that is not well-formed (Unicode 15 table 3-7 for UTF-8; unpaired surrogates in UTF-16)
// is refused with the byte offset, never replaced by U+FFFD.

/** A file whose bytes are not text in an accepted encoding; the message names the offset. */
export class FileEncodingError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FileEncodingError';
  }
}

/** The encoding a file's bytes were read as. */
export type TextEncodingName = 'UTF-8' | 'UTF-8 with byte-order mark' | 'UTF-16LE' | 'UTF-16BE';

/** Offset of the first byte that is not part of a well-formed UTF-8 sequence, or -1. */
export function invalidUtf8Offset(b: Uint8Array, from = 0): number {
  let i = from;
  const n = b.length;
  while (i < n) {
    const c = b[i];
    if (c < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let lo = 0x80;
    let hi = 0xbf;
    if (c >= 0xc2 && c <= 0xdf) need = 1;
    else if (c >= 0xe0 && c <= 0xef) {
      need = 2;
      if (c === 0xe0) lo = 0xa0; // no overlong forms
      if (c === 0xed) hi = 0x9f; // no surrogates
    } else if (c >= 0xf0 && c <= 0xf4) {
      need = 3;
      if (c === 0xf0) lo = 0x90;
      if (c === 0xf4) hi = 0x8f; // nothing above U+10FFFF
    } else return i;
    for (let k = 1; k <= need; k++) {
      const x = b[i + k];
      if (x === undefined) return i;
      if (k === 1 ? x < lo || x > hi : x < 0x80 || x > 0xbf) return i;
    }
    i += need + 1;
  }
  return -1;
}

function decodeUtf16(b: Uint8Array, start: number, littleEndian: boolean, label: TextEncodingName): string {
  if ((b.length - start) % 2 !== 0) throw new FileEncodingError(`the file is ${label} text but has an odd number of bytes (${b.length}); it may be truncated`);
  const units = new Uint16Array((b.length - start) / 2);
  for (let k = 0; k < units.length; k++) {
    const i = start + 2 * k;
    units[k] = littleEndian ? b[i] | (b[i + 1] << 8) : (b[i] << 8) | b[i + 1];
  }
  for (let k = 0; k < units.length; k++) {
    const u = units[k];
    if (u >= 0xd800 && u <= 0xdbff) {
      const next = units[k + 1];
      if (next !== undefined && next >= 0xdc00 && next <= 0xdfff) {
        k++;
        continue;
      }
    }
    if (u >= 0xd800 && u <= 0xdfff) throw new FileEncodingError(`the file is ${label} text with an unpaired surrogate at byte offset ${start + 2 * k}`);
  }
  let out = '';
  for (let k = 0; k < units.length; k += 8192) out += String.fromCharCode(...units.subarray(k, k + 8192));
  return out;
}

/** The encoding of a file's bytes: from a byte-order mark, or (JSON starts with ASCII) from where the zero bytes are. */
export function detectEncoding(b: Uint8Array): TextEncodingName {
  if (b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf) return 'UTF-8 with byte-order mark';
  if (b[0] === 0xff && b[1] === 0xfe) return 'UTF-16LE';
  if (b[0] === 0xfe && b[1] === 0xff) return 'UTF-16BE';
  // RFC 4627 section 3: the first two characters of JSON text are ASCII, so the pattern of zero
  // bytes among the first four tells UTF-16 without a byte-order mark.
  if (b.length >= 2 && b[0] !== 0 && b[1] === 0) return 'UTF-16LE';
  if (b.length >= 2 && b[0] === 0 && b[1] !== 0) return 'UTF-16BE';
  return 'UTF-8';
}

/** Decodes a sheet file's bytes to text; throws FileEncodingError naming the encoding and byte offset. */
export function decodeFileBytes(bytes: Uint8Array): { text: string; encoding: TextEncodingName } {
  const encoding = detectEncoding(bytes);
  if (encoding === 'UTF-16LE' || encoding === 'UTF-16BE') {
    const bom = bytes[0] === 0xff || bytes[0] === 0xfe ? 2 : 0;
    return { text: decodeUtf16(bytes, bom, encoding === 'UTF-16LE', encoding), encoding };
  }
  const start = encoding === 'UTF-8' ? 0 : 3;
  // The platform's strict decoder (WHATWG Encoding Standard, UTF-8 decoder with fatal set: the same
  // well-formed sequences) reads a good file at once; the byte loop runs only to name a bad offset.
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes.subarray(start)), encoding };
  } catch {
    // not well-formed: find where
  }
  const bad = invalidUtf8Offset(bytes, start);
  if (bad >= 0) {
    const shown = Array.from(bytes.subarray(bad, bad + 4), (x) => x.toString(16).padStart(2, '0')).join(' ');
    throw new FileEncodingError(`the file is not valid UTF-8 text: the bytes at offset ${bad} (${shown}) are not a UTF-8 character`);
  }
  return { text: new TextDecoder('utf-8').decode(bytes.subarray(start)), encoding };
}
