// The instance's unit-name lookup (src/sheet/unitNameLookup.ts, found by suffixes) against mathjs's
// own scan of every unit (Unit.isValuelessUnit of a full mathjs instance given the same units:
// the independent reference), over every unit with every prefix, the names formulas and cells use,
// object property names and seeded random names made of unit letters.
import { readFileSync } from 'node:fs';
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { math } from '../../src/sheet/mathInstance';
import { allBuiltins } from '../../src/builtins/index';
import { ALLOWED_CONSTANTS, ALLOWED_MATH_FUNCTIONS } from '../../src/sheet/allowedFunctions';
import { AU_M, M_SUN_KG, PC_M, YEAR_S } from '../../src/physics/constants';

type UnitClass = { isValuelessUnit(name: string): boolean; UNITS: Record<string, { prefixes: Record<string, unknown> }> };

function reference(): UnitClass {
  const full = create(all, { absTol: 0, relTol: 1e-12 });
  const defs: Array<[string, string]> = [
    ['Msun', `${M_SUN_KG} kg`], ['au', `${AU_M} m`], ['pc', `${PC_M} m`], ['kpc', `${1e3 * PC_M} m`],
    ['Mpc', `${1e6 * PC_M} m`], ['Gpc', `${1e9 * PC_M} m`], ['yr', `${YEAR_S} s`], ['Myr', `${1e6 * YEAR_S} s`],
    ['Gyr', `${1e9 * YEAR_S} s`],
  ];
  for (const [name, definition] of defs) full.createUnit(name, { definition });
  return full.Unit as unknown as UnitClass;
}

/** xorshift32 with a fixed seed (common practice, no source). */
function randomNames(count: number, letters: string): string[] {
  let x = 20261202;
  const next = () => {
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    return (x >>> 0) / 2 ** 32;
  };
  return Array.from({ length: count }, () => {
    let s = '';
    for (let n = 1 + Math.floor(next() * 7); n > 0; n--) s += letters[Math.floor(next() * letters.length)];
    return s;
  });
}

describe('unit-name lookup', () => {
  it("gives mathjs's answer for every name tried", () => {
    const ours = math.Unit as unknown as UnitClass;
    const ref = reference();
    expect(Object.keys(ours.UNITS).sort()).toEqual(Object.keys(ref.UNITS).sort());
    const names = new Set<string>(['', '__proto__', 'constructor', 'toString', 'hasOwnProperty', 'prototype', 'kmm', 'mMsun', 'kyr', 'Gyrs', 'Mpcs', 'x_m', 'cm2']);
    for (const [unit, { prefixes }] of Object.entries(ref.UNITS)) {
      names.add(unit);
      for (const p of Object.keys(prefixes)) {
        names.add(p + unit);
        names.add(`${p}x${unit}`);
        names.add(p);
      }
    }
    for (const b of allBuiltins()) names.add(b.name);
    for (const n of [...ALLOWED_MATH_FUNCTIONS, ...ALLOWED_CONSTANTS]) names.add(n);
    const demo = JSON.parse(readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8')) as { cells: Array<{ name: string }> };
    for (const c of demo.cells) names.add(c.name);
    const letters = [...new Set(Object.keys(ref.UNITS).join(''))].join('');
    for (const n of randomNames(20_000, letters)) names.add(n);
    let units = 0;
    for (const n of names) {
      const expected = ref.isValuelessUnit(n);
      if (expected) units++;
      expect(ours.isValuelessUnit(n), n).toBe(expected);
    }
    // the names tried hold many units and many more non-units
    expect(units).toBeGreaterThan(1000);
    expect(names.size - units).toBeGreaterThan(1000);
  });
});
