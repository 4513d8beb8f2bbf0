// Known sandbox-escape and prototype-pollution strings for expression evaluators, each refused.
// Sources: the "Security" page of the mathjs documentation (mathjs.org/docs/expressions/security),
// and the mathjs advisories CVE-2017-1001002 (code execution through a typed-function name,
// fixed in 3.17.0), CVE-2017-1001003 (private properties such as constructor replaced through
// unicode escapes, fixed in 3.17.0) and CVE-2020-7743 (prototype pollution through deepExtend,
// fixed in 7.5.1), plus the 2017 series fixed in mathjs 3.10.1-3.11.5 (function constructors
// reached through cos.constructor, [].map.constructor and similar). Checked: CVE-2020-7743 (prototype
// pollution through deepExtend, mathjs before 7.5.1) and the 3.17.0 fix release; unverified: the
// numbers CVE-2017-1001002/1001003 and the 3.10.1-3.11.5 range.
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { math } from '../../src/sheet/mathInstance';
import { lockedMath } from '../../src/sheet/lockedMath';
import { cellBudgetSeconds, DEFAULT_CELL_SECONDS, MAX_BUILT_ELEMENTS, setCellBudget, setRunBudget } from '../../src/sheet/evaluationBudget';
import { formatValue, formatValueParts, valueToJSON } from '../../src/sheet/formatValue';
import { nearestName } from '../../src/sheet/evaluationError';

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

