// The free-spectrum built-ins on the demo sheet (examples/demo.json, an invented scenario) and the
// `strainsheet import` command in-process (src/cli/main.ts): the sheet file is left byte for byte
// unchanged on bad input.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { main } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/cliIO';
import { BandComparisonObject } from '../../src/builtins/freeSpectrumObjects';

const demoText = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');

function io(): CliIO & { outText: string; errText: string } {
  const o = { outText: '', errText: '', out: (t: string) => void (o.outText += t), err: (t: string) => void (o.errText += t) };
  return o;
}

describe('demo sheet: the headline comparison across the band', () => {
  const sheet = Sheet.fromFile(demoText);
  it('comparison is a band comparison and calls the circular spectrum inconsistent (lowest bin far above the invented data)', () => {
    const v = sheet.value('comparison');
    expect(v).toBeInstanceOf(BandComparisonObject);
    const c = (v as BandComparisonObject).comparison;
    expect(c.verdict).toBe('inconsistent');
    expect(c.disagreeingBins[0]).toBe(1);
  });
  it('while the single-number comparison at f_yr says inside the interval', () => {
    const st = sheet.state('comparison_yr');
    expect(st.status).toBe('value');
    expect((sheet.value('comparison_yr') as { describe(): string }).describe()).toMatch(/inside the 90% interval/);
  });
  it('the f_yr comparison warns when the slope departs from the assumed gamma by more than 0.5', () => {
    const s = Sheet.fromFile(demoText);
    s.updateCell('comparison_yr', { formula: 'compareToMeasured(A_yr, measuredAmplitude(2.9e-15, 1.8e-15, 4.4e-15, 0.9, 3.2), spectrum)' });
    expect((s.value('comparison_yr') as { describe(): string }).describe()).toMatch(/warning: the model's slope .* gamma = 4.33, not the 3.2/);
  });
  it('bad arguments are refused with the function and argument named', () => {
    const s = Sheet.fromFile(demoText);
    s.updateCell('comparison', { formula: 'compareAcrossBand(spectrum, measured)' });
    const st = s.state('comparison');
    expect(st.status === 'error' && st.error.message).toMatch(/argument measured of compareAcrossBand must be a freeSpectrum/);
    s.updateCell('comparison', { formula: 'measuredFreeSpectrum("fs1;quantity=log10rho;span_s=1;thin=1;bins=1e-9@0:1:3:AAB")' });
    const st2 = s.state('comparison');
    expect(st2.status === 'error' && st2.error.message).toMatch(/bin 1: 3 samples need 6 characters/);
  });
});

describe('strainsheet import', () => {
  const dir = mkdtempSync(join(tmpdir(), 'strainsheet-import-'));
  const sheetPath = join(dir, 'sheet.json');
  const small = JSON.stringify({ format: 'strainsheet', version: 1, title: 't', notes: '', cells: [{ name: 'x', formula: '1' }] }, null, 2) + '\n';
  it('stores a free spectrum as a cell and the sheet evaluates it', async () => {
    writeFileSync(sheetPath, small);
    const data = join(dir, 'fs.csv');
    writeFileSync(data, '2.26 nHz,4.52 nHz\n-6.5,-7.0\n-6.6,-7.1\n-6.4,-7.2\n');
    const o = io();
    expect(await main(['import', sheetPath, data, '--as', 'measured_fs', '--kind', 'free-spectrum', '--prior', '-10:-4'], o)).toBe(0);
    const s = Sheet.fromFile(readFileSync(sheetPath, 'utf8'));
    expect((s.value('measured_fs') as { describe(): string }).describe()).toMatch(/free spectrum, 2 bins, 2.26 nHz to 4.52 nHz, 3 samples/);
  });
  it('bad data: exit 2, the error names file, line and column, and the sheet file is unchanged', async () => {
    writeFileSync(sheetPath, small);
    const data = join(dir, 'bad.csv');
    writeFileSync(data, '2.26 nHz,4.52 nHz\n-6.5,-7.0\n-6.6,oops\n');
    const o = io();
    expect(await main(['import', sheetPath, data, '--as', 'fs', '--kind', 'free-spectrum'], o)).toBe(2);
    expect(o.errText).toMatch(/bad\.csv, line 3, column 2: .*"oops" is not a number/);
    expect(o.errText).toMatch(/was not changed/);
    expect(readFileSync(sheetPath, 'utf8')).toBe(small);
  });
});
