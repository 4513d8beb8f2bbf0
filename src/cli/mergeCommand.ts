// `strainsheet merge PARTS... [--csv FILE]`: joins the part files of a sharded scan or sample into
// exactly the output of the unsharded run, after checking that the parts belong together.
import { readFileSync } from 'node:fs';
import type { Command } from './commands';
import { parseOptions, UsageError } from './optionParsing';
import { SheetLoadError } from './sheetLoading';
import { EXIT_BAD_INPUT, EXIT_OK } from './exitCodes';
import { Sheet } from '../sheet/sheet';
import { chunkedJobFor, type JobSpec } from '../statistics/jobs';
import { parsePartFile, type PartFile } from './partFile';
import { reportScan } from './scanCommand';
import { reportSample } from './sampleCommand';
import { reportRealise } from './realiseCommand';
import { withJobControls } from './statisticsCli';

const USAGE = `strainsheet merge PART... [--csv FILE]

Joins the part files written by "strainsheet scan|sample|realise ... --shard K/N" (one per shard, K = 1..N)
into the CSV and summary of the same run without --shard, identical to it byte for byte.
It refuses parts from different sheets, commands, options or seeds, and missing or repeated shards.
  --csv FILE   write the CSV to FILE instead of standard output
  --quiet      accepted for symmetry with scan and sample (merging prints no progress)
Exit status: 0 done, 1 some points or samples failed (see stderr), 2 bad or mismatched parts.`;

/** Canonical JSON (sorted keys) for comparing options. */
function canonical(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(canonical).join(',')}]`;
  if (v && typeof v === 'object') {
    return `{${Object.keys(v)
      .filter((k) => (v as Record<string, unknown>)[k] !== undefined)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${canonical((v as Record<string, unknown>)[k])}`)
      .join(',')}}`;
  }
  return JSON.stringify(v);
}

/** Why two parts do not belong to one run, or null when they do. */
function mismatch(a: PartFile, aPath: string, b: PartFile, bPath: string): string | null {
  if (a.command !== b.command || a.kind !== b.kind) return `${bPath} is from "${b.command}" (${b.kind}), ${aPath} from "${a.command}" (${a.kind})`;
  if (a.sheetSha256 !== b.sheetSha256) return `${bPath} was computed from a different sheet than ${aPath} (sheet SHA-256 ${b.sheetSha256.slice(0, 12)}... against ${a.sheetSha256.slice(0, 12)}...; were the file or the --set options different?)`;
  if (a.seed !== b.seed) return `${bPath} has seed ${b.seed}, ${aPath} seed ${a.seed}`;
  if (canonical(a.options) !== canonical(b.options)) {
    const ao = a.options as unknown as Record<string, unknown>;
    const bo = b.options as unknown as Record<string, unknown>;
    const keys = [...new Set([...Object.keys(ao), ...Object.keys(bo)])].filter((k) => canonical(ao[k]) !== canonical(bo[k]));
    return `${bPath} was run with different options than ${aPath} (${keys.map((k) => `${k}: ${canonical(bo[k])} against ${canonical(ao[k])}`).join('; ')})`;
  }
  if (a.shard.count !== b.shard.count) return `${bPath} is a shard of ${b.shard.count}, ${aPath} a shard of ${a.shard.count}`;
  if (a.chunks.total !== b.chunks.total) return `${bPath} splits the run into ${b.chunks.total} chunks, ${aPath} into ${a.chunks.total}`;
  return null;
}

export const mergeCommand: Command = {
  summary: 'join the part files of a sharded scan or sample into the CSV of the whole run',
  usage: USAGE,
  async run(args, io) {
    const opts = parseOptions(args, { flags: ['help', 'quiet'], values: ['csv'] });
    if (opts.flags.has('help')) {
      io.out(USAGE + '\n');
      return EXIT_OK;
    }
    const paths = opts.positional;
    if (paths.length === 0) throw new UsageError('give the part files to merge');
    const parts = paths.map((path) => {
      let text: string;
      try {
        text = readFileSync(path, 'utf8');
      } catch (e) {
        throw new SheetLoadError(`cannot read ${path}: ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (e as Error).message}`);
      }
      try {
        return parsePartFile(text);
      } catch (e) {
        throw new SheetLoadError(`${path}: ${(e as Error).message}`);
      }
    });
    for (let i = 1; i < parts.length; i++) {
      const why = mismatch(parts[0], paths[0], parts[i], paths[i]);
      if (why) throw new SheetLoadError(`these parts are not from one run: ${why}`);
    }
    const n = parts[0].shard.count;
    const byShard = new Map<number, number>();
    parts.forEach((p, i) => {
      const seen = byShard.get(p.shard.index);
      if (seen !== undefined) throw new SheetLoadError(`shard ${p.shard.index} of ${n} is given twice: ${paths[seen]} and ${paths[i]}`);
      byShard.set(p.shard.index, i);
    });
    const missing = Array.from({ length: n }, (_, k) => k + 1).filter((k) => !byShard.has(k));
    if (missing.length) throw new SheetLoadError(`missing shard${missing.length === 1 ? '' : 's'} ${missing.join(', ')} of ${n}`);
    const ordered = Array.from({ length: n }, (_, k) => parts[byShard.get(k + 1)!]);
    for (let k = 1; k < n; k++) {
      if (ordered[k].chunks.first !== ordered[k - 1].chunks.end) throw new SheetLoadError(`shard ${k + 1} of ${n} does not continue where shard ${k} ends (chunk ${ordered[k].chunks.first + 1} after ${ordered[k - 1].chunks.end})`);
    }
    const first = ordered[0];
    let sheet: Sheet;
    try {
      sheet = Sheet.fromFile(first.sheet, { evaluateOnRead: true });
    } catch (e) {
      throw new SheetLoadError(`${paths[0]}: the sheet it holds cannot be read: ${(e as Error).message}`);
    }
    const spec = first.options as JobSpec;
    const result = await withJobControls('merge', io, true, async () => {
      const chunked = chunkedJobFor(sheet, spec);
      if (!chunked || chunked.job.kind !== first.kind) throw new SheetLoadError(`${paths[0]}: its options do not describe a ${first.kind} job`);
      const plan = chunked.job.plan(sheet, chunked.options);
      if (plan.chunks !== first.chunks.total) throw new SheetLoadError(`the parts hold ${first.chunks.total} chunks, but this strainsheet splits the run into ${plan.chunks}; merge with the version that wrote them`);
      const chunks = ordered.flatMap((p) => p.results);
      return chunked.wrap(chunked.job.combine(sheet, plan, chunks));
    });
    if (result === null) return EXIT_BAD_INPUT;
    const csvPath = opts.values.get('csv')?.at(-1);
    if (spec.kind === 'scan') return reportScan(sheet, spec.outputs, result, csvPath, io);
    if (spec.kind === 'sample') return reportSample(sheet, spec, result, csvPath, io);
    if (spec.kind === 'realise') return reportRealise(result, csvPath, undefined, io);
    throw new SheetLoadError(`${paths[0]}: cannot merge parts of a ${first.kind} job`);
  },
};
