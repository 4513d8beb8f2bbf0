// inOwnUnit keeps one parsed unit per template: its numbers must equal mathjs's own conversion
// from the unit text (Unit.toNumber('km/s/Mpc') and the like, the independent method), bit for bit.
import { describe, expect, it } from 'vitest';
import type { Unit } from 'mathjs';
import { math } from '../../src/sheet/mathInstance';
import { inOwnUnit } from '../../src/statistics/sheetValues';
import { seededRandom } from '../../src/statistics/prng';

describe('inOwnUnit', () => {
  it('gives the same numbers as converting a fresh Unit through its unit text', () => {
    const rng = seededRandom(7);
    for (const text of ['69 km/s/Mpc', '1.2e-3 Mpc^-3 Gyr^-1', '1.2e9 Msun', '14 yr', '21 day', '200 ns', '0.3 nHz', '1000 Msun/pc^3', '3 km^2', '2 mg/cm^3', '4 kpc^-3', '5 degC', '7 degF/s']) {
      const template = math.unit(text);
      for (let i = 0; i < 50; i++) {
        const xSI = (template as Unit & { value: number }).value * Math.exp(4 * (rng.uniform() - 0.5));
        const fresh = template.clone() as Unit & { value: number };
        fresh.value = xSI;
        const expected = fresh.toNumber(fresh.formatUnits());
        expect(inOwnUnit(template, xSI), `${text} at ${xSI}`).toBe(expected);
      }
    }
  });

  it('passes plain numbers through', () => {
    expect(inOwnUnit(0.25, 0.5)).toBe(0.5);
  });
});
