import { describe, it, expect } from 'vitest';
import type { Unit } from 'mathjs';
import { arrayViewBuiltins, PulsarArrayValue, SensitivityCurveValue } from '../../src/builtins/arrayView';
import { BuiltinError } from '../../src/sheet/cellError';
import { math } from '../../src/sheet/mathInstance';
import { isSheetObject } from '../../src/sheet/sheetObject';
import { DAY_S, F_YR_HZ, KM_S_MPC_SI, YEAR_S } from '../../src/physics/constants';
import { backgroundSpectrum } from '../../src/physics/backgroundIntegral';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';

// The sheet boundary: units in, SI inside, clear errors that name the function and the argument.
// Invented arrays only.
const call = (name: string, ...args: unknown[]) => {
  const b = arrayViewBuiltins.find((x) => x.name === name);
  if (!b) throw new Error(`no built-in ${name}`);
  return b.fn(...args);
};
const u = (s: string) => math.unit(s);
const demoArray = () => call('pulsarArray', 30, u('200 ns'), u('14 day'), u('12 yr')) as PulsarArrayValue;

/** Asserts a BuiltinError whose message names the function and argument and matches `what`. */
function expectError(f: () => unknown, fn: string, arg: string, what: RegExp) {
  let caught: unknown;
  try {
    f();
  } catch (e) {
    caught = e;
  }
  expect(caught, `expected ${fn} to refuse ${arg}`).toBeInstanceOf(BuiltinError);
  const msg = (caught as Error).message;
  expect(msg).toContain(fn);
  expect(msg).toContain(arg);
  expect(msg).toMatch(what);
}

describe('hellingsDowns built-in (Hellings & Downs 1983, ApJ 265, L39)', () => {
  it('takes angles with units and gives the closed form', () => {
    // At 90 deg, x = 1/2: (3/2)(1/2) ln(1/2) - 1/8 + 1/2, evaluated here.
    const expected = 0.75 * Math.log(0.5) + 0.375;
    expect(Math.abs((call('hellingsDowns', u('90 deg')) as number) - expected)).toBeLessThan(1e-15);
    expect(Math.abs((call('hellingsDowns', u(`${Math.PI / 2} rad`)) as number) - expected)).toBeLessThan(1e-15);
    const list = call('hellingsDowns', math.matrix([u('0 deg'), u('180 deg')])) as { toArray(): number[] };
    expect(list.toArray()).toEqual([0.5, 0.25]);
  });
  it('refuses plain numbers, non-angles and angles beyond 180 deg', () => {
    expectError(() => call('hellingsDowns', 1.2), 'hellingsDowns', 'separation', /angle unit/);
    expectError(() => call('hellingsDowns', u('3 m')), 'hellingsDowns', 'separation', /angle unit/);
    expectError(() => call('hellingsDowns', u('200 deg')), 'hellingsDowns', 'separation', /must lie in/);
    expectError(() => call('hellingsDowns', math.matrix([u('10 deg'), 3])), 'hellingsDowns', 'separation[2]', /angle unit/);
  });
});

