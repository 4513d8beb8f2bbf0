// The array's view as sheet built-ins: timing arrays, the Hellings & Downs correlation, the array's
// sensitivity curve, the expected S/N of the correlated background and the span that detects it.
// Units and argument checks happen here; the physics is plain numbers in src/physics.
import type { Matrix, Unit } from 'mathjs';
import type { Builtin, BuiltinArg } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { math, isUnit, quantity } from '../sheet/mathInstance';
import { isSheetObject, type SheetObject } from '../sheet/sheetObject';
import { checkTimeNowIfHandingOff } from '../sheet/evaluationBudget';
import { DAY_S, YEAR_S } from '../physics/constants';
import { binsBelowNyquist } from '../physics/frequencyGrid';
import { hellingsDowns } from '../physics/hellingsDowns';
import { MAX_FREQUENCY_BINS, shortestCadence, type PulsarArray, type PulsarNoise } from '../physics/pulsarArray';
import { arraySensitivity, type SensitivityCurve } from '../physics/arraySensitivity';
import { detectionSnr, detectionSpan } from '../physics/detectionSnr';
import { BelowSpectrumError, powerLawModel, spectrumModel, spectrumProblem, type StrainModel } from '../physics/strainOnBins';
import type { Spectrum } from '../physics/spectrum';
import type { BinaryPopulation } from '../physics/populationTypes';
import { backgroundSpectrum, type BackgroundOptions } from '../physics/backgroundIntegral';
import { kindOf, objectOf, requireRange, scalarSI, vectorSI, where } from './args';
import { threeSignificant as fmt } from './threeSignificant';

/** Most pulsars an array may hold (pair layouts with positions grow as N^2). */
export const MAX_PULSARS = 2000;
/** Default longest span detectionSpan searches. */
const DEFAULT_LONGEST_SPAN_S = 100 * YEAR_S;

// ---- values ---------------------------------------------------------------------------------

/** A timing array as a sheet value. */
export class PulsarArrayValue implements SheetObject {
  readonly kind = 'pulsarArray';
  constructor(readonly array: PulsarArray) {}
  describe(): string {
    const a = this.array;
    const p = a.pulsars;
    const precisions = p.map((x) => x.precisionS);
    const lo = Math.min(...precisions);
    const hi = Math.max(...precisions);
    const prec = lo === hi ? `${fmt(lo * 1e9)} ns` : `${fmt(lo * 1e9)}-${fmt(hi * 1e9)} ns`;
    const red = p.some((x) => x.redAmplitude > 0) ? ', red noise' : '';
    const sky = a.positions ? 'positions given' : 'sky-averaged';
    return `pulsar array, ${p.length} pulsars, ${prec} every ${fmt(shortestCadence(a) / DAY_S)} d over ${fmt(a.spanS / YEAR_S)} yr${red}, ${sky}`;
  }
  toJSON(): unknown {
    return { kind: this.kind, spanS: this.array.spanS, pulsars: this.array.pulsars, positionsRad: this.array.positions };
  }
}

/** The array's noise-equivalent characteristic strain on its frequency bins (plots like a spectrum). */
export class SensitivityCurveValue implements SheetObject, Spectrum {
  readonly kind = 'sensitivityCurve';
  readonly frequencyHz: Float64Array;
  readonly hc: Float64Array;
  constructor(readonly curve: SensitivityCurve) {
    this.frequencyHz = curve.frequencyHz;
    this.hc = curve.hc;
  }
  describe(): string {
    const f = this.frequencyHz;
    return `array sensitivity, ${f.length} bins, ${fmt(f[0] * 1e9)} nHz to ${fmt(f[f.length - 1] * 1e9)} nHz, ${this.curve.pulsarPairs} pairs${this.curve.skyAveraged ? ' (sky-averaged)' : ''}`;
  }
  toJSON(): unknown {
    return {
      kind: this.kind,
      frequencyHz: Array.from(this.frequencyHz),
      hc: Array.from(this.hc),
      pulsarPairs: this.curve.pulsarPairs,
      skyAveraged: this.curve.skyAveraged,
    };
  }
}

// ---- argument helpers -----------------------------------------------------------------------

const RADIAN = math.unit('rad');

