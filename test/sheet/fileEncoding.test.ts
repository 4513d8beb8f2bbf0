// Reading sheet files as bytes (issue 10): byte-order marks and UTF-16 accepted alike by the command
// line and the app, malformed UTF-8 refused with its byte offset, duplicated keys and deep nesting
// refused by name. Byte sequences are from the Unicode Standard 15.0: the byte-order mark U+FEFF
// is EF BB BF in UTF-8, FF FE in UTF-16LE and FE FF in UTF-16BE (section 23.8); table 3-7 lists the
// well-formed UTF-8 sequences (C0 and ED A0 80, an overlong form and a surrogate, are not).
import { describe, expect, it } from 'vitest';
import { Sheet, SheetFileError } from '../../src/sheet/sheet';
import { parseSheetFile, sheetTextFromBytes } from '../../src/sheet/sheetFile';
import { decodeFileBytes, invalidUtf8Offset } from '../../src/sheet/fileEncoding';
import { jsonStructure } from '../../src/sheet/jsonStructure';

const text = JSON.stringify({ format: 'strainsheet', version: 1, title: 'Größe μ', notes: '', cells: [{ name: 'a', formula: '"ω 𝛾"' }] });

function utf16(t: string, littleEndian: boolean, bom: boolean): Uint8Array {
  const out = new Uint8Array(2 * t.length + (bom ? 2 : 0));
  let k = 0;
  if (bom) out.set(littleEndian ? [0xff, 0xfe] : [0xfe, 0xff], (k += 2) - 2);
  for (let i = 0; i < t.length; i++, k += 2) {
    const u = t.charCodeAt(i);
    out[k] = littleEndian ? u & 0xff : u >> 8;
    out[k + 1] = littleEndian ? u >> 8 : u & 0xff;
  }
  return out;
}

function refusal(run: () => unknown): string {
  try {
    run();
  } catch (e) {
    expect(e).toBeInstanceOf(SheetFileError);
    return (e as Error).message;
  }
  throw new Error('accepted');
}

describe('sheet file bytes', () => {
  const utf8 = new TextEncoder().encode(text);
  it('reads UTF-8 with and without a byte-order mark, and UTF-16 either way round, as the same text', () => {
    const variants: Array<[string, Uint8Array]> = [
      ['UTF-8', utf8],
      ['UTF-8 with byte-order mark', new Uint8Array([0xef, 0xbb, 0xbf, ...utf8])],
      ['UTF-16LE', utf16(text, true, true)],
      ['UTF-16BE', utf16(text, false, true)],
      ['UTF-16LE', utf16(text, true, false)],
      ['UTF-16BE', utf16(text, false, false)],
    ];
    for (const [encoding, bytes] of variants) {
      const r = decodeFileBytes(bytes);
      expect(r.encoding).toBe(encoding);
      expect(r.text).toBe(text);
      expect(Sheet.fromFile(sheetTextFromBytes(bytes)).title).toBe('Größe μ');
    }
    // text that still starts with U+FEFF (as some readers leave it) is accepted too
    expect(parseSheetFile('\ufeff' + text).title).toBe('Größe μ');
  });

  it('refuses malformed UTF-8 naming the byte offset, instead of replacing it', () => {
    const at = utf8.indexOf(0x22, 10); // a quote inside the file
    for (const bad of [[0xc0, 0xaf], [0xed, 0xa0, 0x80], [0xff], [0xe2, 0x82]]) {
      const bytes = new Uint8Array([...utf8.subarray(0, at + 1), ...bad, ...utf8.subarray(at + 1)]);
      expect(invalidUtf8Offset(bytes)).toBe(at + 1);
      expect(refusal(() => sheetTextFromBytes(bytes))).toMatch(new RegExp(`not valid UTF-8 text: the bytes at offset ${at + 1} \\(${bad[0].toString(16)}`));
    }
    // well-formed 2-, 3- and 4-byte sequences pass (U+00E9, U+20AC, U+1D6FE)
    expect(invalidUtf8Offset(new Uint8Array([0xc3, 0xa9, 0xe2, 0x82, 0xac, 0xf0, 0x9d, 0x9b, 0xbe]))).toBe(-1);
  });

  it('refuses UTF-16 with an unpaired surrogate or an odd length', () => {
    const bytes = utf16('{"a":"\ud800x"}', true, true);
    expect(refusal(() => sheetTextFromBytes(bytes))).toMatch(/UTF-16LE text with an unpaired surrogate at byte offset 14/);
    expect(refusal(() => sheetTextFromBytes(bytes.subarray(0, bytes.length - 1)))).toMatch(/odd number of bytes/);
  });
});

describe('sheet file structure', () => {
  it('refuses a duplicated key, naming the key and the cell', () => {
    const dupCell = '{"format":"strainsheet","version":1,"cells":[{"name":"a","formula":"1"},{"name":"b","formula":"1","formula":"2"}]}';
    expect(refusal(() => parseSheetFile(dupCell))).toMatch(/the key "formula" appears twice in cell 2 \(b\)/);
    const dupTop = '{"format":"strainsheet","version":1,"title":"x","title":"y","cells":[]}';
    expect(refusal(() => parseSheetFile(dupTop))).toMatch(/the key "title" appears twice in the file's top level/);
    // the same key in different objects, and escaped spellings of one key, are told apart correctly
    expect(jsonStructure('[{"a":1},{"a":2}]').duplicate).toBeUndefined();
    expect(jsonStructure('{"a":1,"\\u0061":2}').duplicate).toEqual({ key: 'a', path: [] });
    expect(jsonStructure('{"x":{"k":"}{,","k":2}}').duplicate).toEqual({ key: 'k', path: ['x'] });
  });

  it('reports the nesting depth of a deeply nested file instead of a stack overflow', () => {
    const deep = `{"format":"strainsheet","version":1,"cells":[],"title":${'['.repeat(100_000)}${']'.repeat(100_000)}}`;
    expect(refusal(() => parseSheetFile(deep))).toMatch(/nests objects and lists 100001 levels deep; a sheet file has 3 \(at most 32 are read\)/);
  });

  it('names the fields of a version-0 file as that version calls them', () => {
    const v0 = JSON.stringify({ format: 'strainsheet', version: 0, description: 3, cells: [] });
    expect(refusal(() => parseSheetFile(v0))).toMatch(/invalid at description: expected text/);
    const v0cell = JSON.stringify({ format: 'strainsheet', version: 0, cells: [{ name: 'a', formula: '1', display: 5 }] });
    expect(refusal(() => parseSheetFile(v0cell))).toMatch(/invalid at cell 1\.display: expected text/);
    const v0comment = JSON.stringify({ format: 'strainsheet', version: 0, cells: [{ name: 'a', formula: '1', comment: [] }] });
    expect(refusal(() => parseSheetFile(v0comment))).toMatch(/invalid at cell 1\.comment: expected text/);
  });
});
