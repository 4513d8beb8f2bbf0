// evaluateWith: outputs with some cells replaced, the sheet untouched, unrelated cells reused.
import { describe, expect, it, vi } from 'vitest';
import { Sheet, SheetEditError } from '../../src/sheet/sheet';
import { math } from '../../src/sheet/mathInstance';
import { countEvaluations, sheetOf, si } from './helpers';

/*
 *   rate ---> amp2 ---> ampl
 *   slow (expensive, unrelated to rate) --> amp2
 */
describe('evaluateWith', () => {
  const build = () =>
    sheetOf({ rate: '2', slow: 'sum(1:1000)', amp2: 'rate * slow', ampl: 'sqrt(amp2)', other: 'rate + 1' });

  it('evaluates outputs with overrides and leaves the sheet as it was', () => {
    const s = build();
    const seen = countEvaluations(s);
    const r = s.evaluateWith({ rate: 8 }, ['ampl', 'amp2']);
    expect(r.ampl).toEqual({ status: 'value', value: Math.sqrt(8 * 500500) }); // sum 1..1000 = 500500
    expect(s.value('ampl')).toBe(Math.sqrt(2 * 500500));
    expect(seen.count()).toBe(0); // no observer notification: the sheet did not change
  });

  it('recomputes only what lies between the overrides and the outputs', () => {
    const s = build();
    // Overriding `slow` makes its formula irrelevant; an output outside the overrides' reach is
    // read from the sheet as it is.
    const r1 = s.evaluateWith({ slow: 1 }, ['ampl']);
    expect(r1.ampl).toEqual({ status: 'value', value: Math.sqrt(2) });
    const r2 = s.evaluateWith({ rate: 3 }, ['other', 'slow']);
    expect(r2.other).toEqual({ status: 'value', value: 4 });
    expect(r2.slow).toBe(s.state('slow')); // reused, the very same state object
  });

  it('evaluates exactly the cells between the overrides and the outputs', () => {
    const s = build();
    // Spy on the engine's per-cell evaluation (a private method) to list what is computed.
    const spy = vi.spyOn(Sheet.prototype as unknown as { evaluateCompiled: (n: string) => unknown }, 'evaluateCompiled');
    try {
      s.evaluateWith({ rate: 8 }, ['ampl']);
      expect(spy.mock.calls.map((c) => c[0])).toEqual(['amp2', 'ampl']); // not slow, not other
      spy.mockClear();
      s.evaluateWith({ slow: 1 }, ['other']);
      expect(spy.mock.calls).toEqual([]); // other does not read slow
    } finally {
      spy.mockRestore();
    }
  });

  it('accepts quantities and any value, and function cells see the override', () => {
    const s = sheetOf({ v0: '1 km/s', travel: 'travel(duration) = v0 * duration', d: 'travel(10 s) to m' });
    const r = s.evaluateWith({ v0: math.unit(2, 'm/s') }, ['d']);
    expect(r.d.status).toBe('value');
    expect(si((r.d as { value: unknown }).value)).toBe(20);
    expect(si(s.value('d'))).toBe(10_000);
  });

  it('gives error states for bad overrides and unknown outputs, and throws for unknown override names', () => {
    const s = build();
    const r = s.evaluateWith({ rate: math.unit(1, 'm') }, ['other', 'nope']);
    expect(r.other.status === 'error' && r.other.error.kind).toBe('unit'); // 1 m + 1
    expect(r.nope.status).toBe('error');
    expect(() => s.evaluateWith({ missing: 1 }, ['ampl'])).toThrow(SheetEditError);
  });

  it('plans again after the sheet changes', () => {
    const s = build();
    expect(s.evaluateWith({ rate: 1 }, ['ampl'])).toEqual({ ampl: { status: 'value', value: Math.sqrt(500500) } });
    s.updateCell('ampl', { formula: 'amp2 * 2' });
    expect(s.evaluateWith({ rate: 1 }, ['ampl'])).toEqual({ ampl: { status: 'value', value: 1001000 } });
  });

  it('overridesFromFormulas evaluates formula text against the sheet', () => {
    const s = build();
    const o = s.overridesFromFormulas({ rate: 'other * 10', amp2: '4' });
    expect(o).toEqual({ rate: 30, amp2: 4 });
    expect(s.evaluateWith(o, ['ampl']).ampl).toEqual({ status: 'value', value: 2 });
    expect(() => s.overridesFromFormulas({ rate: '1 +' })).toThrow(/rate: /);
    const f = s.overridesFromFormulas({ other: 'other(x) = 2 x' }).other as (x: number) => number;
    expect(f(4)).toBe(8);
  });

  it('a sheet with an override breaking a cycle evaluates downstream cells', () => {
    const s = new Sheet({ cells: [{ name: 'p', formula: 'q + 1' }, { name: 'q', formula: 'p + 1' }, { name: 'r', formula: 'q * 2' }] });
    expect(s.evaluateWith({ p: 1 }, ['r']).r).toEqual({ status: 'value', value: 4 });
    expect(s.state('r').status).toBe('error');
  });
});
