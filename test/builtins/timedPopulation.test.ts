// Populations check the clock where slow cells are handed off (the app's page) and nowhere else
// (issue 10, item 1): on the demo sheet with a budget too short for anything, the stalled share of a
// population (stalledFraction: a built-in's own integral over the density, whose inputs are not
// handed off) is handed off on the page, and the replica's value equals the command line's; without
// hand-off the built-ins run to the end.
import { readFileSync } from 'node:fs';
import { afterEach, describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { SheetReplica } from '../../src/sheet/sheetReplica';
import { DEFAULT_CELL_SECONDS, setCellBudget, setHandOffOnTimeout } from '../../src/sheet/evaluationBudget';
import { stateFromTransfer, stateToTransfer } from '../../src/sheet/valueTransfer';
import { formatValue } from '../../src/sheet/formatValue';
import { timedPopulation } from '../../src/builtins/timedPopulation';
import type { BinaryPopulation } from '../../src/physics/populationTypes';

const demo = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');
afterEach(() => {
  setHandOffOnTimeout(false);
  setCellBudget(DEFAULT_CELL_SECONDS);
});

describe('timed populations', () => {
  it('on the page, a spectrum integral past the budget is handed off; off the page it gets the command line\'s value', () => {
    const reference = Sheet.fromFile(demo); // the command line's settings
    setHandOffOnTimeout(true);
    setCellBudget(1e-9);
    const page = Sheet.fromFile(demo);
    const waiting = page.offPageCells();
    expect(waiting.map((c) => c.name)).toContain('stalled_share');
    const ticket = waiting.find((c) => c.name === 'stalled_share')!.ticket;
    setHandOffOnTimeout(false);
    setCellBudget(DEFAULT_CELL_SECONDS);
    const outcome = stateFromTransfer(structuredClone(stateToTransfer(new SheetReplica().evaluate(page.closureText(['stalled_share']), 'stalled_share'))));
    expect(page.supplyOffPage('stalled_share', ticket, outcome)).toBe(true);
    expect(formatValue(page.value('stalled_share'))).toBe(formatValue(reference.value('stalled_share')));
    expect(page.value('stalled_share')).toBe(reference.value('stalled_share'));
  });

  it('without hand-off, a built-in\'s integral is not interrupted by the cell budget', () => {
    const reference = Sheet.fromFile(demo);
    setCellBudget(1e-9);
    const s = Sheet.fromFile(demo);
    expect(s.value('A_yr_hardened')).toBe(reference.value('A_yr_hardened'));
    expect(s.value('stalled_share')).toBe(reference.value('stalled_share'));
  });

  it('with hand-off on, keeps every property of the population, also when it is frozen and when it is spread; with it off, is the population itself', () => {
    const pop: BinaryPopulation = Object.freeze({
      density: (z: number, log10M: number, q: number) => z + log10M + q,
      zMin: 0, zMax: 5, log10MMin: 6, log10MMax: 11, qMin: 0.1, qMax: 1,
      separable: Object.freeze({ zMass: (z: number, log10M: number) => z * log10M, massRatio: (q: number) => 2 * q }),
    });
    expect(timedPopulation(pop)).toBe(pop); // hand-off off (the command line): used as it is
    setHandOffOnTimeout(true);
    const timed = timedPopulation(pop);
    expect(timed).not.toBe(pop);
    const spread = { ...timed };
    for (const p of [timed, spread]) {
      expect([p.zMin, p.zMax, p.log10MMin, p.log10MMax, p.qMin, p.qMax]).toEqual([0, 5, 6, 11, 0.1, 1]);
      expect(p.density(1, 2, 0.5)).toBe(3.5);
      expect(p.separable!.zMass(2, 3) * p.separable!.massRatio(0.5)).toBe(6);
    }
  });
});
