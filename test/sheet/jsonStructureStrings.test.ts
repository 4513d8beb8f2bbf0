// jsonStructure finds the end of each string with indexOf; the reference is JSON.parse (the
// platform's JSON reader, RFC 8259): keys are found and duplicates named the same way whatever
// escapes, long strings and unterminated text surround them.
import { describe, expect, it } from 'vitest';
import { jsonStructure } from '../../src/sheet/jsonStructure';

describe('jsonStructure and strings', () => {
  it('finds a repeated key after strings holding escaped quotes, backslashes and brackets', () => {
    const long = 'x\\\\"{[,'.repeat(500);
    const text = `{"a": "${long.replace(/"/g, '\\"')}", "b\\"c": 1, "d": ["\\\\", "]}"], "b\\"c": 2}`;
    expect(() => JSON.parse(text)).not.toThrow();
    expect(Object.keys(JSON.parse(text))).toEqual(['a', 'b"c', 'd']);
    expect(jsonStructure(text)).toEqual({ depth: 2, duplicate: { key: 'b"c', path: [] } });
  });
  it('no duplicate when the keys differ, nesting counted outside strings only', () => {
    const text = `{"cells": [{"name": "a", "formula": "${'('.repeat(300)}"}, {"name": "b", "formula": "[[[["}]}`;
    expect(jsonStructure(text)).toEqual({ depth: 3 });
  });
  it('an unterminated string (a truncated file) ends the pass without error, also after a final backslash', () => {
    expect(jsonStructure('{"a": "abc').depth).toBe(1);
    expect(jsonStructure('{"a": "abc\\').depth).toBe(1);
  });
});
