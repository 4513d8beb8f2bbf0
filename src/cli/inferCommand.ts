// `strainsheet infer FILE --likelihood CELL --steps N --walkers W --seed S`: posterior sampling of the
// free cells (cells with a prior, or those named with --free) with the ensemble sampler; chains as
// CSV, the summary on screen and as JSON; with --evidence, ln Z by thermodynamic integration and,
// with --compare OTHER, the Bayes factor of the two sheets.
import { writeFileSync } from 'node:fs';
import type { Command } from './commands';
import { parseOptions, UsageError } from './optionParsing';
import { applySetOptions, loadSheet, parseSetOption } from './sheetLoading';
import { EXIT_BAD_INPUT, EXIT_OK } from './exitCodes';
import { writeCsv, g4 } from './statisticsCli';
import { parallelOptionsOf } from './parallelOptions';
import { runInference } from '../statistics/sheetInference';
import { sheetEvidence, type SheetEvidence } from '../statistics/sheetEvidence';
import { chainsCsv, evidenceLines, inferenceSummary, inferenceSummaryLines } from '../statistics/inferenceReport';
import { logBayesFactor } from '../statistics/thermodynamicEvidence';
import { JobCancelledError, SheetJobError } from '../statistics/sheetValues';
import type { Sheet } from '../sheet/sheet';
import { cornerModel } from '../statistics/cornerPlot';
import { cornerSvg } from './cornerSvg';
import { SheetEditError } from '../sheet/sheet';

const USAGE = `strainsheet infer FILE --likelihood CELL --steps N --walkers W --seed S [options]

Samples the posterior of the free cells with an affine-invariant ensemble sampler (stretch move,
Goodman & Weare 2010), evaluating the sheet itself at every point. The free cells are those with a
prior (the cell's "prior" field), or those named with --free (their prior, else their uncertainty).
The likelihood is a cell holding ln L, e.g. amplitudeLogLikelihood(A_yr, measured), or a sum of
several. A likelihood that fails or is NaN counts as zero likelihood there (reported with a point).
The sheet itself is not changed; the same seed gives the same chains for any number of workers.
  --likelihood CELL  the cell holding ln L (required)
  --steps N          steps per walker (at least 2)
  --walkers W        walkers (even, at least 4 and at least twice the number of free cells)
  --seed S           seed (whole number >= 0)
  --free CELL        a free cell (repeatable; default: every cell with a prior)
  --prior name=formula  give a cell a prior first, e.g. rate_norm=logUniformDist(1e-5 Mpc^-3 Gyr^-1, 1e-1 Mpc^-3 Gyr^-1)
  --burn-in N        steps discarded at the start (default: half the steps)
  --thin N           keep every N-th step after the burn-in (default 1)
  --derived CELL     report the posterior of this cell too (repeatable), e.g. a local merger-rate density
  --spectrum CELL    spectrum cell: the JSON gets the posterior-predictive h_c band (200 draws)
  --csv FILE         write the chains (every walker and step, burn-in marked) to FILE; without it the
                     CSV goes to standard output and the summary to standard error
  --json FILE        write the summary (posteriors, diagnostics, verdict) as JSON
  --corner FILE      write a corner plot (SVG) of the kept draws of the free and derived cells
  --evidence         instead of one run: ln Z by thermodynamic integration over --rungs tempered runs
  --rungs N          rungs of the temperature ladder (odd, default 17)
  --compare FILE     with --evidence: the same for another sheet and the Bayes factor ln B = ln Z1 - ln Z2
  --workers N        worker threads for the likelihood evaluations (default 1; the chains do not depend on N)
  --set name=formula replace a cell's formula first (repeatable)
  --quiet            no progress line (it is shown only on a terminal; Ctrl-C cancels)
Verdict "converged" needs R-hat < 1.01 and ESS >= 400 per free cell and a kept chain of at least 50
autocorrelation times; otherwise "run longer" with the reasons.
Exit status: 0 done, 2 bad file or option, or the run refused its input.`;

function whole(text: string | undefined, option: string, min: number, fallback?: number): number {
  if (text === undefined) {
    if (fallback !== undefined) return fallback;
    throw new UsageError(`give ${option}`);
  }
  if (!/^\d+$/.test(text.trim()) || !Number.isSafeInteger(Number(text)) || Number(text) < min) throw new UsageError(`${option} must be a whole number of at least ${min}, got "${text}"`);
  return Number(text);
}

function applyPriors(sheet: Sheet, priors: readonly string[]): void {
  for (const text of priors) {
    const { name, formula } = parseSetOption(text);
    if (!sheet.has(name)) throw new UsageError(`--prior ${name}: there is no cell of that name`);
    try {
      sheet.updateCell(name, { prior: formula });
    } catch (e) {
      if (e instanceof SheetEditError) throw new UsageError(`--prior ${name}: ${e.message}`);
      throw e;
    }
  }
}

function writeFile(path: string, text: string): void {
  try {
    writeFileSync(path, text);
  } catch (e) {
    throw new UsageError(`cannot write ${path}: ${(e as Error).message}`);
  }
}