/** An angle in radians; plain numbers are refused (degrees or radians must be said). */
function angleRad(v: unknown, fn: string, arg: string): number {
  if (isUnit(v)) {
    const u = v as Unit & { value: number | null };
    if (!u.equalBase(RADIAN)) throw new BuiltinError(`${where(fn, arg)} needs an angle unit (deg or rad), got ${u.formatUnits() || 'no unit'}`, 'unit');
    if (u.value === null || !Number.isFinite(u.value)) throw new BuiltinError(`${where(fn, arg)} is not a finite angle`, 'domain');
    return u.value;
  }
  if (typeof v === 'number') throw new BuiltinError(`${where(fn, arg)} needs an angle unit (for example ${v} deg or ${v} rad), got the plain number ${v}`, 'unit');
  throw new BuiltinError(`${where(fn, arg)} must be an angle, got ${kindOf(v)}`, 'domain');
}

function listItems(v: unknown): unknown[] | null {
  if (math.isMatrix(v)) return (v as Matrix).toArray() as unknown[];
  if (Array.isArray(v)) return v;
  return null;
}

/** A per-pulsar quantity: one value for all, or a list with one value per pulsar; `check` sees each given value. */
function perPulsar(
  v: unknown,
  count: number,
  dim: 'time' | 'dimensionless',
  fn: string,
  arg: string,
  check: (x: number, argName: string) => void,
): Float64Array {
  const values = vectorSI(v, dim, fn, arg);
  const listed = listItems(v) !== null;
  values.forEach((x, i) => check(x, listed ? `${arg}[${i + 1}]` : arg));
  if (values.length === 1) return new Float64Array(count).fill(values[0]);
  if (values.length !== count) throw new BuiltinError(`${where(fn, arg)} must be one value or a list of ${count} (one per pulsar), got ${values.length}`);
  return values;
}

function integerCount(v: unknown, fn: string, arg: string): number {
  const n = scalarSI(v, 'dimensionless', fn, arg);
  if (!Number.isInteger(n)) throw new BuiltinError(`${where(fn, arg)} must be a whole number of pulsars, got ${n}`);
  if (n < 2) throw new BuiltinError(`${where(fn, arg)} must be at least 2: a correlation needs a pair of pulsars, got ${n}`);
  if (n > MAX_PULSARS) throw new BuiltinError(`${where(fn, arg)} must be at most ${MAX_PULSARS}, got ${n}`, 'limit');
  return n;
}

function checkSpan(spanS: number, cadenceS: number, fn: string, arg: string): number {
  requireRange(spanS, fn, arg, 0, Infinity, { loOpen: true, unitText: 's' });
  if (spanS < 2 * cadenceS * (1 - 1e-12)) {
    throw new BuiltinError(
      `${where(fn, arg)} is ${fmt(spanS / DAY_S)} d, shorter than two cadences (${fmt((2 * cadenceS) / DAY_S)} d): ` +
        `the cadence is too long for the span to hold even one frequency bin 1/T below the Nyquist frequency 1/(2 cadence)`,
    );
  }
  const bins = binsBelowNyquist(spanS, cadenceS);
  if (bins > MAX_FREQUENCY_BINS) {
    throw new BuiltinError(`${where(fn, arg)} with this cadence gives ${bins} frequency bins, more than the limit of ${MAX_FREQUENCY_BINS}; use a shorter span or a longer cadence`, 'limit');
  }
  return spanS;
}

