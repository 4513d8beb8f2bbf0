// `strainsheet scan FILE --vary name=lo:hi:n[:log] [--vary ...] --output name [--csv out.csv]`:
// one input against outputs (with the measured band), or two inputs as a likelihood map.
import type { Command } from './commands';
import { UsageError } from './optionParsing';
import { applySetOptions, loadSheet } from './sheetLoading';
import { EXIT_BAD_INPUT, EXIT_CELL_ERROR, EXIT_OK } from './exitCodes';
import type { JobResult, JobSpec } from '../statistics/jobs';
import type { Sheet } from '../sheet/sheet';
import type { CliIO } from './cliIO';
import { parallelOptionsOf, PARALLEL_USAGE, PARALLEL_VALUE_OPTIONS } from './parallelOptions';
import { runShardToPart } from './shardRun';
import { inOwnUnit } from '../statistics/sheetValues';
import type { AxisPrior } from '../statistics/credibleRegion';
import { csvField, csvNumber, g4, parseVaryOption, runJobForCommand, sheetCommandOptions, writeCsv } from './statisticsCli';

const USAGE = `strainsheet scan FILE --vary name=lo:hi:n[:log] [--vary name=lo:hi:n[:log]] --output name [options]

Scans one or two input cells of the sheet FILE and writes CSV (to standard output, or to --csv).
The sheet itself is not changed.
  --vary name=lo:hi:n[:log]  vary cell "name" over n points from lo to hi, evenly or (":log") in log;
                             lo and hi are numbers in the cell's display unit, or formulas with units,
                             e.g. --vary 'rate_norm=1e-4 Mpc^-3 Gyr^-1:1e-2 Mpc^-3 Gyr^-1:50:log'
  --output name              output cell (repeatable for a one-input scan; exactly one for two inputs)
  --csv FILE                 write the CSV to FILE instead of standard output (a summary goes to stdout)
  --against CELL             measurement cell: adds the measured band (one input) or the likelihood
                             map with 68.27% and 95.45% (1 and 2 sigma) highest-posterior-density
                             regions (two inputs)
  --prior name=uniform|log-uniform   prior of a varied cell for the map (default: log-uniform on a
                             log axis, uniform on an even one)
  --set name=formula         replace a cell's formula first (repeatable)
  --quiet                    no progress on standard error (Ctrl-C cancels a running scan)
${PARALLEL_USAGE}
CSV: '#' comment lines (band, priors, thresholds), a header "name [unit]", one row per point;
a two-input map has columns x, y, output and, with --against, likelihood (relative to its peak),
posterior (mass per grid point, sums to 1), in68 and in95 (1 inside the region).
Exit status: 0 done, 1 some points failed (see stderr), 2 bad file, option or range.`;

export const scanCommand: Command = {
  summary: 'scan one or two inputs and write outputs (or a likelihood map) as CSV',
  usage: USAGE,
  async run(args, io) {
    const opts = sheetCommandOptions(args, ['vary', 'output', 'csv', 'against', 'prior', 'set', ...PARALLEL_VALUE_OPTIONS], USAGE, io);
    if (opts === null) return EXIT_OK;
    const vary = (opts.values.get('vary') ?? []).map(parseVaryOption);
    if (vary.length < 1 || vary.length > 2) throw new UsageError(`give one or two --vary options, got ${vary.length}`);
    const outputs = opts.values.get('output') ?? [];
    if (outputs.length === 0) throw new UsageError('give an --output cell');
    const priors = opts.values.get('prior') ?? [];
    for (const p of priors) {
      const [name, kind] = p.split('=').map((s) => s.trim());
      const axis = vary.find((v) => v.cell === name);
      if (!axis) throw new UsageError(`--prior ${name}: not a varied cell`);
      if (kind !== 'uniform' && kind !== 'log-uniform') throw new UsageError(`--prior ${name}: use uniform or log-uniform, got "${kind}"`);
      axis.prior = kind as AxisPrior;
    }
    const csvPath = opts.values.get('csv')?.at(-1);
    const against = opts.values.get('against')?.at(-1);
    const sheet = loadSheet(opts.positional[0], { evaluateOnRead: true });
    applySetOptions(sheet, opts.values.get('set') ?? []);
    const spec: JobSpec = { kind: 'scan', vary, outputs, measurementCell: against };
    const parallel = parallelOptionsOf(opts);
    if (parallel.shard) return runShardToPart('scan', sheet, spec, parallel, io, opts.flags.has('quiet'));
    const job = await runJobForCommand('scan', sheet, spec, io, opts.flags.has('quiet'), parallel);
    if (job === null) return EXIT_BAD_INPUT;
    return reportScan(sheet, outputs, job, csvPath, io);
  },
};

