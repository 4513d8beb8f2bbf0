// Realisation built-ins: draws of a finite population in each frequency bin of an array and what
// they give per bin (bands of h_c, loudest binaries, continuous-source outlook, residence-time flags).
// Units and argument checks here; the physics is in src/physics, the summaries in src/statistics.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { math, quantity } from '../sheet/mathInstance';
import { checkTimeNowIfHandingOff, withoutHandOff } from '../sheet/evaluationBudget';
import type { SheetObject } from '../sheet/sheetObject';
import type { FlatLambdaCdm } from '../physics/cosmology';
import type { BinaryPopulation } from '../physics/populationTypes';
import { DEFAULT_SPARSE_THRESHOLD, realisationCells, type RealisationCells } from '../physics/realisationCells';
import { drawRealisations, type RealisationDraws } from '../physics/binaryRealisations';
import { summariseRealisations, type RealisationSummary } from '../statistics/realisationSummary';
import { objectOf, scalarSI, vectorSI, where } from './args';
import { cosmologyArg, countArg, guardedPhysics, populationArg, positiveSI } from './physicsArgs';
import { cosmologyAndEnvironment, RESIDENCE_ARG_HELP, type ResidenceModel } from './residenceArg';

const SVC = 'Sesana, Vecchio & Colacino 2008, MNRAS 390, 192';
const METHOD = `${SVC}; split into drawn and smooth cells after Becsy, Cornish & Kelley 2022 (ApJ, arXiv:2207.01607); variance Lamb & Taylor 2024 (ApJL, doi:10.3847/2041-8213/ad654a)`;

/** Most realisations one cell may hold, and most realisation-bins (memory: 6 numbers each). */
export const MAX_SHEET_REALISATIONS = 100_000;
export const MAX_REALISATION_BINS = 4_000_000;
/** On the app's page, runs of at most this many realisation-bins are made to the end, never handed off (a few tenths of a second at most). */
export const PAGE_REALISATION_BINS = 5_000;

/** What a run needs to be repeated elsewhere (the CLI, a worker): the inputs of realisationCells and the seed. */
export interface RealisationSetup {
  population: BinaryPopulation;
  cosmology: FlatLambdaCdm;
  freqsHz: Float64Array;
  spanS: number;
  threshold: number;
  dropLongResidence: boolean;
  /** The environment's residence factor (counts per cell times R); absent: GW-driven. Jobs and the CLI read it from here. */
  residence?: ResidenceModel;
}

/** The 'realisations' SheetObject: the cells, the draws and their summary per bin. */
export class RealisationsValue implements SheetObject {
  readonly kind = 'realisations';
  readonly summary: RealisationSummary;
  constructor(
    readonly setup: RealisationSetup,
    readonly cells: RealisationCells,
    readonly seed: number,
    readonly draws: RealisationDraws,
  ) {
    this.summary = summariseRealisations(draws, checkTimeNowIfHandingOff);
  }
  describe(): string {
    const n = this.cells.bins.length;
    const k = this.setup.threshold;
    return `${this.draws.count} realisations over ${n} bin${n === 1 ? '' : 's'}, seed ${this.seed}, drawn one by one: the ${k === Infinity ? 'all' : k} loudest expected per bin${this.setup.dropLongResidence ? ', long-residence cells dropped' : ''}${this.setup.residence ? `, residence times of ${this.setup.residence.label}` : ''}`;
  }
  /** Smooth h_c per bin: f T sum N h^2 over the cells (Phinney's h_c on the cells). */
  smoothHc(): Float64Array {
    return Float64Array.from(this.cells.bins, (b) => Math.sqrt(b.hc2PerH2 * b.meanH2));
  }
  /** Plain JSON, SI: per-bin series, a few single realisations, units. */
  toJSON(): Record<string, unknown> {
    const s = this.summary;
    const nb = this.cells.bins.length;
    const shown = Math.min(5, this.draws.count);
    const single = Array.from({ length: shown }, (_, r) => Array.from(this.draws.hc.subarray(r * nb, (r + 1) * nb)));
    return {
      frequencyHz: this.cells.bins.map((b) => b.frequencyHz),
      realisations: this.draws.count,
      seed: this.seed,
      threshold: this.setup.threshold === Infinity ? 'all' : this.setup.threshold,
      ...(this.setup.residence ? { environment: this.setup.residence.label } : {}),
      smoothHc: Array.from(this.smoothHc()),
      meanHc: Array.from(s.meanHc),
      medianHc: Array.from(s.medianHc),
      lower68: Array.from(s.lower68),
      upper68: Array.from(s.upper68),
      lower95: Array.from(s.lower95),
      upper95: Array.from(s.upper95),
      outshineProbability: Array.from(s.outshineProbability),
      medianLoudestStrain: Array.from(s.medianLoudestStrain),
      // The loudest binary's own characteristic strain, h sqrt(f T) (its share of h_c^2 = f T sum h^2).
      medianLoudestHc: this.cells.bins.map((b, k) => s.medianLoudestStrain[k] * Math.sqrt(b.hc2PerH2)),
      longResidenceCountFraction: this.cells.bins.map((b) => (b.expectedCount > 0 ? b.longResidenceCount / (b.expectedCount + (this.setup.dropLongResidence ? b.longResidenceCount : 0)) : 0)),
      longResidenceH2Fraction: this.cells.bins.map((b) => longResidenceH2Fraction(b, this.setup.dropLongResidence)),
      singleRealisations: single,
      units: { frequencyHz: 'Hz', smoothHc: '', meanHc: '', medianHc: '', lower68: '', upper68: '', lower95: '', upper95: '', medianLoudestStrain: '', medianLoudestHc: '' },
    };
  }
}