/** Builds the pulsars' noise from the shared arguments of pulsarArray and pulsarArrayOnSky. */
function buildArray(
  fn: string,
  count: number,
  precision: unknown,
  cadence: unknown,
  span: unknown,
  redAmplitude: unknown,
  redGamma: unknown,
  positions: Array<[number, number]> | null,
): PulsarArrayValue {
  const sigma = perPulsar(precision, count, 'time', fn, 'precision', (x, name) => {
    if (!(x > 0)) throw new BuiltinError(`${where(fn, name)} must be positive, got ${x} s`);
  });
  const cadenceS = scalarSI(cadence, 'time', fn, 'cadence');
  if (!(cadenceS > 0)) throw new BuiltinError(`${where(fn, 'cadence')} must be positive, got ${cadenceS} s`);
  const spanS = checkSpan(scalarSI(span, 'time', fn, 'span'), cadenceS, fn, 'span');
  let amp: Float64Array = new Float64Array(count);
  let gam: Float64Array = new Float64Array(count);
  if (redAmplitude !== undefined) {
    if (redGamma === undefined) throw new BuiltinError(`${where(fn, 'redGamma')} is needed when redAmplitude is given`);
    amp = perPulsar(redAmplitude, count, 'dimensionless', fn, 'redAmplitude', (x, name) => requireRange(x, fn, name, 0, 1e-6));
    gam = perPulsar(redGamma, count, 'dimensionless', fn, 'redGamma', (x, name) => requireRange(x, fn, name, 0, 10));
  }
  const pulsars: PulsarNoise[] = [];
  for (let i = 0; i < count; i++) {
    pulsars.push({ precisionS: sigma[i], cadenceS, redAmplitude: amp[i], redGamma: gam[i] });
  }
  return new PulsarArrayValue({ pulsars, spanS, positions });
}

function arrayArg(v: unknown, fn: string, arg: string): PulsarArray {
  return objectOf<PulsarArrayValue>(v, 'pulsarArray', fn, arg).array;
}

/** An optional span override, checked against the array's cadence. */
function spanArg(v: unknown, array: PulsarArray, fn: string, arg: string): number {
  if (v === undefined) return array.spanS;
  return checkSpan(scalarSI(v, 'time', fn, arg), shortestCadence(array), fn, arg);
}

/**
 * The signal, in one of three forms:
 *  - an amplitude A_yr (dimensionless number): h_c = A_yr (f/f_yr)^(-2/3);
 *  - a spectrum value (kind 'spectrum', or anything holding frequencyHz and hc): interpolated on its
 *    grid; below the grid it is extended with the background of the population and options it was
 *    computed from when the value carries them (origin.population, origin.options), refused otherwise;
 *  - a population value (kind 'population'): the circular GW-driven background (Phinney 2001,
 *    astro-ph/0108028) computed on a log grid of 24 points per decade spanning the array's bins.
 * `lowestHz` is the lowest frequency the signal can supply (0: any).
 */
interface SignalSource {
  lowestHz: number;
  modelFor(lowestBinHz: number, highestBinHz: number): StrainModel;
}

/** Points per decade of the grids computed from a population. */
const POPULATION_GRID_PER_DECADE = 24;

function signalArg(v: unknown, fn: string, arg: string): SignalSource {
  if (typeof v === 'number' || (isUnit(v) && (v as Unit).dimensions.every((d: number) => d === 0))) {
    const a = scalarSI(v, 'dimensionless', fn, arg);
    requireRange(a, fn, arg, 0, 1e-6, { loOpen: true });
    const model = powerLawModel(a);
    return { lowestHz: 0, modelFor: () => model };
  }
  if (isSheetObject(v) && v.kind === 'population') {
    const pop = (v as unknown as { population?: BinaryPopulation }).population;
    if (!pop || typeof pop.density !== 'function') throw new BuiltinError(`${where(fn, arg)} is a population without a density`);
    return {
      lowestHz: 0,
      modelFor: (lo, hi) => guarded(fn, arg, () => spectrumModel(backgroundSpectrum(pop, logGrid(lo, hi)))),
    };
  }
  if (isSheetObject(v) && (v.kind === 'spectrum' || v.kind === 'sensitivityCurve')) {
    const s = spectrumOfObject(v);
    if (!s) throw new BuiltinError(`${where(fn, arg)} is a ${v.kind} without frequency and strain arrays`);
    const problem = spectrumProblem(s);
    if (problem) throw new BuiltinError(`${where(fn, arg)} is not a usable spectrum: ${problem}`);
    const model = spectrumModel(s);
    const origin = (v as unknown as { origin?: { population?: BinaryPopulation; options?: BackgroundOptions } }).origin;
    const pop = origin?.population;
    if (!pop || typeof pop.density !== 'function') return { lowestHz: s.frequencyHz[0], modelFor: () => model };
    return {
      lowestHz: 0,
      modelFor: (lo) => (lo >= s.frequencyHz[0] ? model : guarded(fn, arg, () => extendedModel(v, s, pop, origin?.options ?? {}, lo))),
    };
  }
  throw new BuiltinError(`${where(fn, arg)} must be a spectrum, a population or an amplitude A_yr (a number), got ${kindOf(v)}`, 'domain');
}

