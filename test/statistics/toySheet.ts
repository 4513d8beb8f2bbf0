// A small invented sheet for the sheet-level statistics tests: A_yr = sqrt(rate_norm K_coef) (1 + slope^2),
// so A_yr^2 is linear in rate_norm exactly as in Phinney 2001 (h_c^2 linear in the number density),
// and `bent` is an output that is not. Invented numbers, no real data.
import { Sheet } from '../../src/sheet/sheet';
import type { CellSpec } from '../../src/sheet/types';

export const TOY_CELLS: CellSpec[] = [
  { name: 'rate_norm', formula: '1e-3 Mpc^-3 Gyr^-1', unit: 'Mpc^-3 Gyr^-1' },
  { name: 'K_coef', formula: '2.5e-27 Mpc^3 Gyr' },
  { name: 'slope', formula: '0.7' },
  { name: 'A_yr', formula: 'sqrt(rate_norm * K_coef) * (1 + slope^2)' },
  { name: 'bent', formula: 'A_yr + 1e-15' },
  { name: 'local_rate', formula: 'rate_norm * 0.8' },
  { name: 'measured', formula: 'measuredAmplitude(3e-15, 2e-15, 4.5e-15, 90%)', section: 'measurement' },
];

export function toySheet(extra: Partial<Record<string, Partial<CellSpec>>> = {}): Sheet {
  return new Sheet({ title: 'toy', cells: TOY_CELLS.map((c) => ({ ...c, ...(extra[c.name] ?? {}) })) });
}

/** A_yr of the toy sheet in closed form. */
export function toyAmplitude(rate: number, slope = 0.7): number {
  return Math.sqrt(rate * 2.5e-27) * (1 + slope * slope);
}
