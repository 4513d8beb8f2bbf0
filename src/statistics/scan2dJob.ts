// A two-input map as a chunked job (src/jobs/chunkedJob.ts): the evaluations (the whole grid, or one
// line when the output goes as the square root of one axis input) split into chunks of SCAN_CHUNK.
// The likelihood map and its highest-posterior-density regions are computed in combine().
import type { Sheet } from '../sheet/sheet';
import { F_YR_HZ } from '../physics/constants';
import { atReferenceFrequency, relativeLikelihood, type AmplitudeMeasurement } from './measurement';
import { axisPriorWeights, hpdThresholds } from './credibleRegion';
import { checkSqrtProportional } from './proportionality';
import { chunkRange, type ChunkedJob, type ChunkPlan } from '../jobs/chunkedJob';
import { SCAN_CHUNK } from './scan1dJob';
import {
  DEFAULT_CREDIBLE_LEVELS,
  MAX_GRID_POINTS,
  axisResult,
  measuredBand,
  outputUnit,
  requireNumericOutput,
  type AxisResult,
  type Scan2DResult,
  type ScanAxis,
} from './sheetScan';
import { SheetJobError, nominalInput, numericOrNaN, valueLike } from './sheetValues';

export interface Scan2DOptions {
  x: ScanAxis;
  y: ScanAxis;
  output: string;
  measurement?: AmplitudeMeasurement;
  levels?: number[];
}

interface Scan2DPlan extends ChunkPlan {
  x: AxisResult;
  y: AxisResult;
  xLog: boolean;
  yLog: boolean;
  output: string;
  unit: string;
  /** Which axis (if any) is scaled by the sqrt law; the other is evaluated along one line. */
  scaledAxis: 'x' | 'y' | null;
  /** Nominal SI value of the scaled axis's cell. */
  scaledNominal: number;
  /** Number of evaluations (grid points, or the evaluated line). */
  evaluations: number;
  measurement?: AmplitudeMeasurement;
  levels?: number[];
}

interface Scan2DChunk {
  values: Float64Array;
  failures: number;
  firstError?: string;
}