/** Points computed below a spectrum's grid, per spectrum value: f_j = f_0 10^(-j/24), j = 1, 2, ... */
const extensions = new WeakMap<object, { frequencyHz: number[]; hc: number[] }>();

/**
 * The spectrum's model extended below its grid down to `lowHz` with its own population. The extra
 * points sit on a fixed grid anchored at the spectrum's first frequency (24 per decade), so the
 * result for a given span does not depend on earlier calls; computed points are kept per value,
 * so a scan over spans computes each point once.
 */
function extendedModel(key: object, s: Spectrum, pop: BinaryPopulation, options: BackgroundOptions, lowHz: number): StrainModel {
  const f0 = s.frequencyHz[0];
  const need = Math.ceil(POPULATION_GRID_PER_DECADE * Math.log10(f0 / lowHz) - 1e-9);
  let ext = extensions.get(key);
  if (!ext) {
    ext = { frequencyHz: [], hc: [] };
    extensions.set(key, ext);
  }
  if (ext.frequencyHz.length < need) {
    const missing: number[] = [];
    for (let j = ext.frequencyHz.length + 1; j <= need; j++) missing.push(f0 * Math.pow(10, -j / POPULATION_GRID_PER_DECADE));
    const extra = backgroundSpectrum(pop, missing, options);
    ext.frequencyHz.push(...extra.frequencyHz);
    ext.hc.push(...extra.hc);
  }
  const n = need;
  const frequencyHz = new Float64Array(n + s.frequencyHz.length);
  const hc = new Float64Array(frequencyHz.length);
  for (let j = 0; j < n; j++) {
    frequencyHz[n - 1 - j] = ext.frequencyHz[j];
    hc[n - 1 - j] = ext.hc[j];
  }
  frequencyHz.set(s.frequencyHz, n);
  hc.set(s.hc, n);
  return spectrumModel({ frequencyHz, hc });
}

/** Log-spaced frequencies from lo to hi inclusive, POPULATION_GRID_PER_DECADE per decade (at least 2). */
function logGrid(lo: number, hi: number): Float64Array {
  const decades = Math.log10(hi / lo);
  const n = Math.max(2, Math.ceil(decades * POPULATION_GRID_PER_DECADE) + 1);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = lo * Math.pow(hi / lo, i / (n - 1));
  out[0] = lo;
  out[n - 1] = hi;
  return out;
}

/** Reads the Spectrum a sheet object carries: its own fields, or a `spectrum` field. */
function spectrumOfObject(v: SheetObject): Spectrum | null {
  const o = v as unknown as { frequencyHz?: unknown; hc?: unknown; spectrum?: { frequencyHz?: unknown; hc?: unknown } };
  const src = o.frequencyHz !== undefined ? o : o.spectrum;
  if (!src) return null;
  const f = toFloat64(src.frequencyHz);
  const h = toFloat64(src.hc);
  return f && h ? { frequencyHz: f, hc: h } : null;
}

function toFloat64(x: unknown): Float64Array | null {
  if (x instanceof Float64Array) return x;
  if (Array.isArray(x) && x.every((e) => typeof e === 'number')) return Float64Array.from(x as number[]);
  return null;
}

/** Runs a physics call, turning its RangeErrors into errors that name the function and argument. */
function guarded<T>(fn: string, signalArgName: string, body: () => T): T {
  try {
    return body();
  } catch (e) {
    if (e instanceof BelowSpectrumError) {
      throw new BuiltinError(
        `${where(fn, signalArgName)}: the array's lowest frequency bin 1/T = ${fmt(e.binHz * 1e9)} nHz lies below the spectrum's lowest frequency ` +
          `${fmt(e.lowestHz * 1e9)} nHz; extend the spectrum's grid down to 1/T (spans up to ${fmt(1 / e.lowestHz / YEAR_S)} yr fit)`,
      );
    }
    if (e instanceof RangeError) throw new BuiltinError(`${fn}: ${e.message}`);
    throw e;
  }
}

