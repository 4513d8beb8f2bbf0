// SheetObjects of the statistics built-ins: a measured amplitude, a distribution of an uncertain
// input (with the unit its parameters carried), per-bin values, a comparison and an allowed rate.
import type { Unit } from 'mathjs';
import type { SheetObject } from '../sheet/sheetObject';
import { F_YR_HZ } from '../physics/constants';
import type { AmplitudeMeasurement } from '../statistics/measurement';
import type { UncertainDistribution } from '../statistics/distributions';
import type { BinnedSpectrum } from '../statistics/binnedSpectrum';
import type { AmplitudeComparison } from '../statistics/comparison';
import type { RandomSource } from '../statistics/prng';
import { threeSignificant as g } from './threeSignificant';

function withValue(template: Unit | null, xSI: number): unknown {
  if (!template) return xSI;
  const q = template.clone() as Unit & { value: number };
  q.value = xSI;
  return q;
}

export class MeasurementObject implements SheetObject {
  readonly kind = 'measurement';
  constructor(readonly measurement: AmplitudeMeasurement) {}
  /** Median amplitude at the reference frequency. */
  get median(): number {
    return Math.pow(10, this.measurement.log10Median);
  }
  describe(): string {
    const m = this.measurement;
    const at = m.fRefHz === F_YR_HZ ? '1/yr' : `${g(m.fRefHz * 1e9)} nHz`;
    const gam = Math.abs(m.gamma - 13 / 3) < 1e-12 ? '13/3' : g(m.gamma);
    if (m.stated) {
      return `measured A = ${g(this.median)} (${g(m.stated.lower)} to ${g(m.stated.upper)}, ${g(100 * m.stated.level)}%) at ${at}, gamma ${gam}`;
    }
    return `measured log10 A = ${g(m.log10Median)} +- ${g(m.sigmaLowDex)} at ${at}, gamma ${gam}`;
  }
  toJSON(): unknown {
    const m = this.measurement;
    return { median: this.median, log10Median: m.log10Median, sigmaLowDex: m.sigmaLowDex, sigmaHighDex: m.sigmaHighDex, stated: m.stated, gamma: m.gamma, fRefHz: m.fRefHz };
  }
}

/** A distribution over an input cell's value. Samples carry the unit of the parameters. */
export class DistributionObject implements SheetObject {
  readonly kind = 'distribution';
  constructor(
    readonly distribution: UncertainDistribution,
    /** A Unit whose dimensions the samples take (null: plain numbers). */
    readonly unitTemplate: Unit | null,
  ) {}
  /** A value of the right kind (number or Unit) holding x in SI. */
  valueOf(xSI: number): unknown {
    if (!this.unitTemplate) return xSI;
    const q = this.unitTemplate.clone() as Unit & { value: number };
    q.value = xSI;
    return q;
  }
  sample(rng: RandomSource): unknown {
    return this.valueOf(this.distribution.sample(rng));
  }
  describe(): string {
    const d = this.distribution;
    const u = this.unitTemplate ? ` ${this.unitTemplate.formatUnits()}` : '';
    const show = (x: number) => (this.unitTemplate ? g((this.valueOf(x) as Unit).toNumber(this.unitTemplate.formatUnits())) : g(x));
    const t = d.truncation;
    const cut = t ? `, truncated to ${Number.isFinite(t.lo) ? show(t.lo) : '-inf'} to ${Number.isFinite(t.hi) ? show(t.hi) : 'inf'}${u}` : '';
    return this.describeFamily(show, u) + cut;
  }
  private describeFamily(show: (x: number) => string, u: string): string {
    const d = this.distribution;
    switch (d.family) {
      case 'normal':
        return `normal, mean ${show(d.params.mean)}${u}, sd ${show(d.params.sd)}${u}`;
      case 'lognormal':
        return `log-normal, median ${show(d.params.median)}${u}, ${g(d.params.sigmaDex)} dex`;
      case 'uniform':
        return `uniform, ${show(d.params.lo)} to ${show(d.params.hi)}${u}`;
      default:
        return `log-uniform, ${show(d.params.lo)} to ${show(d.params.hi)}${u}`;
    }
  }
  toJSON(): unknown {
    const t = this.distribution.truncation;
    return { family: this.distribution.family, params: this.distribution.params, ...(t ? { truncation: { lo: t.lo, hi: t.hi } } : {}), unitSI: this.unitTemplate ? siUnitOf(this.unitTemplate) : '' };
  }
}

