// Known sandbox-escape and prototype-pollution strings for expression evaluators, each refused.
// Sources: the "Security" page of the mathjs documentation (mathjs.org/docs/expressions/security),
// and the mathjs advisories CVE-2017-1001002 (code execution through a typed-function name,
// fixed in 3.17.0), CVE-2017-1001003 (private properties such as constructor replaced through
// unicode escapes, fixed in 3.17.0) and CVE-2020-7743 (prototype pollution through deepExtend,
// fixed in 7.5.1), plus the 2017 series fixed in mathjs 3.10.1-3.11.5 (function constructors
// reached through cos.constructor, [].map.constructor and similar). Advisory numbers and versions
// are given from memory.
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { math } from '../../src/sheet/mathInstance';
import { lockedMath } from '../../src/sheet/lockedMath';

const ATTACKS: string[] = [
  // function constructors through properties of functions and values
  'cos.constructor("return process")()',
  'sin.constructor("return this")()',
  '[].map.constructor("return process")()',
  'cos["constructor"]("return 1")()',
  'cos.constructor("return process")',
  'cos["constructor"]("return 1")',
  'probe.constructor("return process")',
  'probe["constructor"]',
  'f = cos.constructor; f("return 1")()',
  '(cos)["constructor"]',
  'sqrt.call',
  'sqrt.apply(1, [4])',
  'sqrt.bind(1)',
  '"".constructor.prototype',
  'matrix([1]).constructor',
  'unit("5 cm").constructor',
  '(1 m).constructor',
  'isPrime.signatures',
  'index(1).__proto__',
  // prototype pollution
  '__proto__',
  '{}.__proto__.polluted = 1',
  '{}["__proto__"]["polluted"] = 1',
  'x = {}; x.__proto__.polluted = 1',
  '[1]["__proto__"]',
  '[1]["constructor"]',
  'constructor',
  'prototype',
  'hasOwnProperty',
  // toString / valueOf hijacking
  'obj = {toString: cos.constructor("return process")}',
  '{valueOf: 1}',
  'toString = 1',
  'x = [1]; x.toString = 1',
  // the instance itself
  'import({polluted: 1}, {override: true})',
  'createUnit("foo")',
  'createUnit("pc", "1 m", {override: true})',
  'evaluate("1 + 1")',
  'parse("1 + 1")',
  'compile("1 + 1")',
  'simplify("x + x")',
  'derivative("x^2", "x")',
  'resolve(parse("x"), {})',
  'reviver',
  'chain(3).add(4).done()',
  'config({number: "BigNumber"})',
  'help(sin)',
  'parser()',
  'typed("x", {"": 1})',
  'expression.mathWithTransform',
  'Node',
  // matrix and index tricks
  'a = [1, 2]; a[1] = 3',
  'x = [1]; x["length"]',
  '[1, 2][end + 1e9]',
  '(1:3)["map"]',
  'subset([1, 2], index("constructor"))',
  'subset(probe, index("constructor"))',
  'index("constructor")',
  // unicode escapes of constructor (CVE-2017-1001003)
  '{"\\u0063onstructor": 1}',
  'f(x) = x; f.constructor',
  // evaluation-size bombs
  '1:1e12',
  'zeros(1e6, 1e6)',
  'ones(100000, 100000)',
  'range(1, 1e12)',
  'kron(1:1000, 1:1000)',
  'combinations(1e9, 5e8)',
  'f(x) = f(x)',
  // broadcasting and product bombs: [N,1] op [1,M] builds N x M inside one mathjs call
  'transpose([1:100000]) + [1:100000]',
  'transpose([1:100000]) * [1:100000]',
  'transpose([1:100000]) .* [1:100000]',
  'transpose([1:100000]) == [1:100000]',
  'transpose([1:100000]) and [1:100000]',
  'transpose([1:100000]) | [1:100000]',
  'mod(transpose([1:100000]), [1:100000])',
  'map(transpose([1:100000]), [1:100000], add)',
  'inv(reshape(1:250000, [500, 500]))',
];

// mathjs's typings require an argument; the locked instance reads the configuration without one.
const readConfig = () => (math.config as unknown as () => Record<string, unknown>)();

describe('sandbox', () => {
  const configBefore = JSON.stringify(readConfig());
  const objectBefore = Object.getOwnPropertyNames(Object.prototype).sort();
  const functionBefore = Object.getOwnPropertyNames(Function.prototype).sort();
  const arrayBefore = Object.getOwnPropertyNames(Array.prototype).sort();

  it(`lists at least 30 attack strings (${ATTACKS.length})`, () => {
    expect(ATTACKS.length).toBeGreaterThanOrEqual(30);
  });

  for (const attack of ATTACKS) {
    it(`refuses ${attack}`, () => {
      const s = new Sheet({ cells: [{ name: 'probe', formula: 'probe(x) = x' }] });
      s.setCell({ name: 'attack', formula: attack });
      const st = s.state('attack');
      expect(st.status, JSON.stringify(st)).toBe('error');
      // also through evaluateWith and overridesFromFormulas
      s.setCell({ name: 'base', formula: '1' });
      expect(() => s.overridesFromFormulas({ base: attack })).toThrow();
    });
  }

  it('leaves Object.prototype, Function.prototype, Array.prototype and math.config() unchanged', () => {
    expect(Object.getOwnPropertyNames(Object.prototype).sort()).toEqual(objectBefore);
    expect(Object.getOwnPropertyNames(Function.prototype).sort()).toEqual(functionBefore);
    expect(Object.getOwnPropertyNames(Array.prototype).sort()).toEqual(arrayBefore);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect((globalThis as Record<string, unknown>).polluted).toBeUndefined();
    expect(JSON.stringify(readConfig())).toBe(configBefore);
    expect(readConfig()).toMatchObject({ number: 'number', absTol: 0 });
  });

  it('the locked instance refuses changes even when called directly', () => {
    lockedMath();
    const m = math as unknown as Record<string, (...a: unknown[]) => unknown>;
    for (const name of ['import', 'createUnit', 'evaluate', 'parse', 'compile', 'simplify', 'derivative', 'resolve', 'reviver', 'chain', 'help', 'parser']) {
      expect(() => m[name]('1'), name).toThrow(/not available/);
    }
    expect(() => math.config({ number: 'BigNumber' })).toThrow(/not available/);
    expect(readConfig().number).toBe('number');
    // the units of the trade are still there and unchanged (IAU 2015 B2: pc = 648000/pi au)
    expect(math.unit(1, 'pc').toNumber('m')).toBe((648000 / Math.PI) * 149597870700);
  });

  it('a file cannot smuggle an attack past the compiler', () => {
    const text = JSON.stringify({ format: 'strainsheet', version: 1, title: '', notes: '', cells: ATTACKS.map((formula, i) => ({ name: `cell${i}`, formula })) });
    const s = Sheet.fromFile(text);
    for (const c of s.cells()) expect(s.state(c.name).status, c.formula).toBe('error');
  });
});
