// `strainsheet realise FILE --count R --seed S [--csv bins.csv]`: realisations of the finite population
// set up by a realiseBackground(...) cell, per frequency bin, on worker threads; a CSV row per bin.
import type { Command } from './commands';
import type { CliIO } from './cliIO';
import { UsageError } from './optionParsing';
import { applySetOptions, loadSheet } from './sheetLoading';
import { EXIT_BAD_INPUT, EXIT_OK } from './exitCodes';
import type { JobResult, JobSpec } from '../statistics/jobs';
import { M_SUN_KG } from '../physics/constants';
import { parallelOptionsOf, PARALLEL_USAGE, PARALLEL_VALUE_OPTIONS } from './parallelOptions';
import { runShardToPart } from './shardRun';
import { csvField, csvNumber, g4, runJobForCommand, sheetCommandOptions, writeCsv } from './statisticsCli';
import { realisationBinsCsv, realisationCsvHead } from '../statistics/realisationReport';

const USAGE = `strainsheet realise FILE --count R --seed S [options]

Draws R realisations of the finite population set up by the sheet's realiseBackground(...) cell
(population, frequency bins, span, threshold) and writes CSV with one row per bin: the smooth h_c, the
mean, median and 68.27% / 95.45% central bands of h_c over the realisations, the probability that the
loudest binary outshines the rest of its bin, the median loudest strain, the expected number of
binaries and the share of h_c^2 in cells whose residence time exceeds the age of the Universe.
The same seed gives the same numbers for any --workers and any --shard split.
  --count R          number of realisations (whole number, at least 1)
  --seed S           seed (whole number >= 0)
  --cell NAME        the realiseBackground cell (default: the only one)
  --threshold K|all  K of realiseBackground (default the cell's own); "all" draws every binary
  --drop-long-residence
                     leave out cells whose residence time exceeds the age of the Universe at their z
  --csv FILE         write the per-bin CSV to FILE; the summary then goes to standard output
                     (without --csv the CSV goes to standard output and the summary to standard error)
  --loudest-csv FILE also write one row per realisation and bin: h_c and the loudest binary
                     (strain, chirp mass, redshift, mass ratio, whether it outshines the rest)
  --set name=formula replace a cell's formula first (repeatable)
  --quiet            no progress on standard error (Ctrl-C cancels)
${PARALLEL_USAGE}
Exit status: 0 done, 2 bad file or option.`;

function wholeNumber(text: string | undefined, option: string, min: number): number {
  if (text === undefined) throw new UsageError(`give ${option}`);
  if (!/^\d+$/.test(text.trim())) throw new UsageError(`${option} must be a whole number, got "${text}"`);
  const n = Number(text);
  if (!Number.isSafeInteger(n) || n < min) throw new UsageError(`${option} must be a whole number of at least ${min}, got ${text}`);
  return n;
}

function thresholdOption(text: string | undefined): number | 'all' | undefined {
  if (text === undefined) return undefined;
  if (text.trim() === 'all') return 'all';
  const k = Number(text);
  if (text.trim() === '' || !Number.isFinite(k) || k < 0) throw new UsageError(`--threshold must be an expected count >= 0 or "all", got "${text}"`);
  return k;
}

export const realiseCommand: Command = {
  summary: 'realisations of a finite population per frequency bin; write bands per bin as CSV',
  usage: USAGE,
  async run(args, io) {
    const dropFlag = args.includes('--drop-long-residence');
    const rest = args.filter((a) => a !== '--drop-long-residence');
    const opts = sheetCommandOptions(rest, ['count', 'seed', 'cell', 'threshold', 'csv', 'loudest-csv', 'set', ...PARALLEL_VALUE_OPTIONS], USAGE, io);
    if (opts === null) return EXIT_OK;
    const count = wholeNumber(opts.values.get('count')?.at(-1), '--count', 1);
    const seed = wholeNumber(opts.values.get('seed')?.at(-1), '--seed', 0);
    const sheet = loadSheet(opts.positional[0], { evaluateOnRead: true });
    applySetOptions(sheet, opts.values.get('set') ?? []);
    const spec: JobSpec = {
      kind: 'realise',
      cell: opts.values.get('cell')?.at(-1),
      count,
      seed,
      threshold: thresholdOption(opts.values.get('threshold')?.at(-1)),
      dropLongResidence: dropFlag ? true : undefined,
    };
    const parallel = parallelOptionsOf(opts);
    if (parallel.shard) return runShardToPart('realise', sheet, spec, parallel, io, opts.flags.has('quiet'));
    const job = await runJobForCommand('realise', sheet, spec, io, opts.flags.has('quiet'), parallel);
    if (job === null) return EXIT_BAD_INPUT;
    return reportRealise(job, opts.values.get('csv')?.at(-1), opts.values.get('loudest-csv')?.at(-1), io);
  },
};

/** Writes the per-bin CSV (and the per-realisation loudest binaries when asked) and a summary. Also used by `merge`. */
export function reportRealise(job: JobResult, csvPath: string | undefined, loudestPath: string | undefined, io: CliIO): number {
  if (job.kind !== 'realise') throw new Error('unexpected job result');
  const r = job.result;
  const s = r.summary;
  const nb = r.frequencyHz.length;
  const head = realisationCsvHead(r);
  writeCsv(realisationBinsCsv(r), csvPath, io);
  if (loudestPath) {
    const d = r.draws;
    const rows = [head, ['realisation', 'bin', csvField('frequency', 'nHz'), 'hc', 'loudest_strain', csvField('loudest_chirp_mass', 'Msun'), 'loudest_redshift', 'loudest_mass_ratio', 'outshines'].join(',')];
    for (let i = 0; i < d.count; i++) {
      for (let k = 0; k < nb; k++) {
        const at = i * nb + k;
        rows.push([String(i + 1), String(k + 1), csvNumber(r.frequencyHz[k] * 1e9), csvNumber(d.hc[at]), csvNumber(d.loudestStrain[at]), csvNumber(d.loudestChirpMassKg[at] / M_SUN_KG), csvNumber(d.loudestRedshift[at]), csvNumber(d.loudestMassRatio[at]), String(d.outshines[at])].join(','));
      }
    }
    writeCsv(rows.join('\n') + '\n', loudestPath, io);
  }
  let maxOut = 0;
  for (let k = 1; k < nb; k++) if (s.outshineProbability[k] > s.outshineProbability[maxOut]) maxOut = k;
  const summary = [
    `${r.count} realisations over ${nb} bins (${g4(r.frequencyHz[0] * 1e9)} to ${g4(r.frequencyHz[nb - 1] * 1e9)} nHz), seed ${r.seed}`,
    `lowest bin: median h_c ${g4(s.medianHc[0])} (68%: ${g4(s.lower68[0])} to ${g4(s.upper68[0])}), smooth ${g4(r.smoothHc[0])}`,
    `highest outshine probability: ${g4(100 * s.outshineProbability[maxOut])}% at ${g4(r.frequencyHz[maxOut] * 1e9)} nHz`,
    `long-residence cells carry ${g4(100 * r.longResidenceH2Fraction[0])}% of h_c^2 and ${g4(100 * r.longResidenceCountFraction[0])}% of the binaries in the lowest bin${r.dropLongResidence ? ' (dropped)' : ''}`,
  ];
  const text = summary.join('\n') + '\n';
  if (csvPath) io.out(text + `wrote ${csvPath}\n`);
  else io.err(text);
  return EXIT_OK;
}
