// Building the measurement plots of the demo (web/plots): the free spectrum's violins (14 bins x 1,500
// samples: one KDE table per bin), the (A, gamma) plane's 2-D KDE and contours (3,000 samples), and a
// Monte Carlo of the spectrum (100 draws of the uncertain cells). Each plot caches its violins and
// contours per data object; here every call gets a fresh copy, so the figures are the first drawing.
import { bench, describe } from 'vitest';
import { join } from 'node:path';
import { loadSheet } from '../src/cli/sheetLoading';
import { freeSpectra, amplitudeGammaPosteriors } from '../web/plots/sheetFreeSpectrumModel';
import { freeSpectrumPlotModel } from '../web/plots/freeSpectrumPlotModel';
import { amplitudeGammaPlotModel } from '../web/plots/amplitudeGammaPlotModel';
import { runChunkedJob } from '../src/jobs/runChunks';
import { spectrumSampleJob } from '../src/statistics/spectrumMonteCarloJob';
import { spectrumSampleOptions } from '../web/plots/spectrumMonteCarlo';

const sheet = loadSheet(join(import.meta.dirname, '../examples/demo.json'));
const reader = { cells: sheet.cells(), valueOf: (n: string) => sheet.value(n), stateOf: (n: string) => sheet.state(n) };
const fs = freeSpectra(reader)[0];
const ag = amplitudeGammaPosteriors(reader)[0];

describe('measurement plots of the demo', () => {
  bench('free-spectrum plot: 14 violins from 1,500 samples each (uncached)', () => {
    freeSpectrumPlotModel({ quantity: 'rho', label: fs.name, data: { ...fs.data }, curves: [] });
  });
  bench('(A, gamma) plot: 2-D KDE of 3,000 samples, 68% and 95% contours (uncached)', () => {
    amplitudeGammaPlotModel({ label: ag.name, posterior: { ...ag.posterior }, points: [] });
  });
  bench(
    'Monte Carlo of the spectrum: 100 draws, band and fits',
    async () => {
      const opts = spectrumSampleOptions(reader, 'spectrum', 100, 1);
      if ('reason' in opts) throw new Error(opts.reason);
      await runChunkedJob(spectrumSampleJob, sheet, opts);
    },
    { iterations: 5 },
  );
});
