// Sheet built-ins for inference: truncated priors and the log-likelihood of a measured amplitude
// as a cell (the likelihood `infer` samples is any cell holding a log-likelihood number).
import type { Unit } from 'mathjs';
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { isUnit } from '../sheet/mathInstance';
import { kindOf, objectOf, scalarSI, where } from './args';
import { DistributionError, truncatedDistribution } from '../statistics/distributions';
import { amplitudeLogLikelihood } from '../statistics/amplitudeLikelihood';
import { DistributionObject, type MeasurementObject } from './statisticsObjects';

/** A bound in the distribution's own unit, in SI; +-Infinity allowed as a plain number. */
function boundSI(v: unknown, template: Unit | null, fn: string, arg: string): number {
  if (typeof v === 'number' && (v === Infinity || v === -Infinity)) return v;
  if (template && !template.dimensions.every((d: number) => d === 0)) {
    if (!isUnit(v) || !(v as Unit).equalBase(template)) {
      throw new BuiltinError(`${where(fn, arg)} must be in the unit of the distribution (${template.formatUnits()}), got ${kindOf(v)}`, 'unit');
    }
    const x = (v as Unit & { value: number | null }).value;
    if (x === null || Number.isNaN(x)) throw new BuiltinError(`${where(fn, arg)} must be a quantity with a value`);
    return x;
  }
  return scalarSI(v, 'dimensionless', fn, arg);
}

export const inferenceBuiltins: Builtin[] = [
  {
    name: 'truncatedDist',
    category: 'statistics',
    summary: 'A distribution restricted to [lo, hi] and renormalised (a truncated prior)',
    args: [
      { name: 'distribution', unit: 'distribution', description: 'from normalDist, lognormalDist, uniformDist or logUniformDist' },
      { name: 'lo', unit: 'same as the distribution', description: 'lower bound (-Infinity for none)' },
      { name: 'hi', unit: 'same as the distribution', description: 'upper bound (Infinity for none)' },
    ],
    returns: { unit: 'distribution', description: 'density f(x)/(F(hi) - F(lo)) on [lo, hi]' },
    source: 'common practice, no source',
    example: 'truncatedDist(normalDist(0.7, 0.3), 0, 2)',
    fn: (dist: unknown, lo: unknown, hi: unknown) => {
      const fn = 'truncatedDist';
      const d = objectOf<DistributionObject>(dist, 'distribution', fn, 'distribution');
      const a = boundSI(lo, d.unitTemplate, fn, 'lo');
      const b = boundSI(hi, d.unitTemplate, fn, 'hi');
      try {
        return new DistributionObject(truncatedDistribution(d.distribution, a, b), d.unitTemplate);
      } catch (e) {
        if (e instanceof DistributionError) throw new BuiltinError(`${where(fn, e.argument)}: ${e.message}`);
        throw e;
      }
    },
  },
  {
    name: 'amplitudeLogLikelihood',
    category: 'statistics',
    summary: 'Log-likelihood of a predicted amplitude under a measured amplitude (a likelihood cell for infer)',
    args: [
      { name: 'predicted', unit: 'dimensionless', description: 'predicted amplitude at the measurement\'s reference frequency (A_yr)' },
      { name: 'measured', unit: 'measurement', description: 'from measuredAmplitude and friends' },
    ],
    returns: { unit: 'dimensionless', description: 'ln of the measurement\'s density in log10 A at the prediction (-Infinity at A = 0)' },
    source: 'the measurement read as a likelihood flat in log10 A (common practice, no source)',
    example: 'amplitudeLogLikelihood(A_yr, measured)',
    fn: (p: unknown, m: unknown) => {
      const fn = 'amplitudeLogLikelihood';
      const a = scalarSI(p, 'dimensionless', fn, 'predicted');
      if (a < 0) throw new BuiltinError(`${where(fn, 'predicted')} must be an amplitude >= 0, got ${a}`);
      return amplitudeLogLikelihood(objectOf<MeasurementObject>(m, 'measurement', fn, 'measured').measurement, a);
    },
  },
];
