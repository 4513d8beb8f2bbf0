// `strainsheet plot FILE --plot spectrum --size column --svg OUT.svg` (or --pdf OUT.pdf): the app's
// figure without a browser, from the same figure writer (web/plots/svgWriter.ts).
import { readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Command } from './commands';
import { parseOptions, UsageError } from './optionParsing';
import { applySetOptions, loadSheet } from './sheetLoading';
import { EXIT_BAD_INPUT, EXIT_CELL_ERROR, EXIT_OK } from './exitCodes';
import { sheetSpectrumModel, spectrumCurves } from '../../web/plots/sheetSpectrumModel';
import { breakdownModels } from '../../web/plots/breakdownPlotModel';
import { plotFigure } from '../../web/plots/svgWriter';
import { FIGURE_SIZE_IDS, FIGURE_SIZES, type FigureSizeId } from '../../web/plots/figureSizes';
import type { VerticalQuantity } from '../../web/plots/spectrumPlotModel';
import type { PlotModel } from '../../web/plots/plotModel';
import { amplitudeGammaPosteriors, freeSpectra, realisationCells, sheetFreeSpectrumModel, sheetRealisationModel } from '../../web/plots/sheetFreeSpectrumModel';
import { sheetAmplitudeGammaModel } from '../../web/plots/sheetAmplitudeGammaModel';
import type { FreeSpectrumAxis } from '../../web/plots/freeSpectrumPlotModel';
import { monteCarloBands, monteCarloCloud, spectrumSampleOptions } from '../../web/plots/spectrumMonteCarlo';
import { spectrumSampleJob, type SpectrumSampleResult } from '../statistics/spectrumMonteCarloJob';
import { runChunkedJob } from '../jobs/runChunks';

const QUANTITIES: VerticalQuantity[] = ['hc', 'omega', 'psd'];
const FREE_SPECTRUM_AXES: FreeSpectrumAxis[] = ['hc', 'rho', 'psd'];
/** The plots every sheet may have (the breakdowns come with the sheet). */
const MEASUREMENT_PLOTS = ['free-spectrum', 'amplitude-gamma', 'realisations'];

const USAGE = `strainsheet plot FILE [--plot NAME] [--quantity hc|omega|psd] [--size SIZE] (--svg OUT | --pdf OUT)... [--set name=formula]...
                 [--monte-carlo N [--seed S] [--spectrum CELL]]

Draws one of the app's plots of the sheet FILE as a figure file.
  --plot NAME          spectrum (default); free-spectrum (violins per bin with the model spectra);
                       amplitude-gamma (measured 68%/95% contours with each model's fitted point);
                       realisations (bands of a realiseBackground cell, single realisations, loudest
                       binaries, with the free spectrum's violins);
                       or a breakdown the sheet has (see the error for the names)
  --quantity Q         vertical axis of the spectrum: hc (h_c, default), omega (Omega_gw), psd (residual power);
                       of the free spectrum and realisations: hc (default), rho (rho_k), psd
  --size SIZE          ${FIGURE_SIZE_IDS.map((s) => `${s} (${FIGURE_SIZES[s].label})`).join(', ')}; default column
  --svg OUT            write an SVG 1.1 file
  --pdf OUT            write a vector PDF with its font embedded
  --set name=formula   replace a cell's formula, or add the cell (repeatable)
  --monte-carlo N      free-spectrum and amplitude-gamma plots: draw the uncertain cells N times and
                       add the spectrum's 68%/95% band per bin and the cloud of fitted (A, gamma) points
  --seed S             seed of that Monte Carlo (default 1; the same seed gives the same figure)
  --spectrum CELL      the spectrum cell the Monte Carlo draws (default: spectrum, else the first)
Exit status: 0 written, 1 the plot has nothing to draw, 2 bad file or command line.`;

