// Tabulated merger densities as a population: exact for densities whose ln is trilinear, the spectrum of
// a table sampled from an analytic population converging to the analytic spectrum as the grid's
// interpolation error (second order in the node spacing, common practice, no source), the CSV reader's
// errors naming file, line and column, the exact round trip through the sheet, and use through the sheet.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { KM_S_MPC_SI } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio, redshiftShape } from '../../src/physics/populationShapes';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import { tabulatedPopulation, type DensityTable } from '../../src/physics/tabulatedPopulation';
import { decodeDensityTable, encodeDensityTable } from '../../src/statistics/mergerTableEncoding';
import { importMergerTable } from '../../src/statistics/mergerTableImport';
import { importMergerEvents } from '../../src/statistics/mergerEventsImport';
import { ImportError } from '../../src/statistics/importText';
import { main } from '../../src/cli/main';
import { Sheet } from '../../src/sheet/sheet';
import { valueOf } from './sheetHelpers';

const cosmo = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });

function grid(a: number, b: number, n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1));
}

function sample(pop: BinaryPopulation, z: Float64Array, x: Float64Array, q: Float64Array): DensityTable {
  const density = new Float64Array(z.length * x.length * q.length);
  let n = 0;
  for (const zz of z) for (const xx of x) for (const qq of q) density[n++] = pop.density(zz, xx, qq);
  return { z, log10M: x, q, density };
}

function csvOf(t: DensityTable): string {
  const lines = ['# invented test table', 'z,log10_M_Msun,q,density_Mpc^-3'];
  let n = 0;
  for (const z of t.z) for (const x of t.log10M) for (const q of t.q) lines.push(`${z},${x},${q},${t.density[n++]}`);
  return lines.join('\n') + '\n';
}

describe('tabulated population', () => {
  it('reproduces a density whose ln is trilinear in (z, log10M, q) exactly between the nodes', () => {
    const exact = (z: number, x: number, q: number) => 1e-3 * Math.pow(10, -0.7 * (x - 8)) * Math.exp(-0.9 * z) * Math.exp(1.3 * q);
    const t: DensityTable = { z: grid(0, 3, 4), log10M: grid(6, 10, 5), q: grid(0.1, 1, 3), density: new Float64Array(60) };
    let n = 0;
    for (const z of t.z) for (const x of t.log10M) for (const q of t.q) t.density[n++] = exact(z, x, q);
    const pop = tabulatedPopulation(t);
    for (const [z, x, q] of [[0.37, 6.21, 0.55], [2.9, 9.99, 0.11], [1.5, 8, 1]]) expect(Math.abs(pop.density(z, x, q) / exact(z, x, q) - 1)).toBeLessThan(1e-12);
    expect(pop.density(3.1, 8, 0.5)).toBe(0);
    expect([pop.zMin, pop.zMax, pop.log10MMin, pop.log10MMax, pop.qMin, pop.qMax]).toEqual([0, 3, 6, 10, 0.1, 1]);
  });

  it('with zeros in the table, interpolates n linearly (a linear density is exact)', () => {
    const lin = (z: number, x: number, q: number) => 1e-4 * z * (x - 6) * q;
    const t = sample({ density: lin } as BinaryPopulation, grid(0, 2, 3), grid(6, 9, 4), grid(0.2, 1, 3));
    const pop = tabulatedPopulation(t);
    expect(Math.abs(pop.density(1.3, 7.7, 0.45) / lin(1.3, 7.7, 0.45) - 1)).toBeLessThan(1e-12);
  });

  it('a table sampled from an analytic population gives its spectrum to the interpolation error (second order in the spacing)', () => {
    // An invented phenomenological density (Middleton et al. 2016 form) on 1e6-1e10.5 Msun, z < 3.
    const analytic = phenomenologicalPopulation({ rateNorm: 1e-3, alpha: 0.3, cutoffMass: 3e9, beta: 2, z0: 1.5, redshiftWeight: (z) => redshiftShape(z, 2, 1.5), zMax: 3, log10MMin: 6, log10MMax: 10.5, massRatio: powerLawMassRatio(-0.5, 0.05), cosmology: cosmo });
    const freqs = [2e-9, 6e-9, 2e-8, 6e-8];
    const resolution = { zPanels: 8, log10MPanels: 16, qPanels: 4, order: 8 };
    const ref = characteristicStrainSquared(analytic, freqs, { resolution });
    const tableSpectrum = (nz: number, nm: number, nq: number) => characteristicStrainSquared(tabulatedPopulation(sample(analytic, grid(0, 3, nz), grid(6, 10.5, nm), grid(0.05, 1, nq))), freqs, { resolution });
    const coarse = tableSpectrum(7, 10, 5);
    const fine = tableSpectrum(13, 19, 9); // every spacing halved
    for (let i = 0; i < freqs.length; i++) {
      const eCoarse = coarse[i] / ref[i] - 1;
      const eFine = fine[i] / ref[i] - 1;
      // Trilinear interpolation errs as h^2: halving every spacing divides the error by about 4, and
      // the Richardson combination (4 fine - coarse) / 3 removes it.
      const richardson = (4 * fine[i] - coarse[i]) / 3 / ref[i] - 1;
      const msg = `f ${freqs[i]}: coarse ${eCoarse.toExponential(2)}, fine ${eFine.toExponential(2)}, Richardson ${richardson.toExponential(2)}`;
      expect(eCoarse / eFine, msg).toBeGreaterThan(3);
      expect(eCoarse / eFine, msg).toBeLessThan(5);
      expect(Math.abs(richardson), msg).toBeLessThan(0.25 * Math.abs(eFine));
    }
  });
});