// ---- built-ins ------------------------------------------------------------------------------

const hellingsDownsBuiltin: Builtin = {
  name: 'hellingsDowns',
  category: 'array',
  summary: 'Hellings & Downs correlation of two distinct pulsars an angle apart on the sky (1/2 at zero separation).',
  args: [{ name: 'separation', unit: 'angle (deg or rad), or a list of angles', description: 'angle between the two pulsars, 0 to 180 deg' }],
  returns: { unit: 'dimensionless', description: 'expected correlation of the two pulsars’ residuals, or a list of them' },
  source: 'Hellings & Downs 1983, ApJ 265, L39',
  example: 'hellingsDowns(90 deg)  → -0.1449',
  fn: (separation: unknown) => {
    const fn = 'hellingsDowns';
    const one = (v: unknown, arg: string) => {
      const z = angleRad(v, fn, arg);
      requireRange(z, fn, arg, 0, Math.PI * (1 + 1e-12), { unitText: 'rad (0 to 180 deg)' });
      return hellingsDowns(Math.min(z, Math.PI));
    };
    const items = listItems(separation);
    if (items === null) return one(separation, 'separation');
    const flat = (items as unknown[]).flat(Infinity as 1);
    return math.matrix(flat.map((v, i) => one(v, `separation[${i + 1}]`)));
  },
};

/** The arguments after the first that pulsarArray and pulsarArrayOnSky share (read by buildArray). */
const NOISE_ARGS: BuiltinArg[] = [
  { name: 'precision', unit: 'time (ns), or a list per pulsar', description: 'rms timing precision per observation (tens of ns are typical for millisecond pulsars)' },
  { name: 'cadence', unit: 'time (d)', description: 'time between observations' },
  { name: 'span', unit: 'time (yr)', description: 'observing span, at least two cadences' },
  { name: 'redAmplitude', unit: 'dimensionless, or a list per pulsar', description: 'red-noise amplitude A_red of P = A_red^2/(12 pi^2) f_yr^-3 (f/f_yr)^-gamma', optional: true },
  { name: 'redGamma', unit: 'dimensionless, or a list per pulsar', description: 'red-noise spectral index gamma (0 to 10); needed with redAmplitude', optional: true },
];

const pulsarArrayBuiltin: Builtin = {
  name: 'pulsarArray',
  category: 'array',
  summary: 'A timing array of pulsars with white (and optional red) noise, observed at a cadence over a span; sky positions unknown (pair sums use the isotropic-sky expectation).',
  args: [
    { name: 'count', unit: 'dimensionless', description: 'number of pulsars, at least 2' },
    ...NOISE_ARGS,
  ],
  returns: { unit: 'pulsarArray', description: 'the array, for arraySensitivity, detectionSnr and detectionSpan' },
  source: 'white-noise PSD 2 sigma^2 dt and power-law red noise as in Hazboun, Romano & Smith 2019, PRD 100, 104028',
  example: 'pulsarArray(30, 200 ns, 14 day, 12 yr)',
  fn: (count: unknown, precision: unknown, cadence: unknown, span: unknown, redAmplitude?: unknown, redGamma?: unknown) => {
    const fn = 'pulsarArray';
    return buildArray(fn, integerCount(count, fn, 'count'), precision, cadence, span, redAmplitude, redGamma, null);
  },
};

