// Opening files that are not sheets, in node: binary content named by its kind and never printed,
// and repeated messages merged with a count.
import { describe, expect, it } from 'vitest';
import { firstBinaryCharacter, knownBinaryKind, lineAndColumn, notTextMessage, printable } from '../../web/files/binaryContent';
import { openSheetFile } from '../../web/files/openSheetFile';
import { MAX_MESSAGES, withMessage, type Message } from '../../web/app/messageList';

const fileOf = (bytes: Uint8Array<ArrayBuffer> | string, name: string) => Object.assign(new Blob([bytes]), { name });
/** Characters no message may show: controls other than tab and line breaks, DEL, C1, U+FFFD. */
const GARBAGE = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\ufffd]/;
// The start of a PNG file: signature and IHDR chunk of a 1 x 1 image (W3C PNG 2003, 5.2 and 11.2.2).
const PNG = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 6, 0, 0, 0, 0x1f, 0x15, 0xc4, 0x89]);

describe('files that are not text (signatures from each format’s specification)', () => {
  it('names PNG, JPEG, GIF, PDF, ZIP and gzip by their leading bytes', () => {
    expect(knownBinaryKind(PNG)).toBe('a PNG image'); // W3C PNG 2003, 5.2
    expect(knownBinaryKind(new Uint8Array([0xff, 0xd8, 0xff, 0xe0]))).toBe('a JPEG image'); // ITU-T T.81, B.1
    expect(knownBinaryKind(new TextEncoder().encode('GIF89a'))).toBe('a GIF image');
    expect(knownBinaryKind(new TextEncoder().encode('%PDF-1.7\n'))).toBe('a PDF document');
    expect(knownBinaryKind(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 20, 0]))).toMatch(/^a ZIP archive/);
    expect(knownBinaryKind(new Uint8Array([0x1f, 0x8b, 8, 0]))).toBe('a gzip-compressed file'); // RFC 1952, 2.3.1
    expect(knownBinaryKind(new TextEncoder().encode('{"format":"strainsheet"}'))).toBeNull();
  });
  it('finds the first character no JSON text holds unescaped (RFC 8259, section 7) and where it is', () => {
    expect(firstBinaryCharacter('{"a":\t1,\r\n"b": 2}')).toBe(-1);
    expect(firstBinaryCharacter('{"a":\n1\u0000}')).toBe(7);
    expect(lineAndColumn('{"a":\n1\u0000}', 7)).toEqual({ line: 2, column: 2 });
    expect(printable('bad \u0000\u001b[2J\ufffd here')).toBe('bad ??[2J? here');
  });
});

describe('opening a file that is not a sheet', () => {
  const reject = () => {
    throw new Error('not reached');
  };
  it('a PNG: named as an image, with the file name, no bytes of it, the sheet unchanged', async () => {
    const r = await openSheetFile(fileOf(PNG, 'figure.png'), reject);
    expect(r).toEqual({ ok: false, message: '"figure.png" was not opened: it is a PNG image, not a sheet; a sheet file is JSON text (such as name.strainsheet.json). The sheet is unchanged.' });
  });
  it('binary data of no known kind, as UTF-8 or read as UTF-16: named as binary with its place, nothing of it printed', async () => {
    const utf8 = await openSheetFile(fileOf(new Uint8Array([0x7b, 0x0a, 0x01, 0x02, 0x03, 0x7d]), 'data.bin'), reject);
    expect(utf8.ok).toBe(false);
    if (!utf8.ok) expect(utf8.message).toBe('"data.bin" was not opened: it holds binary data, not text (character U+0001 at line 2, column 1); a sheet file is JSON text (such as name.strainsheet.json). The sheet is unchanged.');
    // A zero second byte makes the decoder read UTF-16 (RFC 4627, section 3); the characters it
    // then finds are not text either.
    const utf16 = await openSheetFile(fileOf(new Uint8Array([0x41, 0x00, 0x05, 0x00, 0x0b, 0x00]), 'odd.dat'), reject);
    expect(utf16.ok).toBe(false);
    if (!utf16.ok) expect(utf16.message).toMatch(/^"odd\.dat" was not opened: it holds binary data, not text \(character U\+0005 at line 1, column 2\)/);
  });
  it('never prints a control character, even from a parser’s own message or a file name', async () => {
    const r = await openSheetFile(fileOf('{"x": 1', 'name\u0007with-bell.json'), () => {
      throw new Error('Unexpected end of JSON input near "\u001b[31m"');
    });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).not.toMatch(GARBAGE);
  });
});

describe('a data file that is not text', () => {
  it('is named by its kind or as binary data before any parser sees it; text, UTF-8 or UTF-16, passes', async () => {
    expect(await notTextMessage(fileOf(PNG, 'bins.png'), 'a data file (CSV or JSON)')).toBe('"bins.png" was not read: it is a PNG image, not a data file (CSV or JSON). The sheet is unchanged.');
    expect(await notTextMessage(fileOf(new Uint8Array([0x66, 0x2c, 0x0a, 0x31, 0x2c, 0x1b, 0x0a]), 'x.csv'), 'a data file (CSV or JSON)')).toBe(
      '"x.csv" was not read: it holds binary data, not text (at line 2, column 3); a data file (CSV or JSON) is text. The sheet is unchanged.',
    );
    expect(await notTextMessage(fileOf('freq,rho\n2.26 nHz,-7.1\n', 'ok.csv'), 'a data file')).toBeNull();
    // "f," in UTF-16LE with a byte-order mark: zero bytes, yet text.
    expect(await notTextMessage(fileOf(new Uint8Array([0xff, 0xfe, 0x66, 0x00, 0x2c, 0x00]), 'u16.csv'), 'a data file')).toBeNull();
  });
});

describe('repeated messages', () => {
  it('merges an equal message into the one shown, counting, and keeps at most MAX_MESSAGES', () => {
    let list: Message[] = [];
    list = withMessage(list, 'a', 'error', 1).list;
    list = withMessage(list, 'b', 'error', 2).list;
    list = withMessage(list, 'a', 'error', 3).list;
    expect(list.map((m) => [m.id, m.text, m.count])).toEqual([
      [2, 'b', 1],
      [1, 'a', 2],
    ]);
    list = withMessage(list, 'a', 'info', 4).list; // same text, other tone: its own message
    expect(list).toHaveLength(3);
    for (let i = 0; i < 6; i++) list = withMessage(list, `m${i}`, 'error', 10 + i).list;
    expect(list.map((m) => m.text)).toEqual(['m2', 'm3', 'm4', 'm5']);
    expect(list).toHaveLength(MAX_MESSAGES);
  });
});