describe('merger-table CSV', () => {
  const t = sample({ density: (z, x, q) => 1e-4 * Math.exp(-z) * Math.pow(10, -(x - 7)) * (1 + q) } as BinaryPopulation, grid(0, 2, 3), grid(7, 9, 3), grid(0.25, 1, 4));
  const text = csvOf(t);
  it('reads the grid back exactly, and the sheet encoding keeps every value', () => {
    const r = importMergerTable(text, 'rates.csv');
    expect(Array.from(r.z)).toEqual(Array.from(t.z));
    expect(Array.from(r.log10M)).toEqual(Array.from(t.log10M));
    expect(Array.from(r.q)).toEqual(Array.from(t.q));
    expect(Array.from(r.density)).toEqual(Array.from(t.density));
    const back = decodeDensityTable(encodeDensityTable(r));
    expect(Array.from(back.density)).toEqual(Array.from(t.density));
    expect(Array.from(back.q)).toEqual(Array.from(t.q));
  });
  it('M_Msun and Gpc^-3 columns are converted', () => {
    const alt = text.replace('log10_M_Msun', 'M_Msun').replace('density_Mpc^-3', 'density_Gpc^-3').replace(/^([\d.e+-]+),([\d.e+-]+),/gm, (_m, z, x) => `${z},${Math.pow(10, Number(x))},`);
    const r = importMergerTable(alt, 'rates.csv');
    expect(Math.abs(r.log10M[1] - 8)).toBeLessThan(1e-12);
    expect(Math.abs(r.density[5] / (t.density[5] * 1e-9) - 1)).toBeLessThan(1e-15);
  });
  const lines = text.split('\n');
  const withLine = (i: number, s: string) => lines.map((l, k) => (k === i ? s : l)).join('\n');
  const cases: [string, string, RegExp][] = [
    ['ragged row', withLine(4, '0,7,0.5'), /rates\.csv, line 5: the row has 3 cells; the header has 4/],
    ['not a number', withLine(4, '0,7,0.5,abc'), /rates\.csv, line 5, column 4: the density: "abc" is not a number/],
    ['negative rate', withLine(4, '0,7,0.75,-1e-5'), /rates\.csv, line 5, column 4: the density must not be negative/],
    ['unsorted q', withLine(4, '0,7,0.25,1e-5'), /rates\.csv, line 5, column 3: q nodes must increase/],
    ['missing row', lines.filter((_, k) => k !== 9).join('\n'), /rates\.csv, line \d+, column \d: .* where the grid order/],
    ['density without unit', text.replace('density_Mpc^-3', 'density'), /rates\.csv, line 2, column 4: the header "density" has no unit/],
    ['mass without unit', text.replace('log10_M_Msun', 'log10_M'), /rates\.csv, line 2, column 2: the header "log10_M" has no unit/],
    ['q above 1', withLine(5, '0,7,1.5,1e-5'), /rates\.csv, line 6, column 3: q must lie in \(0, 1\]/],
  ];
  for (const [what, bad, re] of cases) {
    it(`refuses a ${what}, naming file, line and column`, () => {
      let err: unknown;
      try {
        importMergerTable(bad, 'rates.csv');
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(ImportError);
      expect((err as Error).message).toMatch(re);
    });
  }

  it('strainsheet import --kind merger-table stores a population cell usable by spectrum, counts per bin and realisations', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'mergertable-'));
    const sheetPath = join(dir, 'sheet.json');
    const dataPath = join(dir, 'rates.csv');
    const base = new Sheet({ cells: [{ name: 'freqs', formula: '[2, 4, 6] nHz' }] });
    writeFileSync(sheetPath, base.toFileText());
    writeFileSync(dataPath, text);
    const out: string[] = [];
    const err: string[] = [];
    const io = { out: (s: string) => void out.push(s), err: (s: string) => void err.push(s) };
    const code = await main(['import', sheetPath, dataPath, '--as', 'table_pop', '--kind', 'merger-table'], io as never);
    expect(err.join('')).toBe('');
    expect(code).toBe(0);
    const stored = Sheet.fromFile(readFileSync(sheetPath, 'utf8')).toFile();
    const sheet = new Sheet({
      cells: [
        ...stored.cells,
        { name: 'spec', formula: 'strainSpectrum(table_pop, freqs)' },
        { name: 'counts', formula: 'binariesPerBin(table_pop, freqs, 15 yr, flatCosmology(70 km/s/Mpc, 0.3))' },
        { name: 'real', formula: 'realiseBackground(table_pop, freqs, 15 yr, 20, 1, 10, false, flatCosmology(70 km/s/Mpc, 0.3))' },
      ],
    });
    const pop = (valueOf(sheet, 'table_pop') as { population: BinaryPopulation }).population;
    expect(pop.density(1, 8, 0.5)).toBeGreaterThan(0);
    expect(valueOf(sheet, 'spec')).toBeTruthy();
    expect(valueOf(sheet, 'counts')).toBeTruthy();
    expect(valueOf(sheet, 'real')).toBeTruthy();
    // a bad file leaves the sheet as it was
    const before = readFileSync(sheetPath, 'utf8');
    writeFileSync(dataPath, withLine(4, '0,7,0.5,abc'));
    const code2 = await main(['import', sheetPath, dataPath, '--as', 'table_pop', '--kind', 'merger-table'], io as never);
    expect(code2).toBe(2);
    expect(err.join('')).toMatch(/rates\.csv, line 5, column 4/);
    expect(readFileSync(sheetPath, 'utf8')).toBe(before);
  });
});

