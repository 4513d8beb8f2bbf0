// The command line end to end, as a user runs it: a whole `node bin/strainsheet.mjs` process.
// Targets (issue 11): `evaluate examples/demo.json` <= 0.35 s; 10,000 Monte Carlo samples over two
// inputs that are not linear (the demo with mass_slope and cutoff_mass uncertain, rate_norm fixed)
// <= 0.6 s on one thread. The CLI bundle is rebuilt first so that the bin does not fall back to tsx.
// Run with `npm run bench`.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { bench, describe } from 'vitest';

const root = fileURLToPath(new URL('..', import.meta.url));
execFileSync(process.execPath, [join(root, 'scripts/buildCli.mjs')]);
const bin = join(root, 'bin/strainsheet.mjs');
const demo = join(root, 'examples/demo.json');

// The demo with two uncertain inputs that every sample must evaluate (invented values).
const file = JSON.parse(readFileSync(demo, 'utf8')) as { cells: Array<{ name: string; uncertainty?: string }> };
for (const c of file.cells) {
  if (c.name === 'rate_norm') delete c.uncertainty;
  if (c.name === 'mass_slope') c.uncertainty = 'normalDist(0.25, 0.1)';
  if (c.name === 'cutoff_mass') c.uncertainty = 'lognormalDist(1.2e9 Msun, 0.2)';
}
const dir = mkdtempSync(join(tmpdir(), 'strainsheet-bench-'));
const twoInputs = join(dir, 'two-inputs.json');
writeFileSync(twoInputs, JSON.stringify(file));

const run = (args: string[]) => execFileSync(process.execPath, [bin, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });

describe('command line, whole process', () => {
  bench('strainsheet evaluate examples/demo.json (target <= 0.35 s)', () => void run(['evaluate', demo]), { iterations: 7, time: 0, warmupIterations: 1 });
  bench(
    'strainsheet sample: 10,000 samples, mass_slope and cutoff_mass uncertain, CSV written (target <= 0.6 s)',
    () => void run(['sample', twoInputs, '--samples', '10000', '--seed', '1', '--output', 'A_yr', '--csv', join(dir, 'samples.csv'), '--quiet', '--workers', '1']),
    { iterations: 3, time: 0, warmupIterations: 0 },
  );
});
