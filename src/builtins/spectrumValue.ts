// The 'spectrum' SheetObject: h_c on a frequency grid (the Spectrum contract), with the population and
// options it came from (so strainAt and amplitudeAtYear compute exactly, not by interpolation), and
// extra series for plots: Omega_gw (when a cosmology is known) and the timing-residual PSD.
// Also the 'emission' SheetObject that other built-ins (eccentric orbits, environment) return and
// strainSpectrum takes: an EmissionKernel with the cut factor of its mass integral.
import type { BackgroundOptions } from '../physics/backgroundIntegral';
import type { BinaryPopulation, EmissionKernel } from '../physics/populationTypes';
import type { Spectrum } from '../physics/spectrum';
import { isSheetObject, type SheetObject } from '../sheet/sheetObject';

export interface SpectrumSeries {
  /** Unit of the values (SI), '' for dimensionless. */
  unit: string;
  description: string;
  values: Float64Array;
}

export class SpectrumValue implements SheetObject {
  readonly kind = 'spectrum';
  constructor(
    readonly spectrum: Spectrum,
    /** Extra series on the same grid, by name (e.g. omegaGw, residualPsd). */
    readonly series: Readonly<Record<string, SpectrumSeries>> = {},
    /** Where it came from, when computed from a population. */
    readonly origin?: { population: BinaryPopulation; options: BackgroundOptions; hubbleSI?: number; emission?: string },
  ) {}
  get frequencyHz(): Float64Array {
    return this.spectrum.frequencyHz;
  }
  get hc(): Float64Array {
    return this.spectrum.hc;
  }
  describe(): string {
    const f = this.spectrum.frequencyHz;
    const n = f.length;
    if (n === 0) return 'spectrum, no frequencies';
    const nHz = (x: number) => `${(x * 1e9).toPrecision(2)} nHz`;
    return `spectrum, ${n} frequenc${n === 1 ? 'y' : 'ies'}, ${nHz(f[0])} to ${nHz(f[n - 1])}${this.origin?.emission ? `, ${this.origin.emission}` : ''}`;
  }
  /** Plain JSON, SI: { frequencyHz, hc, <series name>: values..., units: { name: unit } }. */
  toJSON(): Record<string, unknown> {
    const out: Record<string, unknown> = { frequencyHz: Array.from(this.spectrum.frequencyHz), hc: Array.from(this.spectrum.hc) };
    const units: Record<string, string> = { frequencyHz: 'Hz', hc: '' };
    for (const [name, s] of Object.entries(this.series)) {
      out[name] = Array.from(s.values);
      units[name] = s.unit;
    }
    out.units = units;
    return out;
  }
}

/** An emission model for strainSpectrum: dE/dln f_r of one binary and where its mass integral stops. */
export interface EmissionValue extends SheetObject {
  readonly kind: 'emission';
  readonly kernel: EmissionKernel;
  /** Mass integral stops where f_r = cutFactor x f_ISCO,gw(M); Infinity when the kernel ends the inspiral itself. Default 1. */
  readonly cutFactor?: number;
}

export function isEmissionValue(v: unknown): v is EmissionValue {
  return isSheetObject(v) && v.kind === 'emission' && typeof (v as EmissionValue).kernel === 'function';
}