describe('merger events with weights', () => {
  // "Events" from an invented analytic density: one per cell of a fine grid, at the cell's centre,
  // weighted by the density times the cell's volume (midpoint rule).
  const analytic = phenomenologicalPopulation({ rateNorm: 1e-3, alpha: 0.3, cutoffMass: 3e9, beta: 2, z0: 1.5, redshiftWeight: (z) => redshiftShape(z, 2, 1.5), zMax: 3, log10MMin: 6, log10MMax: 10.5, massRatio: powerLawMassRatio(-0.5, 0.05), cosmology: cosmo });
  function eventsCsv(nz: number, nm: number, nq: number): { text: string; total: number } {
    const lines = ['z,log10_M_Msun,q,weight_Mpc^-3'];
    const dz = 3 / nz;
    const dm = 4.5 / nm;
    const dq = 0.95 / nq;
    let total = 0;
    for (let i = 0; i < nz; i++) for (let j = 0; j < nm; j++) for (let k = 0; k < nq; k++) {
      const z = (i + 0.5) * dz;
      const x = 6 + (j + 0.5) * dm;
      const q = 0.05 + (k + 0.5) * dq;
      const w = analytic.density(z, x, q) * dz * dm * dq;
      total += w;
      lines.push(`${z},${x},${q},${w}`);
    }
    return { text: lines.join('\n'), total };
  }
  it('binning keeps the number of mergers exactly and the bins span the events', () => {
    const { text, total } = eventsCsv(12, 18, 6);
    const r = importMergerEvents(text, 'events.csv', { zBins: 6, massBins: 9, qBins: 3 });
    const t = r.table;
    expect(t.binned).toBe(true);
    const vol = ((t.z[6] - t.z[0]) / 6) * ((t.log10M[9] - t.log10M[0]) / 9) * ((t.q[3] - t.q[0]) / 3);
    const sum = t.density.reduce((s, v) => s + v, 0) * vol;
    expect(Math.abs(sum / total - 1)).toBeLessThan(1e-12);
    expect(r.events).toBe(12 * 18 * 6);
    expect(Array.from(decodeDensityTable(encodeDensityTable(t)).density)).toEqual(Array.from(t.density));
  });
  it('the binned population approaches the analytic spectrum as the bins shrink', () => {
    const freqs = [3e-9, 2e-8];
    const resolution = { zPanels: 12, log10MPanels: 36, qPanels: 6, order: 8 };
    const ref = characteristicStrainSquared(analytic, freqs, { resolution });
    const { text } = eventsCsv(24, 72, 12);
    const errorWith = (b: { zBins: number; massBins: number; qBins: number }) => {
      const pop = tabulatedPopulation(importMergerEvents(text, 'events.csv', b).table);
      const got = characteristicStrainSquared(pop, freqs, { resolution });
      return Math.max(...Array.from(got, (v, i) => Math.abs(v / ref[i] - 1)));
    };
    const coarse = errorWith({ zBins: 6, massBins: 9, qBins: 3 });
    const fine = errorWith({ zBins: 12, massBins: 36, qBins: 6 });
    expect(fine, `coarse ${coarse.toExponential(2)}, fine ${fine.toExponential(2)}`).toBeLessThan(0.5 * coarse);
  });
  it('refuses a negative weight, a weight without unit, a ragged row, naming file, line and column', () => {
    const ok = 'z,log10_M_Msun,q,weight_Mpc^-3\n0.5,8,0.5,1e-5\n1,9,0.3,2e-6\n';
    expect(() => importMergerEvents(ok.replace('2e-6', '-2e-6'), 'ev.csv')).toThrow(/ev\.csv, line 3, column 4: the weight must not be negative/);
    expect(() => importMergerEvents(ok.replace('weight_Mpc^-3', 'weight'), 'ev.csv')).toThrow(/ev\.csv, line 1, column 4: the header "weight" has no unit/);
    expect(() => importMergerEvents(ok.replace('1,9,0.3,2e-6', '1,9,0.3'), 'ev.csv')).toThrow(/ev\.csv, line 3: the row has 3 cells/);
    expect(() => importMergerEvents(ok.replace('1,9,0.3', '1,nine,0.3'), 'ev.csv')).toThrow(/ev\.csv, line 3, column 2: log10_M_Msun: "nine" is not a number/);
  });
  it('strainsheet import --kind merger-events --bins stores a population cell', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'mergerevents-'));
    const sheetPath = join(dir, 'sheet.json');
    const dataPath = join(dir, 'events.csv');
    writeFileSync(sheetPath, new Sheet({ cells: [{ name: 'freqs', formula: '[2, 4] nHz' }] }).toFileText());
    writeFileSync(dataPath, eventsCsv(6, 9, 3).text);
    const out: string[] = [];
    const err: string[] = [];
    const io = { out: (s: string) => void out.push(s), err: (s: string) => void err.push(s) };
    const code = await main(['import', sheetPath, dataPath, '--as', 'events_pop', '--kind', 'merger-events', '--bins', '3,9,3'], io as never);
    expect(err.join('')).toBe('');
    expect(code).toBe(0);
    const stored = Sheet.fromFile(readFileSync(sheetPath, 'utf8')).toFile();
    const sheet = new Sheet({ cells: [...stored.cells, { name: 'spec', formula: 'strainSpectrum(events_pop, freqs)' }] });
    expect(valueOf(sheet, 'spec')).toBeTruthy();
    expect((valueOf(sheet, 'events_pop') as { describe(): string }).describe()).toMatch(/binned merger events \(3 x 9 x 3 bins\)/);
    expect(await main(['import', sheetPath, dataPath, '--as', 'events_pop', '--kind', 'merger-events', '--bins', '3,9'], io as never)).toBe(2);
  });
});