function longResidenceH2Fraction(b: RealisationCells['bins'][number], dropped: boolean): number {
  const all = b.meanH2 + (dropped ? b.longResidenceH2 : 0);
  return all > 0 ? b.longResidenceH2 / all : 0;
}

/** Runs a realisation set-up in this thread (the sheet's own cells; long runs go to the CLI or the app's worker). */
export function realiseInThread(setup: RealisationSetup, count: number, seed: number, fn: string): RealisationsValue {
  const cells = guardedPhysics(fn, () =>
    realisationCells(setup.population, setup.cosmology, setup.freqsHz, setup.spanS, { threshold: setup.threshold, dropLongResidence: setup.dropLongResidence, residence: setup.residence?.factor, checkTime: checkTimeNowIfHandingOff }),
  );
  return new RealisationsValue(setup, cells, seed, guardedPhysics(fn, () => drawRealisations(cells, seed, 0, count, checkTimeNowIfHandingOff)));
}

/** Population, cosmology, bin centres and span of realiseBackground. */
function binsArgs(population: unknown, freqs: unknown, span: unknown, extra1: unknown, extra2: unknown, fn: string): Pick<RealisationSetup, 'population' | 'cosmology' | 'freqsHz' | 'spanS' | 'residence'> {
  const p = populationArg(population, fn);
  const { cosmology, residence } = cosmologyAndEnvironment(extra1, extra2, fn);
  const cosmo = cosmology !== undefined ? cosmologyArg(cosmology, fn).model : p.cosmology;
  if (!cosmo) throw new BuiltinError(`${where(fn, 'cosmology')} is needed: the population was built without one`);
  const f = vectorSI(freqs, 'frequency', fn, 'freqs');
  if (f.length === 0 || f.length > 2000) throw new BuiltinError(`${where(fn, 'freqs')} must hold 1 to 2000 frequencies, got ${f.length}`);
  f.forEach((x, i) => {
    if (!(x > 0)) throw new BuiltinError(`${where(fn, `freqs[${i + 1}]`)} must be a positive frequency, got ${x} Hz`);
  });
  return { population: p.population, cosmology: cosmo, freqsHz: Float64Array.from(f), spanS: positiveSI(span, 'time', fn, 'span'), ...(residence ? { residence } : {}) };
}

function seedArg(v: unknown, fn: string): number {
  const s = scalarSI(v, 'dimensionless', fn, 'seed');
  if (!Number.isSafeInteger(s) || s < 0) throw new BuiltinError(`${where(fn, 'seed')} must be a whole number >= 0, got ${s}`);
  return s;
}

function thresholdArg(v: unknown, fn: string): number {
  if (v === undefined) return DEFAULT_SPARSE_THRESHOLD;
  const k = scalarSI(v, 'dimensionless', fn, 'threshold');
  if (!(k >= 0)) throw new BuiltinError(`${where(fn, 'threshold')} must be an expected count >= 0 (Infinity draws every binary), got ${k}`);
  return k;
}

function flagArg(v: unknown, fn: string, arg: string): boolean {
  if (v === undefined) return false;
  if (typeof v === 'boolean') return v;
  if (v === 0 || v === 1) return v === 1;
  throw new BuiltinError(`${where(fn, arg)} must be true or false, got ${typeof v === 'number' ? v : typeof v}`);
}

function realisationsArg(v: unknown, fn: string): RealisationsValue {
  return objectOf<RealisationsValue>(v, 'realisations', fn, 'realisations');
}

