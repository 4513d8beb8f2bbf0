// A one-input scan as a chunked job (src/jobs/chunkedJob.ts): the axis points split into chunks of
// SCAN_CHUNK points. Outputs that go as the square root of the axis input (A_yr and the merger-rate
// normalisation, Phinney 2001, astro-ph/0108028) are scaled from the sheet's value, checked with two
// probes in plan(), and cost no chunk work.
import type { Sheet } from '../sheet/sheet';
import type { AmplitudeMeasurement } from './measurement';
import { checkSqrtProportional } from './proportionality';
import { chunkRange, type ChunkedJob, type ChunkPlan } from '../jobs/chunkedJob';
import { axisResult, measuredBand, outputUnit, requireNumericOutput, type AxisResult, type Scan1DResult, type ScanAxis } from './sheetScan';
import { SheetJobError, nominalInput, numericOrNaN, valueLike } from './sheetValues';

/** Axis points per chunk of a scan. */
export const SCAN_CHUNK = 32;

export interface Scan1DOptions {
  axis: ScanAxis;
  outputs: string[];
  measurement?: AmplitudeMeasurement;
}

interface Scan1DPlan extends ChunkPlan {
  axis: AxisResult;
  outputs: string[];
  /** Outputs evaluated at every point. */
  direct: string[];
  /** Outputs scaled as sqrt(x / nominal) from the value y0 at the nominal point. */
  scaled: { output: string; y0: number }[];
  nominal: number;
  units: Record<string, string>;
  measurement?: AmplitudeMeasurement;
}

interface Scan1DChunk {
  values: Record<string, Float64Array>;
  failures: number;
  firstError?: string;
}

export const scan1dJob: ChunkedJob<Scan1DOptions, Scan1DPlan, Scan1DChunk, Scan1DResult> = {
  kind: 'scan1d',
  plan(sheet, { axis, outputs, measurement }) {
    if (outputs.length === 0) throw new SheetJobError('scan: name at least one output cell');
    for (const o of outputs) requireNumericOutput(sheet, o, 'scan');
    const { result: ax, nominal } = axisResult(sheet, axis);
    const direct: string[] = [];
    const scaled: { output: string; y0: number }[] = [];
    const units: Record<string, string> = {};
    for (const o of outputs) {
      units[o] = outputUnit(sheet, o);
      let sqrtLaw = false;
      if (nominal > 0 && axis.lo > 0) {
        try {
          sqrtLaw = checkSqrtProportional(sheet, axis.cell, o).proportional;
        } catch {
          sqrtLaw = false;
        }
      }
      if (sqrtLaw) scaled.push({ output: o, y0: numericOrNaN(sheet.state(o)) });
      else direct.push(o);
    }
    const n = ax.valuesSI.length;
    const chunks = direct.length ? Math.ceil(n / SCAN_CHUNK) : 0;
    return { chunks, work: n, axis: ax, outputs, direct, scaled, nominal, units, measurement };
  },
  chunkWork(plan, index) {
    const { start, end } = chunkRange(plan.axis.valuesSI.length, SCAN_CHUNK, index);
    return end - start;
  },
  async runChunk(sheet, plan, index, control) {
    const { start, end } = chunkRange(plan.axis.valuesSI.length, SCAN_CHUNK, index);
    const template = nominalInput(sheet, plan.axis.cell).template;
    const values: Record<string, Float64Array> = {};
    for (const o of plan.direct) values[o] = new Float64Array(end - start);
    let failures = 0;
    let firstError: string | undefined;
    for (let i = start; i < end; i++) {
      const r = sheet.evaluateWith({ [plan.axis.cell]: valueLike(template, plan.axis.valuesSI[i]) }, plan.direct);
      for (const o of plan.direct) {
        const st = r[o];
        const v = numericOrNaN(st);
        values[o][i - start] = v;
        if (Number.isNaN(v)) {
          failures++;
          if (!firstError) firstError = st?.status === 'error' ? st.error.message : `${o} is not a number at ${plan.axis.cell} = ${plan.axis.values[i]}`;
        }
      }
      await control.tick(i + 1 - start);
    }
    return { values, failures, firstError };
  },
  combine(_sheet, plan, chunks) {
    const n = plan.axis.valuesSI.length;
    const outputs: Record<string, Float64Array> = {};
    for (const o of plan.outputs) outputs[o] = new Float64Array(n);
    for (const { output, y0 } of plan.scaled) {
      for (let i = 0; i < n; i++) outputs[output][i] = y0 * Math.sqrt(plan.axis.valuesSI[i] / plan.nominal);
    }
    let failures = 0;
    let firstError: string | undefined;
    chunks.forEach((c, k) => {
      for (const o of plan.direct) outputs[o].set(c.values[o], k * SCAN_CHUNK);
      failures += c.failures;
      firstError ??= c.firstError;
    });
    return {
      axis: plan.axis,
      outputs,
      units: plan.units,
      scaled: plan.scaled.map((s) => s.output),
      failures,
      firstError,
      band: plan.measurement ? measuredBand(plan.measurement) : undefined,
    };
  },
};