export const plotCommand: Command = {
  summary: 'draw a plot of a sheet as an SVG or PDF figure',
  usage: USAGE,
  async run(args, io) {
    const opts = parseOptions(args, { flags: ['help'], values: ['plot', 'quantity', 'size', 'svg', 'pdf', 'set', 'monte-carlo', 'seed', 'spectrum'] });
    if (opts.flags.has('help')) {
      io.out(USAGE + '\n');
      return EXIT_OK;
    }
    const one = (name: string, fallback: string) => {
      const v = opts.values.get(name) ?? [];
      if (v.length > 1) throw new UsageError(`--${name} given ${v.length} times`);
      return v[0] ?? fallback;
    };
    if (opts.positional.length !== 1) throw new UsageError(`expected one sheet file, got ${opts.positional.length}`);
    const size = one('size', 'column');
    if (!FIGURE_SIZE_IDS.includes(size as FigureSizeId)) throw new UsageError(`--size must be one of ${FIGURE_SIZE_IDS.join(', ')}, got "${size}"`);
    const plot = one('plot', 'spectrum');
    const quantity = one('quantity', 'hc');
    const allowed: string[] = plot === 'free-spectrum' || plot === 'realisations' ? FREE_SPECTRUM_AXES : QUANTITIES;
    if (!allowed.includes(quantity)) throw new UsageError(`--quantity must be one of ${allowed.join(', ')} for the ${plot} plot, got "${quantity}"`);
    const svgOut = one('svg', '');
    const pdfOut = one('pdf', '');
    if (!svgOut && !pdfOut) throw new UsageError('give --svg OUT or --pdf OUT (or both)');
    const sheet = loadSheet(opts.positional[0], { evaluateOnRead: true });
    applySetOptions(sheet, opts.values.get('set') ?? []);
    const reader = { cells: sheet.cells(), valueOf: (n: string) => sheet.value(n), stateOf: (n: string) => sheet.state(n) };
    let model: PlotModel | null | undefined;
    if (plot === 'spectrum') model = sheetSpectrumModel(reader, quantity as VerticalQuantity);
    else if (MEASUREMENT_PLOTS.includes(plot)) {
      const axis = quantity as FreeSpectrumAxis;
      const mcText = one('monte-carlo', '');
      let mc: SpectrumSampleResult | null = null;
      if (mcText) {
        if (plot === 'realisations') throw new UsageError('--monte-carlo goes with the free-spectrum and amplitude-gamma plots');
        const n = Number(mcText);
        const seed = Number(one('seed', '1'));
        if (!Number.isInteger(n) || n < 2) throw new UsageError(`--monte-carlo must be a whole number of draws, at least 2, got "${mcText}"`);
        if (!Number.isInteger(seed) || seed < 0) throw new UsageError(`--seed must be a whole number >= 0, got "${one('seed', '1')}"`);
        const spectra = spectrumCurves(reader).map((c) => c.label);
        const cell = one('spectrum', spectra[0] ?? 'spectrum');
        const options = spectrumSampleOptions(reader, cell, n, seed);
        if ('reason' in options) {
          io.err(`strainsheet plot: no Monte Carlo: ${options.reason}\n`);
          return EXIT_CELL_ERROR;
        }
        try {
          mc = await runChunkedJob(spectrumSampleJob, sheet, options);
        } catch (err) {
          io.err(`strainsheet plot: the Monte Carlo failed: ${err instanceof Error ? err.message : String(err)}\n`);
          return EXIT_CELL_ERROR;
        }
        if (mc.failures) io.err(`note: ${mc.failures} of ${n} draws failed (first: ${mc.firstError})\n`);
      }
      model =
        plot === 'free-spectrum'
          ? sheetFreeSpectrumModel(reader, axis, [], mc ? monteCarloBands(mc) : [])
          : plot === 'realisations'
            ? sheetRealisationModel(reader, axis)
            : sheetAmplitudeGammaModel(reader, [], mc ? [monteCarloCloud(mc)] : []);
      if (!model) {
        const what =
          plot === 'free-spectrum'
            ? 'a measured free spectrum (measuredFreeSpectrum)'
            : plot === 'realisations'
              ? 'realisations (realiseBackground)'
              : 'a measured (A, gamma) posterior (measuredAmplitudeGamma or amplitudeGammaGaussian)';
        io.err(`strainsheet plot: ${opts.positional[0]} has no cell holding ${what}, so there is no ${plot} plot\n`);
        return EXIT_CELL_ERROR;
      }
    } else {
      const all = breakdownModels(reader.cells, reader.valueOf);
      model = all.find((m) => m.id === plot);
      if (!model) {
        const measured = MEASUREMENT_PLOTS.filter((p) => (p === 'free-spectrum' ? freeSpectra(reader) : p === 'realisations' ? realisationCells(reader) : amplitudeGammaPosteriors(reader)).length > 0);
        io.err(`strainsheet plot: this sheet has no plot "${plot}"; it has: ${['spectrum', ...measured, ...all.map((m) => m.id)].join(', ')}\n`);
        return EXIT_BAD_INPUT;
      }
    }
    for (const n of model.notes) io.err(`note: ${n}\n`);
    if (!model.series.length) {
      io.err(`strainsheet plot: the ${plot} plot of ${opts.positional[0]} has nothing to draw\n`);
      return EXIT_CELL_ERROR;
    }
    const { svg, layout } = plotFigure(model, { size: size as FigureSizeId });
    if (svgOut) writeFileSync(svgOut, svg);
    if (pdfOut) {
      const { svgElementFromText } = await import('./svgDom');
      const { svgElementToPdf, toBase64 } = await import('../../web/plots/pdfWriter');
      const require = createRequire(import.meta.url);
      const font = toBase64(readFileSync(require.resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf')));
      writeFileSync(pdfOut, await svgElementToPdf(await svgElementFromText(svg), layout.width, layout.height, font, model.title));
    }
    return EXIT_OK;
  },
};
