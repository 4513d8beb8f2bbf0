// Telling a file that is not text before it is read as a sheet, so that what the user sees is
// "x.png is a PNG image" and never the bytes of the image (issue 15). Known kinds are found by the
// signature their format puts at the start; anything else with control characters is binary data.

interface Signature {
  kind: string;
  bytes: readonly number[];
}

const ascii = (s: string) => Array.from(s, (c) => c.charCodeAt(0));

const SIGNATURES: readonly Signature[] = [
  // PNG specification (W3C 2003), section 5.2: the eight-byte PNG signature.
  { kind: 'a PNG image', bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  // ITU-T T.81 (1992), table B.1: SOI marker FF D8, then a marker segment (FF).
  { kind: 'a JPEG image', bytes: [0xff, 0xd8, 0xff] },
  // GIF89a specification (CompuServe 1990), section 17: the header "GIF87a" or "GIF89a".
  { kind: 'a GIF image', bytes: ascii('GIF8') },
  // PDF Reference, sixth edition (Adobe 2006), section 3.4.1: the header line "%PDF-1.n".
  { kind: 'a PDF document', bytes: ascii('%PDF-') },
  // PKWARE APPNOTE.TXT 6.3.4 (2014), section 4.3.7: local file header signature 0x04034b50.
  { kind: 'a ZIP archive (or a document stored as one, such as a spreadsheet)', bytes: [0x50, 0x4b, 0x03, 0x04] },
  // Deutsch 1996, RFC 1952, section 2.3.1: ID1 = 31, ID2 = 139.
  { kind: 'a gzip-compressed file', bytes: [0x1f, 0x8b] },
];

/** What a known binary format the bytes start with, or null. */
export function knownBinaryKind(bytes: Uint8Array): string | null {
  for (const s of SIGNATURES) if (s.bytes.length <= bytes.length && s.bytes.every((b, i) => bytes[i] === b)) return s.kind;
  return null;
}

// C0 controls other than tab, line feed and carriage return, DEL, C1 controls, and the
// replacement character a decoder leaves for bytes it could not read. None can stand in JSON text
// unescaped (IETF RFC 8259, section 7: control characters must be escaped).
const NOT_TEXT = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\ufffd]/;

/** The position (0-based) of the first character that no text file holds, or -1. */
export function firstBinaryCharacter(text: string): number {
  const m = NOT_TEXT.exec(text);
  return m ? m.index : -1;
}

/** Line and column (1-based) of a position in a text. */
export function lineAndColumn(text: string, index: number): { line: number; column: number } {
  let line = 1;
  let start = 0;
  for (let i = text.indexOf('\n'); i >= 0 && i < index; i = text.indexOf('\n', i + 1)) {
    line++;
    start = i + 1;
  }
  return { line, column: index - start + 1 };
}

/** A message safe to show: characters that are not text become '?', and it is cut to `max` characters. */
export function printable(message: string, max = 400): string {
  const clean = message.replace(new RegExp(NOT_TEXT.source, 'g'), '?');
  return clean.length > max ? `${clean.slice(0, max - 1)}…` : clean;
}

/** Bytes looked at to tell text from binary data before a data file is parsed. */
const SNIFF_BYTES = 65536;

/**
 * Why a file picked as text cannot be text (a known binary kind, or characters no text holds in its
 * first 64 KiB), as a message naming the file; null when it looks like text. UTF-16 text (zero
 * bytes in the pattern of RFC 4627, section 3) is left to the reader.
 */
export async function notTextMessage(file: Blob & { name?: string }, expected: string): Promise<string | null> {
  const label = file.name ? `"${printable(file.name, 120)}"` : 'The file';
  let head: Uint8Array;
  try {
    head = new Uint8Array(await file.slice(0, SNIFF_BYTES).arrayBuffer());
  } catch {
    return null;
  }
  const kind = knownBinaryKind(head);
  if (kind) return `${label} was not read: it is ${kind}, not ${expected}. The sheet is unchanged.`;
  if (head.length >= 2 && (head[0] === 0) !== (head[1] === 0)) return null;
  if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) return null;
  // A multi-byte character cut at the end of the sample is not an error: drop the last 3 bytes' verdict.
  const text = new TextDecoder('utf-8').decode(head.length === SNIFF_BYTES ? head.subarray(0, SNIFF_BYTES - 3) : head);
  const bad = firstBinaryCharacter(text);
  if (bad < 0) return null;
  const at = lineAndColumn(text, bad);
  return `${label} was not read: it holds binary data, not text (at line ${at.line}, column ${at.column}); ${expected} is text. The sheet is unchanged.`;
}