const pulsarArrayOnSkyBuiltin: Builtin = {
  name: 'pulsarArrayOnSky',
  category: 'array',
  summary: 'A timing array whose pulsars sit at given sky positions, so each pair carries its own Hellings & Downs factor.',
  args: [
    { name: 'positions', unit: 'list of [right ascension, declination] angles', description: 'one row per pulsar, e.g. [[10 deg, 20 deg], [200 deg, -35 deg]]' },
    ...NOISE_ARGS,
  ],
  returns: { unit: 'pulsarArray', description: 'the array, for arraySensitivity, detectionSnr and detectionSpan' },
  source: 'Hellings & Downs 1983, ApJ 265, L39 (pair factors); noise as in pulsarArray',
  example: 'pulsarArrayOnSky([[0 deg, 0 deg], [90 deg, 0 deg], [0 deg, 60 deg]], 100 ns, 14 day, 10 yr)',
  fn: (positions: unknown, precision: unknown, cadence: unknown, span: unknown, redAmplitude?: unknown, redGamma?: unknown) => {
    const fn = 'pulsarArrayOnSky';
    const rows = listItems(positions);
    if (rows === null) throw new BuiltinError(`${where(fn, 'positions')} must be a list of [right ascension, declination] rows, got ${kindOf(positions)}`);
    if (rows.length < 2) throw new BuiltinError(`${where(fn, 'positions')} must hold at least 2 pulsars: a correlation needs a pair, got ${rows.length}`);
    if (rows.length > MAX_PULSARS) throw new BuiltinError(`${where(fn, 'positions')} may hold at most ${MAX_PULSARS} pulsars, got ${rows.length}`, 'limit');
    const sky: Array<[number, number]> = rows.map((row, i) => {
      const r = listItems(row);
      if (r === null || r.length !== 2) throw new BuiltinError(`${where(fn, `positions[${i + 1}]`)} must be a pair [right ascension, declination], got ${kindOf(row)}`);
      const ra = angleRad(r[0], fn, `positions[${i + 1}] right ascension`);
      const dec = angleRad(r[1], fn, `positions[${i + 1}] declination`);
      if (Math.abs(dec) > Math.PI / 2 * (1 + 1e-12)) throw new BuiltinError(`${where(fn, `positions[${i + 1}] declination`)} must lie in [-90, 90] deg, got ${fmt((dec * 180) / Math.PI)} deg`);
      return [ra, dec];
    });
    return buildArray(fn, sky.length, precision, cadence, span, redAmplitude, redGamma, sky);
  },
};

const arraySensitivityBuiltin: Builtin = {
  name: 'arraySensitivity',
  category: 'array',
  summary: 'Noise-equivalent characteristic strain of the array for the correlated background, on its frequency bins k/T up to 1/(2 cadence).',
  args: [
    { name: 'array', unit: 'pulsarArray', description: 'from pulsarArray or pulsarArrayOnSky' },
    { name: 'span', unit: 'time (yr)', description: 'span to use instead of the array’s own', optional: true },
  ],
  returns: { unit: 'sensitivityCurve', description: 'h_n(f) = sqrt(12 pi^2 f^3 P_eff), P_eff = [sum over pairs Gamma^2/(P_I P_J)]^(-1/2); plots beside a spectrum' },
  source: 'pair combination as in Hazboun, Romano & Smith 2019, PRD 100, 104028; P = h_c^2/(12 pi^2 f^3)',
  example: 'arraySensitivity(pulsarArray(30, 200 ns, 14 day, 12 yr))',
  fn: (array: unknown, span?: unknown) => {
    const fn = 'arraySensitivity';
    const a = arrayArg(array, fn, 'array');
    const t = spanArg(span, a, fn, 'span');
    return guarded(fn, 'array', () => new SensitivityCurveValue(arraySensitivity(a, t)));
  },
};

const detectionSnrBuiltin: Builtin = {
  name: 'detectionSnr',
  category: 'array',
  summary: 'Expected signal-to-noise ratio of the optimal cross-correlation statistic for a predicted background and an array.',
  args: [
    { name: 'signal', unit: 'spectrum, population, or dimensionless A_yr', description: 'predicted spectrum (interpolated; below its grid extended with its own population if it has one, else refused; above its top the signal counts as 0), a population (circular background computed over the array’s bins), or an amplitude A_yr for h_c = A_yr (f/f_yr)^(-2/3)' },
    { name: 'array', unit: 'pulsarArray', description: 'from pulsarArray or pulsarArrayOnSky' },
    { name: 'span', unit: 'time (yr)', description: 'span to use instead of the array’s own (for scans over span)', optional: true },
  ],
  returns: { unit: 'dimensionless', description: 'expected S/N, sqrt of the sum over bins k/T and pulsar pairs of 2 Gamma^2 P_g^2 / [(P_I+P_g)(P_J+P_g) + Gamma^2 P_g^2]' },
  source: 'Siemens, Ellis, Jenet & Romano 2013, CQG 30, 224015 (discrete-bin form)',
  example: 'detectionSnr(2e-15, pulsarArray(30, 200 ns, 14 day, 12 yr))',
  fn: (signal: unknown, array: unknown, span?: unknown) => {
    const fn = 'detectionSnr';
    const a = arrayArg(array, fn, 'array');
    const source = signalArg(signal, fn, 'signal');
    const t = spanArg(span, a, fn, 'span');
    const model = source.modelFor(1 / t, 1 / (2 * shortestCadence(a)));
    return guarded(fn, 'signal', () => detectionSnr(a, model, t).snr);
  },
};

