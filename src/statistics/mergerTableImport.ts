// Reads a table of merger densities d^3n/(dz dlog10M dq) from CSV (our own layout, docs/mergerTables.md):
//   z,log10_M_Msun,q,density_Mpc^-3          (or M_Msun; density_Gpc^-3)
// one row per grid node, z varying slowest and q fastest, each axis increasing, every combination once.
// Errors name the file, line and column (CSV through papaparse, importText.ts).
import type { DensityTable } from '../physics/tabulatedPopulation';
import { csvRows, ImportError, numberCell } from './importText';

/** Most grid nodes a table may have (the sheet keeps each value exactly, in about 10.7 characters). */
export const MAX_TABLE_NODES = 17_000;

const DENSITY_UNITS: Record<string, number> = { 'mpc^-3': 1, 'gpc^-3': 1e-9, mpc3: 1, gpc3: 1e-9 };

function headerError(file: string, line: number, column: number, found: string, expected: string): ImportError {
  return new ImportError(file, line, column, `the header "${found}" ${expected}`);
}

export function importMergerTable(text: string, file: string): DensityTable {
  const rows = csvRows(text, file);
  if (rows.length === 0) throw new ImportError(file, null, null, 'the file has no header and no rows');
  const head = rows[0];
  if (head.cells.length !== 4) throw new ImportError(file, head.line, null, `the header needs 4 columns (z, log10_M_Msun, q, density_Mpc^-3), found ${head.cells.length}`);
  const [hz, hm, hq, hd] = head.cells.map((c) => c.toLowerCase());
  if (hz !== 'z') throw headerError(file, head.line, 1, head.cells[0], 'must be z (the merger redshift)');
  let massIsLog: boolean;
  if (hm === 'log10_m_msun') massIsLog = true;
  else if (hm === 'm_msun') massIsLog = false;
  else if (hm === 'log10_m' || hm === 'm' || hm === 'log10m' || hm === 'mass') throw headerError(file, head.line, 2, head.cells[1], 'has no unit: write log10_M_Msun (log10 of the total mass in Msun) or M_Msun');
  else throw headerError(file, head.line, 2, head.cells[1], 'must be log10_M_Msun or M_Msun (total mass m1 + m2)');
  if (hq !== 'q') throw headerError(file, head.line, 3, head.cells[2], 'must be q (mass ratio m2/m1 <= 1)');
  const dm = /^density_(.+)$/.exec(hd);
  if (!dm) {
    if (hd === 'density' || hd === 'rate' || hd === 'n') throw headerError(file, head.line, 4, head.cells[3], 'has no unit: write density_Mpc^-3 or density_Gpc^-3 (d^3n/(dz dlog10M dq))');
    throw headerError(file, head.line, 4, head.cells[3], 'must be density_Mpc^-3 or density_Gpc^-3 (d^3n/(dz dlog10M dq))');
  }
  const scale = DENSITY_UNITS[dm[1]];
  if (scale === undefined) throw headerError(file, head.line, 4, head.cells[3], `has the unit "${dm[1]}"; use Mpc^-3 or Gpc^-3`);

  const body = rows.slice(1);
  if (body.length === 0) throw new ImportError(file, null, null, 'the file has a header but no rows');
  if (body.length > MAX_TABLE_NODES) throw new ImportError(file, null, null, `the table has ${body.length} rows; at most ${MAX_TABLE_NODES} grid nodes fit in a sheet cell`);
  const zs: number[] = [];
  const ms: number[] = [];
  const qs: number[] = [];
  const values = new Float64Array(body.length);
  const points: [number, number, number][] = [];
  body.forEach((r, n) => {
    if (r.cells.length !== 4) throw new ImportError(file, r.line, null, `the row has ${r.cells.length} cells; the header has 4`);
    const z = numberCell(r.cells[0], file, r.line, 1, 'z');
    const mRaw = numberCell(r.cells[1], file, r.line, 2, head.cells[1]);
    const q = numberCell(r.cells[2], file, r.line, 3, 'q');
    const d = numberCell(r.cells[3], file, r.line, 4, 'the density');
    if (!(z >= 0)) throw new ImportError(file, r.line, 1, `z must be >= 0, got ${r.cells[0]}`);
    if (!massIsLog && !(mRaw > 0)) throw new ImportError(file, r.line, 2, `the mass must be positive, got ${r.cells[1]}`);
    if (!(q > 0 && q <= 1)) throw new ImportError(file, r.line, 3, `q must lie in (0, 1], got ${r.cells[2]}`);
    if (d < 0) throw new ImportError(file, r.line, 4, `the density must not be negative, got ${r.cells[3]}`);
    const x = massIsLog ? mRaw : Math.log10(mRaw);
    points.push([z, x, q]);
    values[n] = d * scale;
  });
  // Axes from the order of the rows: z slowest, then log10 M, then q; each must increase.
  const unsorted = (n: number, c: number, label: string, prev: number) =>
    new ImportError(file, body[n].line, c + 1, `${label} nodes must increase: ${body[n].cells[c]} follows ${prev} (rows go with z slowest, then mass, then q fastest)`);
  for (let n = 0; n < points.length && points[n][0] === points[0][0] && points[n][1] === points[0][1]; n++) {
    if (qs.length > 0 && !(points[n][2] > qs[qs.length - 1])) throw unsorted(n, 2, 'q', qs[qs.length - 1]);
    qs.push(points[n][2]);
  }
  const nq = qs.length;
  for (let n = 0; n < points.length && points[n][0] === points[0][0]; n += nq) {
    if (ms.length > 0 && !(points[n][1] > ms[ms.length - 1])) throw unsorted(n, 1, head.cells[1], ms[ms.length - 1]);
    ms.push(points[n][1]);
  }
  const perZ = ms.length * nq;
  for (let n = 0; n < points.length; n += perZ) {
    if (zs.length > 0 && !(points[n][0] > zs[zs.length - 1])) throw unsorted(n, 0, 'z', zs[zs.length - 1]);
    zs.push(points[n][0]);
  }
  // Every row must be the grid node its position says.
  for (let n = 0; n < points.length; n++) {
    const i = Math.floor(n / perZ);
    const j = Math.floor((n % perZ) / nq);
    const k = n % nq;
    const want: [number, number, number] = [zs[i], ms[j], qs[k]];
    for (let c = 0 as 0 | 1 | 2; c < 3; c = (c + 1) as 0 | 1 | 2) {
      if (points[n][c] !== want[c]) {
        const label = ['z', head.cells[1], 'q'][c];
        throw new ImportError(file, body[n].line, c + 1, `${label} is ${body[n].cells[c]} where the grid order (z slowest, then mass, then q, each increasing, every combination once) needs ${want[c]}`);
      }
    }
  }
  const expected = zs.length * perZ;
  if (expected !== points.length) throw new ImportError(file, body[body.length - 1].line, null, `${points.length} rows do not fill a grid of ${zs.length} z x ${ms.length} mass x ${nq} q nodes (${expected}); give every combination once`);
  for (const [label, a] of [['z', zs], ['mass', ms], ['q', qs]] as const) {
    if (a.length < 2) throw new ImportError(file, null, null, `the grid has ${a.length} ${label} node; at least 2 are needed on each axis`);
  }
  return { z: Float64Array.from(zs), log10M: Float64Array.from(ms), q: Float64Array.from(qs), density: values };
}