function siUnitOf(u: Unit): string {
  const base = ['kg', 'm', 's', 'A', 'K', 'cd', 'mol', 'rad', 'bit'];
  const dims = (u as Unit & { dimensions: number[] }).dimensions;
  return dims
    .map((p, i) => (p ? (p === 1 ? base[i] : `${base[i]}^${p}`) : ''))
    .filter(Boolean)
    .join(' ');
}

export class BinnedSpectrumObject implements SheetObject {
  readonly kind = 'binnedSpectrum';
  constructor(readonly bins: BinnedSpectrum) {}
  describe(): string {
    const b = this.bins;
    const n = b.frequencyHz.length;
    const what = b.quantity === 'hc' ? 'h_c' : b.quantity === 'omegaGw' ? 'Omega_gw' : 'residual power';
    return `${what} in ${n} bin${n === 1 ? '' : 's'}, ${g(b.frequencyHz[0] * 1e9)} to ${g(b.frequencyHz[n - 1] * 1e9)} nHz, ${g(100 * b.level)}% intervals`;
  }
  toJSON(): unknown {
    const b = this.bins;
    return { quantity: b.quantity, level: b.level, frequencyHz: Array.from(b.frequencyHz), value: Array.from(b.value), lower: Array.from(b.lower), upper: Array.from(b.upper) };
  }
}

export interface SlopeCheck {
  modelGamma: number;
  assumedGamma: number;
  bins: number;
  limit: number;
  warn: boolean;
}

export class ComparisonObject implements SheetObject {
  readonly kind = 'comparison';
  constructor(
    readonly comparison: AmplitudeComparison,
    /** The model's slope over the lowest bins against the measurement's assumed gamma, when a spectrum was given. */
    readonly slopeCheck: SlopeCheck | null = null,
  ) {}
  describe(): string {
    const c = this.comparison;
    const t = c.tensionSigma;
    const base = `predicted/measured = ${g(c.ratio)}, ${g(Math.abs(t))} sigma ${t >= 0 ? 'high' : 'low'}, ${c.inside ? 'inside' : 'outside'} the ${g(100 * c.level)}% interval`;
    const s = this.slopeCheck;
    if (!s || !s.warn) return base;
    return `${base}; warning: the model's slope over its lowest ${s.bins} frequencies is gamma = ${g(s.modelGamma)}, not the ${g(s.assumedGamma)} the measurement assumed (differs by more than ${s.limit}): compare across the band instead`;
  }
  toJSON(): unknown {
    return { ...this.comparison, slopeCheck: this.slopeCheck };
  }
}

/** The merger-rate normalisation a measurement allows, given A^2 proportional to it. */
export class AllowedRateObject implements SheetObject {
  readonly kind = 'allowedRate';
  constructor(
    /** Rates in SI: median and interval ends, at `level`. */
    readonly median: number,
    readonly lower: number,
    readonly upper: number,
    readonly level: number,
    readonly unitTemplate: Unit | null,
    readonly displayUnit: string,
  ) {}
  /** The implied value of a quantity proportional to the rate (e.g. the local merger-rate density), SI. */
  density?: { median: number; lower: number; upper: number; unitTemplate: Unit | null };
  valueOf(xSI: number): unknown {
    return withValue(this.unitTemplate, xSI);
  }
  densityValueOf(xSI: number): unknown {
    return withValue(this.density?.unitTemplate ?? null, xSI);
  }
  describe(): string {
    const show = (x: number) => (this.unitTemplate ? g((this.valueOf(x) as Unit).toNumber(this.displayUnit)) : g(x));
    const u = this.unitTemplate ? ` ${this.displayUnit}` : '';
    let text = `allowed rate ${show(this.median)}${u} (${show(this.lower)} to ${show(this.upper)}, ${g(100 * this.level)}%)`;
    if (this.density) {
      const t = this.density.unitTemplate;
      const du = t ? t.formatUnits() : '';
      const sd = (x: number) => (t ? g((withValue(t, x) as Unit).toNumber(du)) : g(x));
      text += `; density ${sd(this.density.median)}${du ? ` ${du}` : ''} (${sd(this.density.lower)} to ${sd(this.density.upper)})`;
    }
    return text;
  }
  toJSON(): unknown {
    const d = this.density;
    return {
      median: this.median,
      lower: this.lower,
      upper: this.upper,
      level: this.level,
      unitSI: this.unitTemplate ? siUnitOf(this.unitTemplate) : '',
      ...(d ? { density: { median: d.median, lower: d.lower, upper: d.upper, unitSI: d.unitTemplate ? siUnitOf(d.unitTemplate) : '' } } : {}),
    };
  }
}