// Issue 10: what a one-line formula must not do (run for hours, take gigabytes, throw out of the
// engine, store a value the display cannot show). Each case reproduces a defect found by attack.
describe('evaluation budget and intermediate sizes (issue 10)', () => {
  const cells = (formula: string) => [
    { name: 'heavy', formula: 'heavy(x) = sum(1:1e6)' },
    { name: 'step', formula: 'step(x) = x + 1' },
    { name: 'steps', formula: 'steps(x) = step(step(step(step(x))))' },
    { name: 'cosmo', formula: 'flatCosmology(70 km/s/Mpc, 0.3)' },
    { name: 'v', formula: '1:1e6' },
    { name: 'attack', formula },
  ];
  const errorOf = (formula: string) => {
    const s = new Sheet({ cells: cells(formula) });
    const st = s.state('attack');
    expect(st.status, `${formula}: ${JSON.stringify(st)}`).toBe('error');
    return (st as Extract<typeof st, { status: 'error' }>).error;
  };
  // A small budget keeps the suite quick; the default is stated in evaluationBudget.ts.
  const withBudget = (seconds: number, run: () => void) => {
    setCellBudget(seconds);
    try {
      run();
    } finally {
      setCellBudget(DEFAULT_CELL_SECONDS);
    }
  };

  it('has a stated default time budget per cell', () => {
    expect(cellBudgetSeconds()).toBe(DEFAULT_CELL_SECONDS);
  });

  it('stops a formula that calls function cells for longer than the budget, naming the budget', () => {
    withBudget(0.2, () => {
      const e = errorOf('sum(map(1:1e6, steps))');
      expect(e.kind).toBe('limit');
      expect(e.message).toMatch(/^attack: the evaluation ran longer than its time budget of 0\.2 s per cell/);
    });
  });

  it('stops sum(map(1:1e6, heavy)) with heavy(x) = sum(1:1e6)', () => {
    withBudget(0.2, () => {
      const e = errorOf('sum(map(1:1e6, heavy))');
      expect(e.kind).toBe('limit');
      expect(e.message).toMatch(/time budget of 0\.2 s per cell|builds more than/);
    });
  });

  it('estimates the cost of long single calls before they run', () => {
    const cases: Array<[string, RegExp]> = [
      ['sum(quantileSeq(1:1e6, (1:1e5)/1e5))', /quantileSeq: 100000 quantiles of 1000000 values/],
      ['sum(quantileSeq(1:1e6, 1e6))', /quantileSeq: 999999 quantiles/],
      ['norm(reshape(1:1e6, [1000, 1000]), 2)', /norm: the 2-norm of a 1000x1000 matrix/],
      ['pow(reshape(1:160000, [400, 400]), 2^30)', /pow: raising a 400x400 matrix to the power 1073741824/],
      ['reshape(1:160000, [400, 400])^(2^30)', /raising a 400x400 matrix/],
    ];
    for (const [formula, message] of cases) {
      const e = errorOf(formula);
      expect(e.kind, formula).toBe('limit');
      expect(e.message, formula).toMatch(message);
    }
    // small cases still evaluate (values from the definitions: the Frobenius norm of [[3, 4]] is 5,
    // the median of 1..5 is 3, [[1, 1], [0, 1]]^5 = [[1, 5], [0, 1]])
    const s = new Sheet({ cells: [{ name: 'a', formula: 'norm([[3, 4]], "fro") + quantileSeq(1:5, 0.5) + sum(pow([[1, 1], [0, 1]], 5))' }] });
    expect(s.value('a')).toBe(5 + 3 + 7);
  });

  it('bounds the elements of intermediate results, not only of list literals', () => {
    const many = `sum([${Array(200).fill('1:1e6').join(', ')}])`;
    const cases: Array<[string, RegExp]> = [
      [many, new RegExp(`the ranges in this formula would build 200000000 elements in all \\(at most ${MAX_BUILT_ELEMENTS}\\)`)],
      ['[v, v]', /a list: it would have 2000000 elements/],
      ['concat(v, v)', /concat: joining these lists would make 2000000 elements/],
      ['v[1:1e9]', /range: 1:1000000000 would have 1000000000 elements/],
    ];
    for (const [formula, message] of cases.slice(0, 4)) {
      const e = errorOf(formula);
      expect(e.kind, formula).toBe('limit');
      expect(e.message, formula).toMatch(message);
    }
  });

  it('refuses a sheet object inside a list as a cell error; the sheet and file still load', () => {
    for (const formula of ['[cosmo]', '[1, cosmo]', '[[cosmo]]', 'concat([1], [cosmo])']) {
      const e = errorOf(formula);
      expect(e.message, formula).toMatch(/cosmology/);
    }
    const text = JSON.stringify({ format: 'strainsheet', version: 1, title: '', notes: '', cells: cells('[cosmo]') });
    expect(() => Sheet.fromFile(text)).not.toThrow();
  });

  it('flags complex quantities and infinite unit powers as cell errors; formatting never throws', () => {
    const cases: Array<[string, string]> = [
      ['sqrt(-4 m^2)', 'unit'],
      ['(1+2i) * 3 kg', 'unit'],
      ['2121 day^-Infinity', 'nonfinite'],
      ['(Infinity*i) * 1 m', 'unit'],
      ['[1 m, sqrt(-1 m^2)]', 'unit'],
    ];
    for (const [formula, kind] of cases) {
      const e = errorOf(formula);
      expect(e.kind, formula).toBe(kind);
    }
    // values that should never reach the display are still shown without throwing
    const complexUnit = math.multiply(math.complex(1, 2), math.unit(3, 'kg'));
    const infinitePower = math.pow(math.unit(2121, 'day'), -Infinity);
    for (const v of [complexUnit, infinitePower, math.matrix([complexUnit] as never), { kind: 'x' }, Symbol('s')]) {
      expect(() => formatValue(v)).not.toThrow();
      expect(() => formatValueParts(v, 'kg')).not.toThrow();
      expect(() => valueToJSON(v)).not.toThrow();
    }
  });

  it('bounds the name length and the "did you mean" search', () => {
    const e = errorOf(`${'q'.repeat(190_000)} + 1`);
    expect(e.kind).toBe('name');
    expect(e.message).toMatch(/has 190000 characters; names have at most 64/);
    const pool = Array.from({ length: 20_000 }, (_, i) => `cell_${i}`);
    expect(nearestName('z'.repeat(200_000), pool)).toBeUndefined();
    expect(nearestName('cel_12345', pool)).toBe('cell_12345');
    expect(nearestName('CELL_7', pool)).toBe('cell_7');
  });

  it('a run budget stops every evaluation once it is used up, naming it', () => {
    setRunBudget(0.001);
    // wait until the budget is certainly used up (a fast machine might otherwise finish within it)
    const until = performance.now() + 5;
    while (performance.now() < until);
    try {
      const s = new Sheet({ cells: [{ name: 'step', formula: 'step(x) = x + 1' }, { name: 'a', formula: 'sum(map(1:10, step))' }] });
      const st = s.state('a');
      expect(st.status).toBe('error');
      expect(st.status === 'error' && st.error.message).toMatch(/the run's time budget of 0\.001 s is used up/);
    } finally {
      setRunBudget(Infinity);
    }
  });
});

describe('messages down a chain after a rename on a cycle (issue 10)', () => {
  it('renaming a cell on a cycle updates the message of every cell below, as a rebuild does', () => {
    const s = new Sheet({
      cells: [
        { name: 'x1', formula: 'x3 + 1' },
        { name: 'x2', formula: 'x1 + 1' },
        { name: 'x3', formula: 'x2 + 1' },
        { name: 'y1', formula: 'x3 + 1' },
        { name: 'y2', formula: 'y1 + 1' },
      ],
    });
    s.renameCell('x1', 'w1');
    const rebuilt = Sheet.fromFile(s.toFileText());
    for (const c of rebuilt.cells()) expect(s.state(c.name), c.name).toEqual(rebuilt.state(c.name));
    expect(JSON.stringify(s.state('y2'))).toMatch(/x3 -> x2 -> w1 -> x3/);
  });
});
