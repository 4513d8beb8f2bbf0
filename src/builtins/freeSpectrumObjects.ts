// SheetObjects of the free-spectrum built-ins: a measured free spectrum (with its likelihood, built
// once and kept), a measured (A, gamma) posterior, a model's effective power law, and the band
// comparison (the headline verdict).
import type { SheetObject } from '../sheet/sheetObject';
import { checkTimeNowIfHandingOff } from '../sheet/evaluationBudget';
import type { FreeSpectrumData } from '../statistics/freeSpectrum';
import { buildFreeSpectrumLikelihood, type FreeSpectrumLikelihood } from '../statistics/freeSpectrumLikelihood';
import { buildAmplitudeGammaRegion, type AmplitudeGammaPosterior, type AmplitudeGammaRegion } from '../statistics/amplitudeGammaPosterior';
import type { EffectivePowerLaw } from '../statistics/effectivePowerLaw';
import type { BandComparison } from '../statistics/bandComparison';
import { tableCdf } from '../statistics/gaussianKde1d';
import { threeSignificant as g } from './threeSignificant';

const nHz = (f: number) => `${g(f * 1e9)} nHz`;

export class FreeSpectrumObject implements SheetObject {
  readonly kind = 'freeSpectrum';
  private likelihoods = new Map<number, FreeSpectrumLikelihood>();
  constructor(
    readonly data: FreeSpectrumData,
    /** Thinning factor applied when the data were stored (1: none). */
    readonly thin: number,
  ) {}
  /** The likelihood over the lowest `bins` bins (all by default), built on first use and kept. */
  likelihood(bins = this.data.frequencyHz.length): FreeSpectrumLikelihood {
    let l = this.likelihoods.get(bins);
    if (!l) {
      l = buildFreeSpectrumLikelihood(this.data, { bins, checkTime: checkTimeNowIfHandingOff });
      this.likelihoods.set(bins, l);
    }
    return l;
  }
  describe(): string {
    const d = this.data;
    const n = d.frequencyHz.length;
    const counts = d.samples.map((s) => s.length);
    const per = Math.min(...counts) === Math.max(...counts) ? `${counts[0]}` : `${Math.min(...counts)} to ${Math.max(...counts)}`;
    const q = d.quantity === 'log10Rho' ? 'log10 rho' : 'log10 h_c';
    const prior = d.prior.kind === 'uniform' ? `, prior uniform in ${q} ${g(d.prior.lower)} to ${g(d.prior.upper)}` : ', no prior divided';
    return `free spectrum, ${n} bins, ${nHz(d.frequencyHz[0])} to ${nHz(d.frequencyHz[n - 1])}, ${per} samples of ${q} per bin${this.thin > 1 ? ` (thinned ${this.thin}x)` : ''}${prior}`;
  }
  /** Per-bin summaries (5%, 50%, 95% from the KDE), not every sample. */
  toJSON(): unknown {
    const like = this.likelihood();
    const quant = (k: number, p: number) => {
      const t = like.tables[k];
      let lo = t.x0;
      let hi = t.x0 + (t.size - 1) * t.dx;
      for (let i = 0; i < 60; i++) {
        const mid = 0.5 * (lo + hi);
        if (tableCdf(t, mid) < p * t.cdf[t.size - 1]) lo = mid;
        else hi = mid;
      }
      return 0.5 * (lo + hi);
    };
    const d = this.data;
    return {
      quantity: d.quantity,
      spanS: d.spanS,
      prior: d.prior,
      thin: this.thin,
      frequencyHz: Array.from(d.frequencyHz),
      samplesPerBin: d.samples.map((s) => s.length),
      p05: d.samples.map((_, k) => quant(k, 0.05)),
      median: d.samples.map((_, k) => quant(k, 0.5)),
      p95: d.samples.map((_, k) => quant(k, 0.95)),
    };
  }
}

export class AmplitudeGammaObject implements SheetObject {
  readonly kind = 'amplitudeGamma';
  private built: AmplitudeGammaRegion | null = null;
  constructor(
    readonly posterior: AmplitudeGammaPosterior,
    readonly thin = 1,
  ) {}
  get region(): AmplitudeGammaRegion {
    return (this.built ??= buildAmplitudeGammaRegion(this.posterior, checkTimeNowIfHandingOff));
  }
  describe(): string {
    const p = this.posterior;
    const at = Math.abs(p.fRefHz * 365.25 * 86400 - 1) < 1e-12 ? '1/yr' : nHz(p.fRefHz);
    if (p.kind === 'gaussian') {
      return `(A, gamma) Gaussian: log10 A = ${g(p.log10AMean)} +- ${g(p.log10ASigma)}, gamma = ${g(p.gammaMean)} +- ${g(p.gammaSigma)}, correlation ${g(p.correlation)}, at ${at}`;
    }
    const n = p.log10A.length;
    const med = (x: Float64Array) => Float64Array.from(x).sort()[Math.floor(n / 2)];
    return `(A, gamma) posterior, ${n} samples${this.thin > 1 ? ` (thinned ${this.thin}x)` : ''}, median log10 A = ${g(med(p.log10A))}, gamma = ${g(med(p.gamma))}, at ${at}`;
  }
  toJSON(): unknown {
    const p = this.posterior;
    if (p.kind === 'gaussian') return { ...p };
    return { kind: p.kind, fRefHz: p.fRefHz, samples: p.log10A.length, thin: this.thin };
  }
}

export class EffectivePowerLawObject implements SheetObject {
  readonly kind = 'effectivePowerLaw';
  constructor(
    readonly fit: EffectivePowerLaw,
    readonly level: number | null,
  ) {}
  describe(): string {
    const f = this.fit;
    const sA = Math.sqrt(f.covariance[0]);
    const sG = Math.sqrt(f.covariance[2]);
    return `A = ${g(Math.pow(10, f.log10A))} (log10 +- ${g(sA)}), gamma = ${g(f.gamma)} +- ${g(sG)} over the lowest ${f.bins} bins${this.level !== null ? `; on the ${g(100 * this.level)}% contour of the measured (A, gamma)` : ''}`;
  }
  toJSON(): unknown {
    return { ...this.fit, A: Math.pow(10, this.fit.log10A), credibleLevel: this.level };
  }
}

export class BandComparisonObject implements SheetObject {
  readonly kind = 'bandComparison';
  constructor(readonly comparison: BandComparison) {}
  describe(): string {
    const c = this.comparison;
    const head = c.verdict === 'consistent' ? 'consistent across the band' : c.verdict === 'tension' ? 'in tension' : 'inconsistent';
    const detail = c.reasons.length ? `: ${c.reasons.join('; ')}` : `: every bin within 2 sigma${c.regionLevel !== null ? `, (A, gamma) on the ${g(100 * c.regionLevel)}% contour` : ''}`;
    return `${head}${detail} (ln L = ${c.logLikelihood.toFixed(1)} over ${c.frequencyHz.length} bins)`;
  }
  toJSON(): unknown {
    const c = this.comparison;
    return {
      verdict: c.verdict,
      logLikelihood: c.logLikelihood,
      frequencyHz: Array.from(c.frequencyHz),
      binLogLikelihood: Array.from(c.binLogLikelihood),
      binZ: Array.from(c.binZ),
      percentile: Array.from(c.percentile),
      binRatio: Array.from(c.binRatio),
      disagreeingBins: c.disagreeingBins,
      fit: c.fit,
      regionLevel: c.regionLevel,
      reasons: c.reasons,
    };
  }
}