describe('pulsarArray built-in', () => {
  it('builds an array in SI and describes it in one line', () => {
    const a = demoArray();
    expect(isSheetObject(a)).toBe(true);
    expect(a.kind).toBe('pulsarArray');
    expect(a.array.pulsars).toHaveLength(30);
    expect(Math.abs(a.array.pulsars[0].precisionS - 2e-7)).toBeLessThan(1e-20);
    expect(Math.abs(a.array.pulsars[0].cadenceS - 14 * DAY_S)).toBeLessThan(1e-6);
    expect(Math.abs(a.array.spanS - 12 * YEAR_S)).toBeLessThan(1e-3);
    expect(a.describe()).toBe('pulsar array, 30 pulsars, 200 ns every 14 d over 12 yr, sky-averaged');
    expect(JSON.parse(JSON.stringify(a.toJSON())).pulsars).toHaveLength(30);
  });
  it('takes per-pulsar precisions and red noise', () => {
    const a = call('pulsarArray', 3, math.matrix([u('100 ns'), u('200 ns'), u('300 ns')]), u('7 day'), u('10 yr'), 1e-15, 13 / 3) as PulsarArrayValue;
    expect(a.array.pulsars.map((p) => Math.round(p.precisionS * 1e9))).toEqual([100, 200, 300]);
    expect(a.array.pulsars.every((p) => p.redAmplitude === 1e-15 && p.redGamma === 13 / 3)).toBe(true);
    expect(a.describe()).toContain('red noise');
  });
  it('refuses zero pulsars, one pulsar and fractional counts', () => {
    expectError(() => call('pulsarArray', 0, u('100 ns'), u('14 day'), u('10 yr')), 'pulsarArray', 'count', /at least 2/);
    expectError(() => call('pulsarArray', 1, u('100 ns'), u('14 day'), u('10 yr')), 'pulsarArray', 'count', /pair/);
    expectError(() => call('pulsarArray', 2.5, u('100 ns'), u('14 day'), u('10 yr')), 'pulsarArray', 'count', /whole number/);
  });
  it('refuses non-positive precision, with the list position when given per pulsar', () => {
    expectError(() => call('pulsarArray', 5, u('0 ns'), u('14 day'), u('10 yr')), 'pulsarArray', 'precision', /positive/);
    expectError(() => call('pulsarArray', 5, u('-3 ns'), u('14 day'), u('10 yr')), 'pulsarArray', 'precision', /positive/);
    expectError(
      () => call('pulsarArray', 2, math.matrix([u('100 ns'), u('-1 ns')]), u('14 day'), u('10 yr')),
      'pulsarArray',
      'precision[2]',
      /positive/,
    );
    expectError(() => call('pulsarArray', 3, math.matrix([u('100 ns'), u('50 ns')]), u('14 day'), u('10 yr')), 'pulsarArray', 'precision', /list of 3/);
  });
  it('refuses a cadence longer than the span (no frequency bin), a zero cadence and unitless times', () => {
    expectError(() => call('pulsarArray', 5, u('100 ns'), u('2 yr'), u('1 yr')), 'pulsarArray', 'span', /cadence is too long/);
    expectError(() => call('pulsarArray', 5, u('100 ns'), u('0 day'), u('1 yr')), 'pulsarArray', 'cadence', /positive/);
    expectError(() => call('pulsarArray', 5, 1e-7, u('14 day'), u('10 yr')), 'pulsarArray', 'precision', /unit of time/);
    expectError(() => call('pulsarArray', 5, u('100 ns'), u('14 day'), u('10 m')), 'pulsarArray', 'span', /unit of time/);
  });
  it('refuses runaway bin counts and a red amplitude without an index', () => {
    expectError(() => call('pulsarArray', 5, u('100 ns'), u('1 s'), u('10 yr')), 'pulsarArray', 'span', /limit/);
    expectError(() => call('pulsarArray', 5, u('100 ns'), u('14 day'), u('10 yr'), 1e-15), 'pulsarArray', 'redGamma', /needed/);
    expectError(() => call('pulsarArray', 5, u('100 ns'), u('14 day'), u('10 yr'), -1e-15, 4), 'pulsarArray', 'redAmplitude', /must lie in/);
  });
});

describe('pulsarArrayOnSky built-in', () => {
  it('reads [RA, Dec] rows with angle units', () => {
    const pos = math.matrix([
      [u('0 deg'), u('0 deg')],
      [u('90 deg'), u('0 deg')],
      [u('45 deg'), u('60 deg')],
    ]);
    const a = call('pulsarArrayOnSky', pos, u('100 ns'), u('14 day'), u('10 yr')) as PulsarArrayValue;
    expect(a.array.positions).toHaveLength(3);
    expect(Math.abs(a.array.positions![1][0] - Math.PI / 2)).toBeLessThan(1e-15);
    expect(a.describe()).toContain('positions given');
  });
  it('refuses malformed rows, declinations beyond 90 deg and a single pulsar', () => {
    const bad = math.matrix([[u('0 deg'), u('0 deg'), u('1 deg')], [u('1 deg'), u('2 deg'), u('3 deg')]]);
    expectError(() => call('pulsarArrayOnSky', bad, u('100 ns'), u('14 day'), u('10 yr')), 'pulsarArrayOnSky', 'positions[1]', /pair/);
    const dec = math.matrix([
      [u('0 deg'), u('95 deg')],
      [u('1 deg'), u('2 deg')],
    ]);
    expectError(() => call('pulsarArrayOnSky', dec, u('100 ns'), u('14 day'), u('10 yr')), 'pulsarArrayOnSky', 'declination', /\[-90, 90\]/);
    expectError(() => call('pulsarArrayOnSky', math.matrix([[u('0 deg'), u('5 deg')]]), u('100 ns'), u('14 day'), u('10 yr')), 'pulsarArrayOnSky', 'positions', /at least 2/);
    expectError(() => call('pulsarArrayOnSky', 4, u('100 ns'), u('14 day'), u('10 yr')), 'pulsarArrayOnSky', 'positions', /list/);
  });
});