export const inferCommand: Command = {
  summary: 'Posterior sampling of the free cells given a likelihood cell; chains as CSV, summary as JSON',
  usage: USAGE,
  async run(args, io) {
    const opts = parseOptions(args, {
      flags: ['help', 'quiet', 'evidence'],
      values: ['likelihood', 'steps', 'walkers', 'seed', 'free', 'prior', 'burn-in', 'thin', 'derived', 'spectrum', 'csv', 'json', 'corner', 'rungs', 'compare', 'set', 'workers'],
    });
    if (opts.flags.has('help')) {
      io.out(USAGE + '\n');
      return EXIT_OK;
    }
    if (opts.positional.length !== 1) throw new UsageError(`expected one sheet file, got ${opts.positional.length}`);
    const evidence = opts.flags.has('evidence');
    const likelihood = opts.values.get('likelihood')?.at(-1);
    if (!likelihood) throw new UsageError('give --likelihood CELL (a cell holding ln L)');
    const steps = whole(opts.values.get('steps')?.at(-1), '--steps', 2);
    const walkers = whole(opts.values.get('walkers')?.at(-1), '--walkers', 4);
    const seed = whole(opts.values.get('seed')?.at(-1), '--seed', 0);
    const burnInText = opts.values.get('burn-in')?.at(-1);
    const burnIn = burnInText === undefined ? undefined : whole(burnInText, '--burn-in', 0);
    const thin = whole(opts.values.get('thin')?.at(-1), '--thin', 1, 1);
    const free = opts.values.get('free');
    const csvPath = opts.values.get('csv')?.at(-1);
    const jsonPath = opts.values.get('json')?.at(-1);
    const quiet = opts.flags.has('quiet');
    const parallel = parallelOptionsOf(opts);
    if (!opts.values.has('workers')) parallel.workers = 1;
    if (parallel.shard) throw new UsageError('infer runs one chain ensemble and cannot be split with --shard');

    const load = (path: string) => {
      const s = loadSheet(path, { evaluateOnRead: true });
      applySetOptions(s, opts.values.get('set') ?? []);
      applyPriors(s, opts.values.get('prior') ?? []);
      return s;
    };
    const sheet = load(opts.positional[0]);
    const ctl = new AbortController();
    const onInt = () => ctl.abort();
    process.once('SIGINT', onInt);
    const tty = !quiet && Boolean(process.stderr.isTTY);
    const clear = () => tty && io.err('\r\x1b[K');
    try {
      if (evidence) {
        const rungs = whole(opts.values.get('rungs')?.at(-1), '--rungs', 3, 17);
        const run = async (s: Sheet, label: string): Promise<SheetEvidence> => {
          const e = await sheetEvidence(s, { likelihood, free, walkers, steps, seed, burnIn, rungs }, {
            signal: ctl.signal,
            onProgress: tty ? (d, t) => io.err(`\r${label}: ${Math.floor((100 * d) / t)}% of ${rungs} tempered runs`) : undefined,
          });
          clear();
          return e;
        };
        const a = await run(sheet, opts.positional[0]);
        const lines = evidenceLines(a, opts.positional[0]);
        const json: Record<string, unknown> = { evidence: { [opts.positional[0]]: a } };
        const other = opts.values.get('compare')?.at(-1);
        if (other) {
          const b = await run(load(other), other);
          lines.push(...evidenceLines(b, other));
          const bf = logBayesFactor(a, b);
          lines.push(`ln B (${opts.positional[0]} over ${other}) = ${g4(bf.logBayesFactor)} +- ${g4(bf.error)}; B = ${g4(Math.exp(bf.logBayesFactor))}`);
          json.evidence = { [opts.positional[0]]: a, [other]: b };
          json.logBayesFactor = bf;
        }
        lines.push('Limits: ln Z needs proper priors and a normalised likelihood cell; both sheets must use the same data; a posterior with separated modes the walkers do not cross gives a biased ln Z.');
        io.out(lines.join('\n') + '\n');
        if (jsonPath) writeFile(jsonPath, JSON.stringify(json, (_k, v) => (v instanceof Float64Array ? Array.from(v) : v), 2) + '\n');
        return EXIT_OK;
      }
      const derived = opts.values.get('derived');
      const spectrumCell = opts.values.get('spectrum')?.at(-1);
      const r = await runInference(
        sheet,
        { likelihood, free, walkers, steps, seed, burnIn, thin, derived, spectrumCell },
        {
          signal: ctl.signal,
          onStep: tty ? (p) => io.err(`\rstep ${p.step}/${p.steps}, acceptance ${p.acceptance.toFixed(2)}, tau ${Number.isFinite(p.tau) ? p.tau.toFixed(1) : '-'}`) : undefined,
        },
        { parallel },
      );
      clear();
      writeCsv(chainsCsv(r), csvPath, io);
      if (jsonPath) writeFile(jsonPath, JSON.stringify(inferenceSummary(r), null, 2) + '\n');
      const cornerPath = opts.values.get('corner')?.at(-1);
      if (cornerPath) {
        const model = cornerModel([
          ...r.parameters.map((p) => ({ name: p.cell, unit: p.unit, log: p.logScale, draws: r.samples[p.cell] })),
          ...r.derived.map((d) => ({ name: d.cell, unit: d.unit, log: r.samples[d.cell].every((x) => !(x <= 0)), draws: r.samples[d.cell] })),
        ]);
        writeFile(cornerPath, cornerSvg(model, `${opts.positional[0]}: ${r.walkers} walkers x ${r.steps} steps, seed ${r.seed}, burn-in ${r.burnIn}`));
      }
      const wrote = [csvPath, jsonPath, opts.values.get('corner')?.at(-1)].filter(Boolean).map((p) => `wrote ${p}\n`).join('');
      const text = inferenceSummaryLines(r).join('\n') + '\n' + wrote;
      if (csvPath) io.out(text);
      else io.err(text);
      return EXIT_OK;
    } catch (e) {
      clear();
      if (e instanceof SheetJobError) {
        io.err(`strainsheet infer: ${e.message}\n`);
        return EXIT_BAD_INPUT;
      }
      if (e instanceof JobCancelledError) {
        io.err('strainsheet infer: cancelled\n');
        return EXIT_BAD_INPUT;
      }
      throw e;
    } finally {
      process.removeListener('SIGINT', onInt);
    }
  },
};
