// The built-ins in the app come in groups loaded on demand (scripts/builtinGroupsInApp.mjs,
// web/engine/lazyBuiltins.ts). Checked here against allBuiltins() as the command line uses it
// (independent method: the groups are read from src/builtins/index.ts and each file's own list).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { allBuiltins } from '../../src/builtins/index';
import { groupsOfIndex } from '../../scripts/builtinGroupsInApp.mjs';
import { formulaTextsOfFile, LazyBuiltins, type BuiltinGroupSpec } from '../../web/engine/lazyBuiltins';
import { Sheet } from '../../src/sheet/sheet';
import type { Builtin } from '../../src/sheet/builtin';
import { math } from '../../src/sheet/mathInstance';

const INDEX = new URL('../../src/builtins/index.ts', import.meta.url);

async function realGroups(): Promise<BuiltinGroupSpec[]> {
  const out: BuiltinGroupSpec[] = [];
  for (const { exportName, file } of groupsOfIndex(readFileSync(INDEX, 'utf8'))) {
    const list = (await import(`../../src/builtins/${file}.ts`))[exportName] as Builtin[];
    out.push({ group: file, names: list.map((b) => b.name), load: async () => list });
  }
  return out;
}

describe('built-ins in groups loaded on demand', () => {
  it('the groups read from index.ts give every built-in of allBuiltins(), in its order', async () => {
    const lazy = new LazyBuiltins(await realGroups());
    expect(lazy.allBuiltins().map((b) => b.name)).toEqual(allBuiltins().map((b) => b.name));
  });

  it('a built-in called before its group has loaded throws; after, it gives what the built-in gives', async () => {
    const lazy = new LazyBuiltins(await realGroups());
    const byName = (name: string) => lazy.allBuiltins().find((b) => b.name === name)!;
    const real = allBuiltins().find((b) => b.name === 'iscoFrequency')!;
    expect(() => byName('iscoFrequency').fn(math.unit(1e9, 'Msun'))).toThrow(/iscoFrequency has not loaded yet/);
    const groups = lazy.groupsNamedIn(['f = iscoFrequency(max_mass) * 2', 'x = sin(1)']);
    expect(groups).toHaveLength(1);
    await lazy.load(groups);
    expect(lazy.groupsNamedIn(['f = iscoFrequency(max_mass)'])).toEqual([]);
    expect(lazy.allLoaded).toBe(false);
    const m = math.unit(1e9, 'Msun'); // any value: both calls get the same
    expect(String(byName('iscoFrequency').fn(m))).toBe(String(real.fn(m)));
    // Errors for bad arguments are the built-in's own.
    expect(() => byName('iscoFrequency').fn('text')).toThrow(/iscoFrequency/);
    await lazy.loadAll();
    expect(lazy.allLoaded).toBe(true);
    expect(lazy.groupsNamedIn(['amplitudeAtYear(pop)'])).toEqual([]);
  });

  it('a group is also named by the text of the operators it provides (its symbols), outside double quotes', async () => {
    const lazy = new LazyBuiltins([{ group: 'ops', names: [], triggers: ['mod'], symbols: ['&', '!'], load: async () => [] }]);
    expect(lazy.groupsNamedIn(['5 & 3'])).toEqual(['ops']);
    expect(lazy.groupsNamedIn(['a != b'])).toEqual(['ops']);
    expect(lazy.groupsNamedIn(['7 mod 3'])).toEqual(['ops']);
    expect(lazy.groupsNamedIn(["'x & y'"])).toEqual(['ops']); // single quotes: mathjs's transpose too, so not taken out
    expect(lazy.groupsNamedIn(['"x & y" + "a \\" !"', 'measuredFreeSpectrum("a|b")'])).toEqual([]);
    expect(lazy.groupsNamedIn(['"x" & "y"'])).toEqual(['ops']);
    expect(lazy.groupsNamedIn(['model * 2', '7 / 3'])).toEqual([]);
    // text that is not a formula (quotes may hold formulas): read whole
    expect(lazy.groupsNamedIn(['{"formula": "5 & 3"}'], false)).toEqual(['ops']);
    await lazy.load(['ops']);
    expect(lazy.groupsNamedIn(['5 & 3'])).toEqual([]);
  });

  it('a sheet file text gives its cells’ formulas, uncertainties and priors (what the workers look for groups in)', () => {
    const sheet = new Sheet();
    sheet.setCell({ name: 'first', formula: '5 & 3', note: 'not & this', uncertainty: 'normalDist(1, 0.1)' });
    sheet.setCell({ name: 'spectrum_b', formula: 'measuredFreeSpectrum("x|y") + first', prior: 'uniformDist(0, 1)' });
    expect(formulaTextsOfFile(sheet.toFileText())).toEqual(['5 & 3', 'normalDist(1, 0.1)', 'measuredFreeSpectrum("x|y") + first', 'uniformDist(0, 1)']);
    expect(formulaTextsOfFile('sqrt(2)')).toBeNull();
    expect(formulaTextsOfFile('{"not": "a sheet"}')).toBeNull();
  });

  it('a group that fails to load is named in the error of its built-ins and is not asked for again', async () => {
    const lazy = new LazyBuiltins([{ group: 'broken', names: ['brokenThing'], load: () => Promise.reject(new Error('network down')) }]);
    await lazy.load(lazy.groupsNamedIn(['brokenThing(1)']));
    expect(() => lazy.allBuiltins()[0].fn(1)).toThrow(/brokenThing could not be loaded \(network down\)/);
    expect(lazy.groupsNamedIn(['brokenThing(1)'])).toEqual([]);
  });
});
