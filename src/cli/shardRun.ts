// `--shard K/N`: compute one shard's chunks of a scan or sample and write them to a part file.
import { writeFileSync } from 'node:fs';
import type { CliIO } from './cliIO';
import type { Sheet } from '../sheet/sheet';
import { UsageError } from './optionParsing';
import { EXIT_BAD_INPUT, EXIT_OK } from './exitCodes';
import { chunkedJobFor, type JobSpec } from '../statistics/jobs';
import { shardChunks } from '../jobs/chunkedJob';
import { runChunks } from '../jobs/runChunks';
import { PART_FORMAT, PART_VERSION, partFileText, sha256Hex, type PartFile } from './partFile';
import type { CliParallelOptions } from './parallelOptions';
import { withJobControls } from './statisticsCli';

export async function runShardToPart(command: string, sheet: Sheet, spec: JobSpec, parallel: CliParallelOptions, io: CliIO, quiet: boolean): Promise<number> {
  const { index, count } = parallel.shard!;
  const path = parallel.partPath ?? `${command}-part-${index}-of-${count}.json`;
  const sheetText = sheet.toFileText();
  const part = await withJobControls(command, io, quiet, async (control): Promise<PartFile> => {
    const chunked = chunkedJobFor(sheet, spec)!;
    const plan = chunked.job.plan(sheet, chunked.options);
    const { first, end } = shardChunks(plan.chunks, index, count);
    const indices = Array.from({ length: end - first }, (_, i) => first + i);
    const results = await runChunks(chunked.job, sheet, plan, indices, control, { ...parallel, sheetText });
    return {
      format: PART_FORMAT,
      version: PART_VERSION,
      command,
      kind: chunked.job.kind,
      sheetSha256: sha256Hex(sheetText),
      sheet: sheetText,
      options: spec,
      seed: spec.kind === 'sample' ? spec.seed : null,
      shard: { index, count },
      chunks: { first, end, total: plan.chunks },
      results,
    };
  });
  if (part === null) return EXIT_BAD_INPUT;
  try {
    writeFileSync(path, partFileText(part));
  } catch (e) {
    throw new UsageError(`cannot write ${path}: ${(e as Error).message}`);
  }
  const { first, end, total } = part.chunks;
  io.out(`shard ${index} of ${count}: chunks ${first + 1} to ${end} of ${total}${end === first ? ' (none: this shard has no work)' : ''}; wrote ${path}\n`);
  return EXIT_OK;
}
