// The sheet file format: canonical text, validation with readable messages, migrations.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { Sheet, SheetFileError } from '../../src/sheet/sheet';
import { parseSheetFile, serializeSheetFile, MAX_FILE_CELLS } from '../../src/sheet/sheetFile';
import { migrate0to1, migrateToCurrent } from '../../src/sheet/sheetMigrations';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/${name}`, import.meta.url), 'utf8');

function refusal(text: string): string {
  try {
    Sheet.fromFile(text);
  } catch (e) {
    expect(e).toBeInstanceOf(SheetFileError);
    return (e as Error).message;
  }
  throw new Error('the file was accepted');
}

const minimal = (cells: unknown[] = [], extra: Record<string, unknown> = {}) =>
  JSON.stringify({ format: 'strainsheet', version: 1, title: 't', notes: '', cells, ...extra });

describe('sheet files', () => {
  it('saving what was loaded gives the same bytes', () => {
    const text = fixture('smallSheet.json');
    expect(Sheet.fromFile(text).toFileText()).toBe(text);
  });

  it('writes canonical key order, omits empty optional fields, ends with a newline', () => {
    const s = new Sheet({ title: 'T', cells: [{ section: 'array', unit: '', formula: '1', name: 'x1', note: 'n' }] });
    expect(s.toFileText()).toBe(
      '{\n  "format": "strainsheet",\n  "version": 1,\n  "title": "T",\n  "notes": "",\n  "cells": [\n' +
        '    {\n      "name": "x1",\n      "formula": "1",\n      "note": "n",\n      "section": "array"\n    }\n  ]\n}\n',
    );
  });

  it('refuses malformed, truncated, wrong-format and newer files with readable messages', () => {
    expect(refusal(fixture('truncatedSheet.json'))).toMatch(/not valid JSON.*truncated/);
    expect(refusal('')).toMatch(/empty/);
    expect(refusal('[1, 2]')).toMatch(/not a Strainsheet sheet/);
    expect(refusal(JSON.stringify({ format: 'other', version: 1, cells: [] }))).toMatch(/"format" should be "strainsheet"/);
    expect(refusal(JSON.stringify({ format: 'strainsheet', version: 7, cells: [] }))).toMatch(/made by a newer Strainsheet/);
    expect(refusal(JSON.stringify({ format: 'strainsheet', version: 1.5, cells: [] }))).toMatch(/version/);
    expect(refusal(minimal([{ name: 'a', formula: 3 }]))).toMatch(/cell 1\.formula: expected text/);
    expect(refusal(minimal([{ name: 'a', formula: '1', colour: 'red' }]))).toMatch(/unknown field "colour"/);
    expect(refusal(minimal([], { extra: 1 }))).toMatch(/unknown field "extra"/);
    expect(refusal(minimal([{ name: 'a', formula: '1' }, { name: 'a', formula: '2' }]))).toMatch(/appears twice \(cells 1 and 2\)/);
    expect(refusal(minimal([{ name: 'pi', formula: '1' }]))).toMatch(/pi cannot be a cell name/);
  });

  it('names the field and the limit of a too-long name, unit, section or title (limits of this format)', () => {
    expect(refusal(minimal([{ name: 'a'.repeat(65), formula: '1' }]))).toMatch(/cell 1\.name: the cell name is longer than 64 characters/);
    expect(refusal(minimal([{ name: 'a', formula: '1', unit: 'm'.repeat(201) }]))).toMatch(/cell 1\.unit: longer than 200 characters/);
    expect(refusal(minimal([{ name: 'a', formula: '1' }, { name: 'b', formula: '1', section: 's'.repeat(201) }]))).toMatch(/cell 2\.section: longer than 200 characters/);
    expect(refusal(minimal([], { title: 't'.repeat(1001) }))).toMatch(/invalid at title: longer than 1000 characters/);
    expect(refusal(minimal([{ name: '', formula: '1' }]))).toMatch(/cell 1\.name: the cell name is empty/);
    expect(() => parseSheetFile(minimal([{ name: 'a', formula: '1', unit: 'm'.repeat(200) }, { name: 'b', formula: '2', section: 's'.repeat(200) }], { title: 't'.repeat(1000) }))).not.toThrow();
  });

  it('refuses hostile prototype keys', () => {
    expect(refusal('{"format":"strainsheet","version":1,"cells":[],"__proto__":{"polluted":1}}')).toMatch(/__proto__/);
    expect(refusal(minimal([{ name: 'a', formula: '1', constructor: { prototype: {} } }]))).toMatch(/constructor|prototype/);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('refuses oversized files and too many cells', () => {
    const big = minimal([{ name: 'a', formula: `"${'x'.repeat(5 * 1024 * 1024)}"` }]);
    expect(refusal(big)).toMatch(/too large/);
    const many = Array.from({ length: MAX_FILE_CELLS + 1 }, (_, i) => ({ name: `c${i}`, formula: '1' }));
    expect(refusal(minimal(many))).toMatch(/at most 20000/);
  });

  it('keeps a bad formula as a cell error, not a file error', () => {
    const s = Sheet.fromFile(minimal([{ name: 'a', formula: '1 +' }]));
    expect(s.state('a').status).toBe('error');
    expect(s.toFileText()).toContain('"formula": "1 +"');
  });

  it('serializes and parses back to the same file', () => {
    const file = parseSheetFile(fixture('smallSheet.json'));
    expect(parseSheetFile(serializeSheetFile(file))).toEqual(file);
  });
});

describe('migrations', () => {
  const v0 = {
    format: 'strainsheet',
    version: 0,
    title: 'old',
    description: 'draft notes',
    cells: [{ name: 'span', formula: '10 yr', display: 'yr', comment: 'observing span' }],
  };

  it('0 -> 1 renames display, comment and description and is pure', () => {
    const before = JSON.stringify(v0);
    expect(migrate0to1(v0)).toEqual({
      format: 'strainsheet',
      version: 1,
      title: 'old',
      notes: 'draft notes',
      cells: [{ name: 'span', formula: '10 yr', unit: 'yr', note: 'observing span' }],
    });
    expect(JSON.stringify(v0)).toBe(before);
    expect(migrateToCurrent(v0, 0)).toEqual({ ...migrate0to1(v0), version: 2 });
  });

  it('1 -> 2 changes nothing but the version; a sheet is saved as version 2 only when a cell has a prior', () => {
    const v1 = { format: 'strainsheet', version: 1, title: 't', notes: '', cells: [{ name: 'r', formula: '2', uncertainty: 'normalDist(2, 0.1)' }] };
    expect(migrateToCurrent(v1, 1)).toEqual({ ...v1, version: 2 });
    const s = Sheet.fromFile(JSON.stringify(v1));
    expect(JSON.parse(s.toFileText()).version).toBe(1);
    s.updateCell('r', { prior: 'uniformDist(1, 3)' });
    const text = s.toFileText();
    expect(JSON.parse(text).version).toBe(2);
    expect(JSON.parse(text).cells[0]).toEqual({ name: 'r', formula: '2', uncertainty: 'normalDist(2, 0.1)', prior: 'uniformDist(1, 3)' });
    expect(Sheet.fromFile(text).get('r')!.prior).toBe('uniformDist(1, 3)');
  });

  it('a file of a version after 2 is refused, naming both versions', () => {
    expect(() => parseSheetFile(JSON.stringify({ ...v0, version: 3 }))).toThrow(/file version 3; this one reads versions up to 2/);
  });

  it('a version 0 file loads and saves as version 1', () => {
    const s = Sheet.fromFile(JSON.stringify(v0));
    expect(s.get('span')).toEqual({ name: 'span', formula: '10 yr', unit: 'yr', note: 'observing span' });
    expect(s.notes).toBe('draft notes');
    expect(JSON.parse(s.toFileText()).version).toBe(1);
  });
});
