// `strainsheet sample FILE --samples N --seed S --output name [--csv out.csv]`: Monte Carlo over every
// cell with an uncertainty, writing one CSV row per sample and a summary.
import type { Command } from './commands';
import { UsageError } from './optionParsing';
import { applySetOptions, loadSheet } from './sheetLoading';
import { EXIT_BAD_INPUT, EXIT_CELL_ERROR, EXIT_OK } from './exitCodes';
import { inOwnUnit, unitTextOf } from '../statistics/sheetValues';
import type { JobResult, JobSpec } from '../statistics/jobs';
import type { Sheet } from '../sheet/sheet';
import type { CliIO } from './cliIO';
import { parallelOptionsOf, PARALLEL_USAGE, PARALLEL_VALUE_OPTIONS } from './parallelOptions';
import { runShardToPart } from './shardRun';
import { csvField, csvNumber, g4, runJobForCommand, sheetCommandOptions, writeCsv } from './statisticsCli';

const USAGE = `strainsheet sample FILE --samples N --seed S --output name [options]

Draws every cell that has an uncertainty (a distribution formula in the cell's "uncertainty" field)
N times with a seeded generator (xoshiro128**, one stream per chunk of 500 samples), evaluates the
outputs for each draw and writes CSV: one row per sample with the drawn inputs and the outputs, in
each cell's own unit. The sheet itself is not changed; the same seed gives the same rows, whatever
the number of workers or shards.
  --samples N        number of samples (whole number, at least 1)
  --seed S           seed (whole number >= 0)
  --output name      output cell (repeatable)
  --csv FILE         write the CSV to FILE; the summary then goes to standard output
                     (without --csv the CSV goes to standard output and the summary to standard error)
  --against CELL     measurement cell: the summary adds the fraction of samples of the first output
                     inside the measured interval and the mean relative likelihood
  --set name=formula replace a cell's formula first (repeatable)
  --quiet            no progress on standard error (Ctrl-C cancels)
${PARALLEL_USAGE}
Summary: median, 68.27% and 95.45% central intervals, each with its Monte Carlo error (half-width of
the order-statistic interval of the quantile).
Exit status: 0 done, 1 some samples failed (see stderr), 2 bad file or option.`;

function wholeNumber(text: string | undefined, option: string, min: number): number {
  if (text === undefined) throw new UsageError(`give ${option}`);
  if (!/^\d+$/.test(text.trim())) throw new UsageError(`${option} must be a whole number, got "${text}"`);
  const n = Number(text);
  if (!Number.isSafeInteger(n) || n < min) throw new UsageError(`${option} must be a whole number of at least ${min}, got ${text}`);
  return n;
}

export const sampleCommand: Command = {
  summary: 'Monte Carlo over the uncertain cells; write samples as CSV and a summary',
  usage: USAGE,
  async run(args, io) {
    const opts = sheetCommandOptions(args, ['samples', 'seed', 'output', 'csv', 'against', 'set', ...PARALLEL_VALUE_OPTIONS], USAGE, io);
    if (opts === null) return EXIT_OK;
    const samples = wholeNumber(opts.values.get('samples')?.at(-1), '--samples', 1);
    const seed = wholeNumber(opts.values.get('seed')?.at(-1), '--seed', 0);
    const outputs = opts.values.get('output') ?? [];
    if (outputs.length === 0) throw new UsageError('give an --output cell');
    const csvPath = opts.values.get('csv')?.at(-1);
    const sheet = loadSheet(opts.positional[0], { evaluateOnRead: true });
    applySetOptions(sheet, opts.values.get('set') ?? []);
    const spec: JobSpec = { kind: 'sample', samples, seed, outputs, measurementCell: opts.values.get('against')?.at(-1) };
    const parallel = parallelOptionsOf(opts);
    if (parallel.shard) return runShardToPart('sample', sheet, spec, parallel, io, opts.flags.has('quiet'));
    const job = await runJobForCommand('sample', sheet, spec, io, opts.flags.has('quiet'), parallel);
    if (job === null) return EXIT_BAD_INPUT;
    return reportSample(sheet, spec, job, csvPath, io);
  },
};

/** Writes the samples' CSV (to csvPath or standard output) and the summary; gives the exit code. Also used by `merge`. */
export function reportSample(sheet: Sheet, spec: Extract<JobSpec, { kind: 'sample' }>, job: JobResult, csvPath: string | undefined, io: CliIO): number {
  const { samples, seed, outputs } = spec;
  if (job.kind !== 'sample') throw new Error('unexpected job result');
  const r = job.result;
  const inputs = r.inputs.map((i) => i.cell);
  const inTemplates = inputs.map((c) => sheet.value(c));
  const outTemplates = outputs.map((c) => sheet.value(c));
  const lines = [`# seed ${seed}, ${samples} samples; ` + r.inputs.map((i) => `${i.cell}: ${i.distribution}`).join('; ')];
  lines.push(['sample', ...inputs.map((c, k) => csvField(c, unitTextOf(inTemplates[k]))), ...outputs.map((c, k) => csvField(c, unitTextOf(outTemplates[k])))].join(','));
  for (let s = 0; s < samples; s++) {
    lines.push(
      [String(s + 1), ...inputs.map((c, k) => csvNumber(inOwnUnit(inTemplates[k], r.inputDraws![c][s]))), ...outputs.map((c, k) => csvNumber(inOwnUnit(outTemplates[k], r.outputs[c][s])))].join(','),
    );
  }
  writeCsv(lines.join('\n') + '\n', csvPath, io);
  const summary: string[] = [];
  outputs.forEach((o, k) => {
    const s = r.summaries[o];
    const t = (x: number) => g4(inOwnUnit(outTemplates[k], x));
    const u = unitTextOf(outTemplates[k]);
    summary.push(`${o}${u ? ` [${u}]` : ''}: median ${t(s.median)} +- ${t(s.medianError)} (Monte Carlo error), from ${s.count} samples`);
    for (const i of s.intervals) summary.push(`  ${g4(100 * i.level)}% interval ${t(i.lower)} (+- ${t(i.lowerError)}) to ${t(i.upper)} (+- ${t(i.upperError)})`);
  });
  if (r.overlap) {
    const o = r.overlap;
    summary.push(`${outputs[0]} inside the measured ${g4(100 * o.band.level)}% interval (${g4(o.band.lower)} to ${g4(o.band.upper)}): ${g4(100 * o.fractionInside)}% +- ${g4(100 * o.fractionInsideError)}% of samples; mean relative likelihood ${g4(o.meanRelativeLikelihood)}`);
  }
  const text = summary.join('\n') + '\n';
  if (csvPath) io.out(text + `wrote ${csvPath}\n`);
  else io.err(text);
  if (r.failures) {
    io.err(`strainsheet sample: ${r.failures} sample${r.failures === 1 ? '' : 's'} failed; first: ${r.firstError}\n`);
    return EXIT_CELL_ERROR;
  }
  return EXIT_OK;
}
