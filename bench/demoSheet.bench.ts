// The demo sheet (examples/demo.json) as the app uses it. Target: an edit of rate_norm recomputes
// every cell downstream (spectra circular, eccentric and stellar, finite-number bins, array S/N and
// detection span, comparisons, origins) well within 50 ms median on an idle machine, so the screen
// can redraw before the next keystroke. Also the initial full evaluation (loading the file).
// Run with `npm run bench` (or `npx vitest bench --run bench/demoSheet.bench.ts`).
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';

const DEMO_TEXT = readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8');

describe('demo sheet', () => {
  const sheet = Sheet.fromFile(DEMO_TEXT);
  const base = 1.2e-3;
  let k = 0;
  bench(
    'edit rate_norm and recompute every cell downstream (target well within 50 ms)',
    () => {
      // A new value each time, so nothing downstream is unchanged.
      k = (k + 1) % 1000;
      sheet.updateCell('rate_norm', { formula: `${base * (1 + 1e-4 * (k + 1))} Mpc^-3 Gyr^-1` });
      if (sheet.state('detection_span').status !== 'value') throw new Error('detection_span has no value after the edit');
    },
    { time: 4000, warmupIterations: 5 },
  );

  bench(
    'initial full evaluation (parse the file, evaluate every cell)',
    () => {
      Sheet.fromFile(DEMO_TEXT);
    },
    { iterations: 5, warmupIterations: 1 },
  );
});
