// The prior stated in the Open data dialog is stored with the free spectrum: the last two arguments
// of measuredFreeSpectrum(...), which the engine divides out (docs/freeSpectrum.md). A uniform prior
// in log10 rho_k over a stated range is the common choice in published free spectra (Lamb, Taylor &
// van Haasteren 2023, PRD 108, 103019).
import { describe, expect, it } from 'vitest';
import { openDataFile, priorInFormula } from '../../web/files/openDataFile';
import { Sheet } from '../../src/sheet/sheet';
import type { CellSpec } from '../../src/sheet/types';

const CSV = '2.26 nHz,4.52 nHz\n-6.5,-7.0\n-6.6,-7.1\n-6.4,-7.2\n';
const file = (name: string, text: string) => Object.assign(new Blob([text], { type: 'text/csv' }), { name });

async function read(prior: Parameters<typeof openDataFile>[2], cells: CellSpec[] = []) {
  const r = await openDataFile(file('bins.csv', CSV), cells, prior);
  return r;
}

function valueDescription(cell: CellSpec): string {
  const sheet = new Sheet({ title: 't', cells: [cell] });
  const v = sheet.value(cell.name) as { describe(): string };
  return v.describe();
}

describe('Open data: the stated prior is stored with the data', () => {
  it('uniform on a stated range: written into the formula and used by the engine', async () => {
    const r = await read({ kind: 'uniform', lower: -9.5, upper: -3 });
    if (!r.ok) throw new Error(r.message);
    expect(priorInFormula(r.cell.formula)).toEqual({ lower: -9.5, upper: -3 });
    expect(r.message).toContain('Prior stated: uniform -9.5 to -3');
    expect(valueDescription(r.cell)).toContain('prior uniform in log10 rho -9.5 to -3');
  });

  it('none: no prior in the formula, even when the cell had one; keep: the cell’s own prior', async () => {
    const existing: CellSpec = { name: 'measured_free_spectrum', formula: 'measuredFreeSpectrum("x", -10, -4)' };
    const none = await read({ kind: 'none' }, [existing]);
    if (!none.ok) throw new Error(none.message);
    expect(priorInFormula(none.cell.formula)).toBeUndefined();
    expect(valueDescription(none.cell)).toContain('no prior divided');
    const kept = await read({ kind: 'keep' }, [existing]);
    if (!kept.ok) throw new Error(kept.message);
    expect(priorInFormula(kept.cell.formula)).toEqual({ lower: -10, upper: -4 });
    expect(kept.message).toContain('Prior kept: uniform -10 to -4');
  });

  it('refuses a reversed range and samples outside the stated prior, naming the file; nothing is stored', async () => {
    const reversed = await read({ kind: 'uniform', lower: -4, upper: -10 });
    expect(reversed.ok).toBe(false);
    if (!reversed.ok) expect(reversed.message).toMatch(/"bins.csv" was not read: the prior's lower end \(-4\) must be below its upper end \(-10\)\. The sheet is unchanged\./);
    const narrow = await read({ kind: 'uniform', lower: -7, upper: -6 });
    expect(narrow.ok).toBe(false);
    if (!narrow.ok) expect(narrow.message).toMatch(/bins\.csv.*outside the prior range -7 to -6/);
  });
});