const detectionSpanBuiltin: Builtin = {
  name: 'detectionSpan',
  category: 'array',
  summary: 'Shortest observing span at which the expected cross-correlation S/N reaches a threshold (root find over span).',
  args: [
    { name: 'signal', unit: 'spectrum, population, or dimensionless A_yr', description: 'predicted spectrum, population or amplitude A_yr, as in detectionSnr' },
    { name: 'array', unit: 'pulsarArray', description: 'the array; its own span is ignored' },
    { name: 'threshold', unit: 'dimensionless', description: 'S/N to reach, greater than 0' },
    { name: 'longestSpan', unit: 'time (yr)', description: 'longest span searched (default 100 yr; for a spectrum without its population, never beyond 1/(its lowest frequency))', optional: true },
  ],
  returns: { unit: 'time (yr)', description: 'the span; an error says so when the threshold is not reached within the search' },
  source: 'S/N of Siemens, Ellis, Jenet & Romano 2013, CQG 30, 224015; log-spaced scan (common practice, no source) then the root finder of Brent in log T (Brent 1973, Algorithms for Minimization without Derivatives, Prentice-Hall)',
  example: 'detectionSpan(2e-15, pulsarArray(30, 200 ns, 14 day, 12 yr), 3)',
  fn: (signal: unknown, array: unknown, threshold: unknown, longestSpan?: unknown) => {
    const fn = 'detectionSpan';
    const a = arrayArg(array, fn, 'array');
    const source = signalArg(signal, fn, 'signal');
    const lowestHz = source.lowestHz;
    const thr = requireRange(scalarSI(threshold, 'dimensionless', fn, 'threshold'), fn, 'threshold', 0, 1e6, { loOpen: true });
    const minSpan = 2 * shortestCadence(a);
    let longest = longestSpan === undefined ? DEFAULT_LONGEST_SPAN_S : checkSpan(scalarSI(longestSpan, 'time', fn, 'longestSpan'), shortestCadence(a), fn, 'longestSpan');
    if (lowestHz > 0) {
      const fits = 1 / lowestHz;
      if (fits < minSpan) {
        throw new BuiltinError(`${where(fn, 'signal')}: the spectrum starts at ${fmt(lowestHz * 1e9)} nHz, above the array's Nyquist frequency; no span fits both`);
      }
      if (longestSpan !== undefined && longest > fits * (1 + 1e-12)) {
        throw new BuiltinError(`${where(fn, 'longestSpan')} is ${fmt(longest / YEAR_S)} yr, but the spectrum starts at ${fmt(lowestHz * 1e9)} nHz, so spans beyond ${fmt(fits / YEAR_S)} yr need frequencies it does not have`);
      }
      longest = Math.min(longest, fits);
    }
    const model = source.modelFor(1 / longest, 1 / minSpan);
    const r = guarded(fn, 'signal', () => detectionSpan(a, model, thr, longest, minSpan, checkTimeNowIfHandingOff));
    if (!r.reached) {
      throw new BuiltinError(`${fn}: the expected S/N stays below the threshold ${thr} for spans up to ${fmt(longest / YEAR_S)} yr (it reaches ${fmt(r.snr)} there)`);
    }
    return quantity(r.spanS, 'yr');
  },
};

export const arrayViewBuiltins: Builtin[] = [
  hellingsDownsBuiltin,
  pulsarArrayBuiltin,
  pulsarArrayOnSkyBuiltin,
  arraySensitivityBuiltin,
  detectionSnrBuiltin,
  detectionSpanBuiltin,
];