function indexArg(v: unknown, r: RealisationsValue, fn: string): number {
  return countArg(v, fn, 'index', r.draws.count) - 1;
}

const list = (xs: ArrayLike<number>) => math.matrix(Array.from(xs));

const REALISATIONS_ARG = { name: 'realisations', unit: 'realisations', description: 'from realiseBackground' };

export const realisationBuiltins: Builtin[] = [
  {
    name: 'realiseBackground',
    category: 'spectrum',
    summary: 'Draws R realisations of a finite population of circular binaries (GW-driven, or with an environment\'s residence times) in each frequency bin of width 1/T: h_c per bin and the loudest binary of each bin.',
    args: [
      { name: 'population', unit: 'population', description: 'from mergerPopulation or customPopulation' },
      { name: 'freqs', unit: 'nHz', description: 'observed GW frequencies, the bin centres (e.g. from frequencyGrid)' },
      { name: 'span', unit: 'yr', description: 'observing span T > 0; each bin is 1/T wide' },
      { name: 'count', unit: 'dimensionless', description: `realisations R, 1 to ${MAX_SHEET_REALISATIONS} (at most ${MAX_REALISATION_BINS} realisation-bins)` },
      { name: 'seed', unit: 'dimensionless', description: 'whole number >= 0; the same seed gives the same realisations' },
      {
        name: 'threshold',
        unit: 'dimensionless',
        description: `K: per bin, the cells louder than the strain above which K binaries are expected are drawn binary by binary, the rest is smooth plus a Gaussian (default ${DEFAULT_SPARSE_THRESHOLD}; Infinity draws all)`,
        optional: true,
      },
      { name: 'dropLongResidence', unit: 'dimensionless', description: 'true to leave out cells whose residence time exceeds the age of the Universe at their redshift (default false)', optional: true },
      { name: 'cosmology', unit: 'cosmology', description: "for volumes and distances (default the population's own); may be swapped with environment", optional: true },
      { name: 'environment', unit: 'hardening or emission', description: `${RESIDENCE_ARG_HELP} (default: GW-driven)`, optional: true },
    ],
    returns: { unit: 'realisations', description: 'per bin: mean, median, 68% and 95% bands of h_c, loudest binaries, outshine probability, residence-time flags' },
    source: METHOD,
    example: 'realiseBackground(pop, freqs, 14 yr, 200, 1)',
    fn: (population: unknown, freqs: unknown, span: unknown, count: unknown, seed: unknown, threshold?: unknown, dropLong?: unknown, cosmology?: unknown, environment?: unknown) => {
      const fn = 'realiseBackground';
      const b = binsArgs(population, freqs, span, cosmology, environment, fn);
      const R = countArg(count, fn, 'count', MAX_SHEET_REALISATIONS);
      if (R * b.freqsHz.length > MAX_REALISATION_BINS) throw new BuiltinError(`${where(fn, 'count')}: ${R} realisations of ${b.freqsHz.length} bins exceed ${MAX_REALISATION_BINS} realisation-bins; use fewer, or run them with strainsheet realise`);
      const setup: RealisationSetup = { ...b, threshold: thresholdArg(threshold, fn), dropLongResidence: flagArg(dropLong, fn, 'dropLongResidence') };
      // On the page, a small run is made there to the end: the realisation plot reads its draws and
      // summary, which a value held off the page (its JSON) does not carry. A larger one checks the
      // clock and is handed off (its bands are still drawn on the spectrum plot, from its JSON).
      const run = () => realiseInThread(setup, R, seedArg(seed, fn), fn);
      return R * b.freqsHz.length <= PAGE_REALISATION_BINS ? withoutHandOff(run) : run();
    },
  },
  {
    name: 'realisedQuantile',
    category: 'spectrum',
    summary: 'The p-quantile of h_c over the realisations, per bin (p = 0.5: the median).',
    args: [REALISATIONS_ARG, { name: 'p', unit: 'dimensionless', description: 'probability in [0, 1]' }],
    returns: { unit: 'dimensionless', description: 'a list, one h_c per bin (Hyndman & Fan 1996 definition 7 quantile)' },
    source: 'Hyndman & Fan 1996, Am. Stat. 50, 361',
    example: 'realisedQuantile(realisations, 0.16)',
    fn: (rv: unknown, pv: unknown) => {
      const fn = 'realisedQuantile';
      const r = realisationsArg(rv, fn);
      const p = scalarSI(pv, 'dimensionless', fn, 'p');
      if (!(p >= 0 && p <= 1)) throw new BuiltinError(`${where(fn, 'p')} must be a probability in [0, 1], got ${p}`);
      const nb = r.cells.bins.length;
      const R = r.draws.count;
      const col = new Float64Array(R);
      const out = new Float64Array(nb);
      for (let k = 0; k < nb; k++) {
        checkTimeNowIfHandingOff();
        for (let i = 0; i < R; i++) col[i] = r.draws.hc[i * nb + k];
        col.sort();
        const h = (R - 1) * p;
        const lo = Math.floor(h);
        const hi = Math.min(R - 1, lo + 1);
        out[k] = col[lo] + (h - lo) * (col[hi] - col[lo]);
      }
      return list(out);
    },
  },
  {
    name: 'realisedMean',
    category: 'spectrum',
    summary: 'Square root of the mean h_c^2 over the realisations, per bin (tends to the smooth h_c as R grows).',
    args: [REALISATIONS_ARG],
    returns: { unit: 'dimensionless', description: 'a list, one h_c per bin' },
    source: SVC,
    example: 'realisedMean(realisations)',
    fn: (rv: unknown) => list(realisationsArg(rv, 'realisedMean').summary.rmsHc),
  },
  {
    name: 'realisationStrain',
    category: 'spectrum',
    summary: 'h_c per bin of one realisation.',
    args: [REALISATIONS_ARG, { name: 'index', unit: 'dimensionless', description: 'realisation number, 1 to R' }],
    returns: { unit: 'dimensionless', description: 'a list, one h_c per bin' },
    source: SVC,
    example: 'realisationStrain(realisations, 1)',
    fn: (rv: unknown, iv: unknown) => {
      const fn = 'realisationStrain';
      const r = realisationsArg(rv, fn);
      const i = indexArg(iv, r, fn);
      const nb = r.cells.bins.length;
      return list(r.draws.hc.subarray(i * nb, (i + 1) * nb));
    },
  },
  {
    name: 'loudestBinaries',
    category: 'spectrum',
    summary: 'The loudest binary of each bin in one realisation: one row per bin with its strain, chirp mass, redshift and mass ratio (zeros for an empty bin).',
    args: [REALISATIONS_ARG, { name: 'index', unit: 'dimensionless', description: 'realisation number, 1 to R' }],
    returns: { unit: 'dimensionless, Msun, dimensionless, dimensionless', description: 'a matrix with one row [h, M_c, z, q] per bin' },
    source: SVC,
    example: 'loudestBinaries(realisations, 1)',
    fn: (rv: unknown, iv: unknown) => {
      const fn = 'loudestBinaries';
      const r = realisationsArg(rv, fn);
      const i = indexArg(iv, r, fn);
      const nb = r.cells.bins.length;
      const d = r.draws;
      const rows = Array.from({ length: nb }, (_, k) => {
        const at = i * nb + k;
        return [d.loudestStrain[at], quantity(d.loudestChirpMassKg[at], 'Msun'), d.loudestRedshift[at], d.loudestMassRatio[at]];
      });
      return math.matrix(rows as never);
    },
  },
  {
    name: 'outshineProbability',
    category: 'spectrum',
    summary: 'Per bin, the fraction of realisations in which the loudest binary has h^2 above the sum of h^2 of all the other binaries of its bin (a continuous-source outlook).',
    args: [REALISATIONS_ARG],
    returns: { unit: 'dimensionless', description: 'a list of probabilities, one per bin' },
    source: `criterion h_loudest^2 > sum of the rest of the bin; loudest sources per bin as in Rosado, Sesana & Gair 2015, MNRAS 451, 2417 (their detection probability adds array noise, not modelled here)`,
    example: 'outshineProbability(realisations)',
    fn: (rv: unknown) => list(realisationsArg(rv, 'outshineProbability').summary.outshineProbability),
  },
  {
    name: 'longResidenceFraction',
    category: 'spectrum',
    summary: "Per bin, the fraction of the expected h_c^2 carried by cells whose residence time dt/dln f exceeds the age of the Universe at their redshift (the steady-state count is then not reachable).",
    args: [REALISATIONS_ARG],
    returns: { unit: 'dimensionless', description: 'a list of fractions in [0, 1], one per bin (those cells are left out when realiseBackground was asked to drop them; the fraction is then of the total before dropping)' },
    source: 'residence time Peters 1964, Phys. Rev. 136, B1224; age Hogg 1999, astro-ph/9905116',
    example: 'longResidenceFraction(realisations)',
    fn: (rv: unknown) => {
      const r = realisationsArg(rv, 'longResidenceFraction');
      return list(r.cells.bins.map((b) => longResidenceH2Fraction(b, r.setup.dropLongResidence)));
    },
  },
];