export const scan2dJob: ChunkedJob<Scan2DOptions, Scan2DPlan, Scan2DChunk, Scan2DResult> = {
  kind: 'scan2d',
  plan(sheet, { x: xAxis, y: yAxis, output, measurement, levels }) {
    if (xAxis.cell === yAxis.cell) throw new SheetJobError(`scan: the two axes must be different cells, both are ${xAxis.cell}`);
    requireNumericOutput(sheet, output, 'scan');
    const X = axisResult(sheet, xAxis);
    const Y = axisResult(sheet, yAxis);
    const nx = X.result.valuesSI.length;
    const ny = Y.result.valuesSI.length;
    if (nx * ny > MAX_GRID_POINTS) throw new SheetJobError(`scan: at most ${MAX_GRID_POINTS} grid points, got ${nx} x ${ny}`);
    // Does the output go as sqrt of one axis? Probe at the nominal point and at the ends of the other axis.
    const sqrtIn = (A: typeof X, B: typeof X, bAxis: ScanAxis): boolean => {
      if (!(A.nominal > 0) || !(A.result.valuesSI[0] > 0)) return false;
      try {
        const ends = [B.result.valuesSI[0], B.result.valuesSI[B.result.valuesSI.length - 1]];
        if (!checkSqrtProportional(sheet, A.result.cell, output).proportional) return false;
        return ends.every((b) => checkSqrtProportional(sheet, A.result.cell, output, { [bAxis.cell]: valueLike(B.template, b) }).proportional);
      } catch {
        return false;
      }
    };
    const scaledAxis: 'x' | 'y' | null = sqrtIn(Y, X, xAxis) ? 'y' : sqrtIn(X, Y, yAxis) ? 'x' : null;
    const evaluations = scaledAxis === 'y' ? nx : scaledAxis === 'x' ? ny : nx * ny;
    return {
      chunks: Math.ceil(evaluations / SCAN_CHUNK),
      work: evaluations,
      x: X.result,
      y: Y.result,
      xLog: xAxis.log,
      yLog: yAxis.log,
      output,
      unit: outputUnit(sheet, output),
      scaledAxis,
      scaledNominal: scaledAxis === 'y' ? Y.nominal : scaledAxis === 'x' ? X.nominal : NaN,
      evaluations,
      measurement,
      levels,
    };
  },
  chunkWork(plan, index) {
    const { start, end } = chunkRange(plan.evaluations, SCAN_CHUNK, index);
    return end - start;
  },
  async runChunk(sheet, plan, index, control) {
    const { start, end } = chunkRange(plan.evaluations, SCAN_CHUNK, index);
    const { x, y, output } = plan;
    const nx = x.valuesSI.length;
    const xt = nominalInput(sheet, x.cell).template;
    const yt = nominalInput(sheet, y.cell).template;
    const values = new Float64Array(end - start);
    let failures = 0;
    let firstError: string | undefined;
    for (let k = start; k < end; k++) {
      let overrides: Record<string, unknown>;
      let where: string;
      if (plan.scaledAxis === 'y') {
        overrides = { [x.cell]: valueLike(xt, x.valuesSI[k]) };
        where = `${x.cell} = ${x.values[k]}`;
      } else if (plan.scaledAxis === 'x') {
        overrides = { [y.cell]: valueLike(yt, y.valuesSI[k]) };
        where = `${y.cell} = ${y.values[k]}`;
      } else {
        const ix = k % nx;
        const iy = (k - ix) / nx;
        overrides = { [x.cell]: valueLike(xt, x.valuesSI[ix]), [y.cell]: valueLike(yt, y.valuesSI[iy]) };
        where = `${x.cell} = ${x.values[ix]}, ${y.cell} = ${y.values[iy]}`;
      }
      const st = sheet.evaluateWith(overrides, [output])[output];
      const v = numericOrNaN(st);
      values[k - start] = v;
      if (Number.isNaN(v)) {
        failures++;
        if (!firstError) firstError = st?.status === 'error' ? st.error.message : `${output} is not a number at ${where}`;
      }
      await control.tick(k + 1 - start);
    }
    return { values, failures, firstError };
  },
  combine(_sheet, plan, chunks) {
    const { x: X, y: Y, scaledAxis } = plan;
    const nx = X.valuesSI.length;
    const ny = Y.valuesSI.length;
    const evaluated = new Float64Array(plan.evaluations);
    let failures = 0;
    let firstError: string | undefined;
    chunks.forEach((c, k) => {
      evaluated.set(c.values, k * SCAN_CHUNK);
      failures += c.failures;
      firstError ??= c.firstError;
    });
    let values = evaluated;
    if (scaledAxis) {
      // The evaluated line times sqrt(s / s0) along the scaled axis.
      values = new Float64Array(nx * ny);
      const S = scaledAxis === 'y' ? Y : X;
      const factors = S.valuesSI.map((s) => Math.sqrt(s / plan.scaledNominal));
      for (let iy = 0; iy < ny; iy++) {
        for (let ix = 0; ix < nx; ix++) values[iy * nx + ix] = scaledAxis === 'y' ? evaluated[ix] * factors[iy] : evaluated[iy] * factors[ix];
      }
      if (failures) failures *= scaledAxis === 'y' ? ny : nx;
    }
    const result: Scan2DResult = { x: X, y: Y, output: plan.output, unit: plan.unit, values, scaledAxis, evaluations: plan.evaluations, failures, firstError };
    if (plan.measurement) Object.assign(result, likelihoodMap(plan, values));
    return result;
  },
};

/** The likelihood relative to its peak, the posterior mass per grid point and the HPD thresholds. */
function likelihoodMap(plan: Scan2DPlan, values: Float64Array): Partial<Scan2DResult> {
  const m = plan.measurement!;
  const { x: X, y: Y } = plan;
  const nx = X.valuesSI.length;
  const ny = Y.valuesSI.length;
  const levels = plan.levels ?? DEFAULT_CREDIBLE_LEVELS;
  const likelihood = new Float64Array(nx * ny);
  const mass = new Float64Array(nx * ny);
  const wx = axisPriorWeights({ values: X.valuesSI, log: plan.xLog, prior: X.prior });
  const wy = axisPriorWeights({ values: Y.valuesSI, log: plan.yLog, prior: Y.prior });
  const mAtYr = m.fRefHz === F_YR_HZ ? m : atReferenceFrequency(m, F_YR_HZ);
  for (let iy = 0; iy < ny; iy++) {
    for (let ix = 0; ix < nx; ix++) {
      const k = iy * nx + ix;
      const v = values[k];
      const L = Number.isFinite(v) && v > 0 ? relativeLikelihood(mAtYr, v) : 0;
      likelihood[k] = L;
      mass[k] = L * wx[ix] * wy[iy];
    }
  }
  let hpd;
  try {
    hpd = hpdThresholds(mass, levels);
  } catch (e) {
    throw new SheetJobError(`scan: ${(e as Error).message} (the measurement allows none of the scanned range)`);
  }
  return {
    band: measuredBand(m),
    likelihood,
    posterior: hpd.posterior,
    levels,
    thresholds: hpd.thresholds,
    enclosed: hpd.enclosed,
    priors: `${X.cell}: ${X.prior}, ${Y.cell}: ${Y.prior} over the scanned ranges`,
  };
}
