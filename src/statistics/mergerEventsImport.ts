// Reads merger events with weights from CSV (our own layout, docs/mergerTables.md):
//   z,log10_M_Msun,q,weight_Mpc^-3          (or M_Msun; weight_Gpc^-3)
// each row one merger (or a class of them) contributing `weight` mergers per comoving volume, and bins
// them into a histogram of d^3n/(dz dlog10M dq): the weights in a bin over the bin's volume, so that the
// number of mergers (the sum of the weights) is kept exactly. Errors name the file, line and column.
import type { DensityTable } from '../physics/tabulatedPopulation';
import { csvRows, ImportError, numberCell } from './importText';
import { MAX_TABLE_NODES } from './mergerTableImport';

export interface EventBinning {
  /** Bins in z (from 0), in log10 M and in q. */
  zBins: number;
  massBins: number;
  qBins: number;
}

export const DEFAULT_EVENT_BINNING: Readonly<EventBinning> = Object.freeze({ zBins: 16, massBins: 24, qBins: 8 });

const WEIGHT_UNITS: Record<string, number> = { 'mpc^-3': 1, 'gpc^-3': 1e-9 };

function edges(lo: number, hi: number, n: number): Float64Array {
  return Float64Array.from({ length: n + 1 }, (_, i) => (i === n ? hi : lo + ((hi - lo) * i) / n));
}

export function importMergerEvents(text: string, file: string, binning: EventBinning = DEFAULT_EVENT_BINNING): { table: DensityTable; events: number; totalWeight: number } {
  const rows = csvRows(text, file);
  if (rows.length === 0) throw new ImportError(file, null, null, 'the file has no header and no rows');
  const head = rows[0];
  if (head.cells.length !== 4) throw new ImportError(file, head.line, null, `the header needs 4 columns (z, log10_M_Msun, q, weight_Mpc^-3), found ${head.cells.length}`);
  const [hz, hm, hq, hw] = head.cells.map((c) => c.toLowerCase());
  const bad = (column: number, detail: string) => new ImportError(file, head.line, column, `the header "${head.cells[column - 1]}" ${detail}`);
  if (hz !== 'z') throw bad(1, 'must be z (the merger redshift)');
  const massIsLog = hm === 'log10_m_msun';
  if (!massIsLog && hm !== 'm_msun') throw bad(2, hm === 'log10_m' || hm === 'm' || hm === 'mass' ? 'has no unit: write log10_M_Msun or M_Msun' : 'must be log10_M_Msun or M_Msun (total mass m1 + m2)');
  if (hq !== 'q') throw bad(3, 'must be q (mass ratio m2/m1 <= 1)');
  const wm = /^weight_(.+)$/.exec(hw);
  if (!wm) throw bad(4, hw === 'weight' || hw === 'w' ? 'has no unit: write weight_Mpc^-3 or weight_Gpc^-3 (mergers per comoving volume)' : 'must be weight_Mpc^-3 or weight_Gpc^-3');
  const scale = WEIGHT_UNITS[wm[1]];
  if (scale === undefined) throw bad(4, `has the unit "${wm[1]}"; use Mpc^-3 or Gpc^-3`);
  const body = rows.slice(1);
  if (body.length === 0) throw new ImportError(file, null, null, 'the file has a header but no events');
  const z = new Float64Array(body.length);
  const x = new Float64Array(body.length);
  const q = new Float64Array(body.length);
  const w = new Float64Array(body.length);
  body.forEach((r, n) => {
    if (r.cells.length !== 4) throw new ImportError(file, r.line, null, `the row has ${r.cells.length} cells; the header has 4`);
    z[n] = numberCell(r.cells[0], file, r.line, 1, 'z');
    const m = numberCell(r.cells[1], file, r.line, 2, head.cells[1]);
    q[n] = numberCell(r.cells[2], file, r.line, 3, 'q');
    const wt = numberCell(r.cells[3], file, r.line, 4, 'the weight');
    if (!(z[n] >= 0)) throw new ImportError(file, r.line, 1, `z must be >= 0, got ${r.cells[0]}`);
    if (!massIsLog && !(m > 0)) throw new ImportError(file, r.line, 2, `the mass must be positive, got ${r.cells[1]}`);
    if (!(q[n] > 0 && q[n] <= 1)) throw new ImportError(file, r.line, 3, `q must lie in (0, 1], got ${r.cells[2]}`);
    if (wt < 0) throw new ImportError(file, r.line, 4, `the weight must not be negative, got ${r.cells[3]}`);
    x[n] = massIsLog ? m : Math.log10(m);
    w[n] = wt * scale;
  });
  const { zBins, massBins, qBins } = binning;
  if (zBins * massBins * qBins > MAX_TABLE_NODES) throw new ImportError(file, null, null, `${zBins} x ${massBins} x ${qBins} bins are more than the ${MAX_TABLE_NODES} a sheet cell holds`);
  const max = (a: Float64Array) => a.reduce((s, v) => Math.max(s, v), -Infinity);
  const min = (a: Float64Array) => a.reduce((s, v) => Math.min(s, v), Infinity);
  // Bin ranges: z from 0 and mass to whole tenths of a dex around the events, q up to 1; a range of
  // zero width (all events alike) is widened so that every bin has a volume.
  const zHi = max(z) > 0 ? max(z) : 1;
  let xLo = Math.floor(min(x) * 10) / 10;
  let xHi = Math.ceil(max(x) * 10) / 10;
  if (!(xHi > xLo)) [xLo, xHi] = [xLo - 0.1, xHi + 0.1];
  const qLo = min(q) < 1 ? min(q) : 0.5;
  const ze = edges(0, zHi, zBins);
  const xe = edges(xLo, xHi, massBins);
  const qe = edges(qLo, 1, qBins);
  const density = new Float64Array(zBins * massBins * qBins);
  const at = (e: Float64Array, v: number, n: number) => Math.min(n - 1, Math.max(0, Math.floor(((v - e[0]) / (e[n] - e[0])) * n)));
  let total = 0;
  for (let i = 0; i < w.length; i++) {
    density[(at(ze, z[i], zBins) * massBins + at(xe, x[i], massBins)) * qBins + at(qe, q[i], qBins)] += w[i];
    total += w[i];
  }
  const volume = (zHi / zBins) * ((xHi - xLo) / massBins) * ((1 - qLo) / qBins);
  for (let i = 0; i < density.length; i++) density[i] /= volume;
  return { table: { z: ze, log10M: xe, q: qe, density, binned: true }, events: w.length, totalWeight: total };
}