describe('arraySensitivity, detectionSnr and detectionSpan built-ins', () => {
  it('arraySensitivity gives a plottable curve on the bins k/T', () => {
    const c = call('arraySensitivity', demoArray()) as SensitivityCurveValue;
    expect(c.kind).toBe('sensitivityCurve');
    expect(c.frequencyHz.length).toBe(Math.floor((12 * YEAR_S) / (28 * DAY_S))); // 156 bins; the top one is 156/T = 412 nHz
    expect(c.describe()).toMatch(/^array sensitivity, 156 bins, 2\.64 nHz to 412 nHz, 435 pairs \(sky-averaged\)$/);
    const json = c.toJSON() as { frequencyHz: number[]; hc: number[] };
    expect(json.hc).toHaveLength(c.hc.length);
  });

  it('detectionSnr takes an amplitude or a spectrum-like object and an optional span', () => {
    const a = demoArray();
    const byAmplitude = call('detectionSnr', 2e-15, a) as number;
    const n = 30;
    const f = Array.from({ length: n }, (_, i) => 1e-9 * Math.pow(500, i / (n - 1)));
    const spectrum = { kind: 'spectrum', describe: () => 'test spectrum', toJSON: () => ({}), frequencyHz: Float64Array.from(f), hc: Float64Array.from(f.map((x) => 2e-15 * Math.pow(x / F_YR_HZ, -2 / 3))) };
    const bySpectrum = call('detectionSnr', spectrum, a) as number;
    // The spectrum stops at 500 nHz, above the 413 nHz Nyquist bin, so both see the same signal in every bin.
    expect(Math.abs(bySpectrum / byAmplitude - 1)).toBeLessThan(1e-10);
    const longer = call('detectionSnr', 2e-15, a, u('20 yr')) as number;
    expect(longer).toBeGreaterThan(byAmplitude);
    // A spectrum object that wraps the arrays in a `spectrum` field is read as well.
    const wrapped = { kind: 'spectrum', describe: () => 'w', toJSON: () => ({}), spectrum: { frequencyHz: spectrum.frequencyHz, hc: spectrum.hc } };
    expect(call('detectionSnr', wrapped, a)).toBe(bySpectrum);
  });

  it('detectionSnr refuses a spectrum that does not reach down to 1/T, naming the argument and the span that fits', () => {
    const f = Float64Array.of(5e-9, 1e-8, 5e-8);
    const spectrum = { kind: 'spectrum', describe: () => 's', toJSON: () => ({}), frequencyHz: f, hc: Float64Array.of(1e-15, 6e-16, 2e-16) };
    expectError(() => call('detectionSnr', spectrum, demoArray()), 'detectionSnr', 'signal', /lies below the spectrum's lowest frequency 5 nHz.*6\.34 yr/);
    const broken = { ...spectrum, hc: Float64Array.of(1e-15, NaN, 2e-16) };
    expectError(() => call('detectionSnr', broken, demoArray()), 'detectionSnr', 'signal', /strain value 2/);
    expectError(() => call('detectionSnr', u('3 m'), demoArray()), 'detectionSnr', 'signal', /spectrum, a population or an amplitude/);
    expectError(() => call('detectionSnr', 0, demoArray()), 'detectionSnr', 'signal', /must lie in/);
    expectError(() => call('detectionSnr', 2e-15, 'array'), 'detectionSnr', 'array', /pulsarArray/);
    expectError(() => call('detectionSnr', 2e-15, demoArray(), u('10 day')), 'detectionSnr', 'span', /cadence is too long/);
  });

  it('detectionSpan returns a time in years where the S/N reaches the threshold', () => {
    const a = demoArray();
    const t = call('detectionSpan', 2e-15, a, 3) as Unit;
    const years = t.toNumber('yr');
    expect(years).toBeGreaterThan(0);
    const at = call('detectionSnr', 2e-15, a, u(`${years} yr`)) as number;
    expect(at).toBeGreaterThanOrEqual(3 * (1 - 1e-9));
    const before = call('detectionSnr', 2e-15, a, u(`${years * 0.999} yr`)) as number;
    expect(before).toBeLessThan(3);
  });

  it('detectionSpan says when the threshold is out of reach, and refuses a search beyond the spectrum', () => {
    const weak = call('pulsarArray', 2, u('5 us'), u('30 day'), u('5 yr')) as PulsarArrayValue;
    expectError(() => call('detectionSpan', 1e-16, weak, 5, u('40 yr')), 'detectionSpan', 'threshold', /stays below/);
    const f = Float64Array.of(2e-9, 1e-8, 5e-8);
    const spectrum = { kind: 'spectrum', describe: () => 's', toJSON: () => ({}), frequencyHz: f, hc: Float64Array.of(1e-15, 6e-16, 2e-16) };
    expectError(() => call('detectionSpan', spectrum, demoArray(), 3, u('30 yr')), 'detectionSpan', 'longestSpan', /need frequencies it does not have/);
    expectError(() => call('detectionSpan', 2e-15, demoArray(), 0), 'detectionSpan', 'threshold', /must lie in/);
  });
});

describe('population and spectrum-with-origin signals', () => {
  // An invented population (made-up parameters); the values stand in for a 'population' cell and a
  // 'spectrum' cell that remembers its population (duck-typed here: only the fields the array view reads).
  const population = phenomenologicalPopulation({
    rateNorm: 2e-5,
    alpha: 0,
    cutoffMass: 3e9,
    beta: 2,
    z0: 1.5,
    zMax: 5,
    log10MMin: 7,
    log10MMax: 11,
    massRatio: powerLawMassRatio(0, 0.1),
    cosmology: new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 }),
  });
  const populationValue = { kind: 'population', population, describe: () => 'invented population', toJSON: () => ({}) };
  const arr = () => call('pulsarArray', 20, u('300 ns'), u('30 day'), u('16 yr')) as PulsarArrayValue;

  it('a population gives the S/N of its spectrum computed on the array bins themselves (24 points per decade, then interpolated)', () => {
    const a = arr();
    const bins = Array.from({ length: Math.floor((16 * YEAR_S) / (60 * DAY_S)) }, (_, k) => (k + 1) / (16 * YEAR_S));
    const exact = backgroundSpectrum(population, bins);
    const onBins = { kind: 'spectrum', describe: () => 's', toJSON: () => ({}), frequencyHz: exact.frequencyHz, hc: exact.hc };
    const viaPopulation = call('detectionSnr', populationValue, a) as number;
    const viaBins = call('detectionSnr', onBins, a) as number;
    // Interpolation of a smooth spectrum at 24 points per decade: agreement to 1e-4 (tolerance set by that grid).
    expect(Math.abs(viaPopulation / viaBins - 1), `${viaPopulation} vs ${viaBins}`).toBeLessThan(1e-4);
  });

  it('a spectrum that remembers its population is extended below its grid with that population', () => {
    const a = arr();
    const grid = Array.from({ length: 30 }, (_, i) => 4e-9 * Math.pow(100, i / 29));
    const s = backgroundSpectrum(population, grid);
    const withOrigin = { kind: 'spectrum', describe: () => 's', toJSON: () => ({}), frequencyHz: s.frequencyHz, hc: s.hc, origin: { population, options: {} } };
    const without = { kind: 'spectrum', describe: () => 's', toJSON: () => ({}), frequencyHz: s.frequencyHz, hc: s.hc };
    // 16 yr: 1/T = 1.98 nHz, below the 4 nHz grid start.
    expectError(() => call('detectionSnr', without, a), 'detectionSnr', 'signal', /lies below/);
    const extended = call('detectionSnr', withOrigin, a) as number;
    const viaPopulation = call('detectionSnr', populationValue, a) as number;
    expect(Math.abs(extended / viaPopulation - 1)).toBeLessThan(1e-3);
    // detectionSpan may then search beyond 1/(grid start) = 7.9 yr.
    const t = (call('detectionSpan', withOrigin, a, 3, u('60 yr')) as Unit).toNumber('yr');
    const atT = call('detectionSnr', populationValue, a, u(`${t} yr`)) as number;
    expect(Math.abs(atT - 3)).toBeLessThan(0.05);
  });

  it('the extension below the grid does not depend on earlier calls (fixed anchored points, kept per value)', () => {
    const a = arr();
    const grid = Array.from({ length: 20 }, (_, i) => 4e-9 * Math.pow(50, i / 19));
    const s = backgroundSpectrum(population, grid);
    const make = () => ({ kind: 'spectrum', describe: () => 's', toJSON: () => ({}), frequencyHz: s.frequencyHz, hc: s.hc, origin: { population, options: {} } });
    const fresh = call('detectionSnr', make(), a, u('20 yr')) as number;
    const reused = make();
    call('detectionSnr', reused, a, u('35 yr')); // extends further down first
    expect(call('detectionSnr', reused, a, u('20 yr'))).toBe(fresh);
  });
});