/** Writes a scan's CSV (to csvPath or standard output) and summary; gives the exit code. Also used by `merge`. */
export function reportScan(sheet: Sheet, outputs: string[], job: JobResult, csvPath: string | undefined, io: CliIO): number {
  const lines: string[] = [];
  let failures = 0;
  let firstError: string | undefined;
  const summary: string[] = [];
  if (job.kind === 'scan1d') {
    const r = job.result;
    failures = r.failures;
    firstError = r.firstError;
    if (r.band) lines.push(`# measured at 1/yr: median ${r.band.median}, ${100 * r.band.level}% interval ${r.band.lower} to ${r.band.upper}`);
    if (r.scaled.length) lines.push(`# ${r.scaled.join(', ')} scaled as sqrt(${r.axis.cell}) from one evaluation (checked with two probes)`);
    lines.push([csvField(r.axis.cell, r.axis.unit), ...outputs.map((o) => csvField(o, r.units[o]))].join(','));
    const templates = outputs.map((o) => sheet.value(o));
    for (let i = 0; i < r.axis.values.length; i++) {
      lines.push([csvNumber(r.axis.values[i]), ...outputs.map((o, k) => csvNumber(inOwnUnit(templates[k], r.outputs[o][i])))].join(','));
    }
    summary.push(`scanned ${r.axis.cell} over ${r.axis.values.length} points; outputs ${outputs.join(', ')}`);
  } else if (job.kind === 'scan2d') {
    const r = job.result;
    failures = r.failures;
    firstError = r.firstError;
    const nx = r.x.values.length;
    if (r.band) lines.push(`# measured at 1/yr: median ${r.band.median}, ${100 * r.band.level}% interval ${r.band.lower} to ${r.band.upper}`);
    if (r.priors) lines.push(`# priors: ${r.priors}`);
    if (r.thresholds) r.levels!.forEach((l, k) => lines.push(`# ${g4(100 * l)}% region (column in${Math.round(100 * l)}): posterior >= ${r.thresholds![k]} (encloses ${r.enclosed![k]})`));
    if (r.scaledAxis) lines.push(`# ${r.output} scaled as sqrt(${r.scaledAxis === 'x' ? r.x.cell : r.y.cell}) (checked with two probes); ${r.evaluations} evaluations`);
    const head = [csvField(r.x.cell, r.x.unit), csvField(r.y.cell, r.y.unit), csvField(r.output, r.unit)];
    if (r.likelihood) head.push('likelihood', 'posterior', ...r.levels!.map((l) => `in${Math.round(100 * l)}`));
    lines.push(head.join(','));
    const template = sheet.value(r.output);
    for (let iy = 0; iy < r.y.values.length; iy++) {
      for (let ix = 0; ix < nx; ix++) {
        const k = iy * nx + ix;
        const row = [csvNumber(r.x.values[ix]), csvNumber(r.y.values[iy]), csvNumber(inOwnUnit(template, r.values[k]))];
        if (r.likelihood) row.push(csvNumber(r.likelihood[k]), csvNumber(r.posterior![k]), ...r.thresholds!.map((t) => (r.posterior![k] >= t ? '1' : '0')));
        lines.push(row.join(','));
      }
    }
    summary.push(`mapped ${r.output} over ${r.x.cell} x ${r.y.cell} (${nx} x ${r.y.values.length}), ${r.evaluations} evaluations`);
    if (r.thresholds) summary.push(r.levels!.map((l, k) => `${g4(100 * l)}% region: ${r.posterior!.filter((p) => p >= r.thresholds![k]).length} grid points`).join('; '));
  }
  writeCsv(lines.join('\n') + '\n', csvPath, io);
  if (csvPath) io.out(summary.join('\n') + `\nwrote ${csvPath}\n`);
  if (failures) {
    io.err(`strainsheet scan: ${failures} point${failures === 1 ? '' : 's'} failed; first: ${firstError}\n`);
    return EXIT_CELL_ERROR;
  }
  return EXIT_OK;
}


