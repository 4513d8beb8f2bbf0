// The 'population' SheetObject: a BinaryPopulation (density in Mpc^-3 per unit z, per dex of total
// mass, per unit q) with the cosmology it was built with, if any, and what it is.
import type { BinaryPopulation } from '../physics/populationTypes';
import type { FlatLambdaCdm } from '../physics/cosmology';
import type { SheetObject } from '../sheet/sheetObject';
import { timedPopulation } from './timedPopulation';

export class PopulationValue implements SheetObject {
  readonly kind = 'population';
  /** The population, its density timed where slow cells are handed off (timedPopulation.ts). */
  readonly population: BinaryPopulation;
  constructor(
    population: BinaryPopulation,
    /** What the population is, e.g. 'phenomenological merger density'. */
    readonly label: string,
    /** The parameters as given (SI-free numbers with their units in the names), for JSON. */
    readonly parameters: Record<string, number | string>,
    readonly cosmology?: FlatLambdaCdm,
  ) {
    this.population = timedPopulation(population);
  }
  describe(): string {
    const p = this.population;
    return `${this.label}, z 0 to ${fmt(p.zMax)}, M 10^${fmt(p.log10MMin)} to 10^${fmt(p.log10MMax)} Msun, q ${fmt(p.qMin)} to ${fmt(p.qMax)}`;
  }
  toJSON(): unknown {
    const p = this.population;
    return {
      kind: this.kind,
      label: this.label,
      parameters: this.parameters,
      limits: { zMin: p.zMin, zMax: p.zMax, log10MMinMsun: p.log10MMin, log10MMaxMsun: p.log10MMax, qMin: p.qMin, qMax: p.qMax },
    };
  }
}

/** Distribution of a shape parameter set as a SheetObject: 'redshiftShape' and 'massRatio'. */
export class ShapeValue<T> implements SheetObject {
  constructor(
    readonly kind: 'redshiftShape' | 'massRatio',
    readonly shape: T,
    readonly text: string,
    readonly parameters: Record<string, number | string>,
  ) {}
  describe(): string {
    return this.text;
  }
  toJSON(): unknown {
    return { kind: this.kind, description: this.text, parameters: this.parameters };
  }
}

function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toPrecision(3);
}
