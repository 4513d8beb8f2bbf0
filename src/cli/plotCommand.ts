// `strainsheet plot FILE --plot spectrum --size column --svg OUT.svg` (or --pdf OUT.pdf): the app's
// figure without a browser, from the same figure writer (web/plots/svgWriter.ts).
import { readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Command } from './commands';
import { parseOptions, UsageError } from './optionParsing';
import { applySetOptions, loadSheet } from './sheetLoading';
import { EXIT_BAD_INPUT, EXIT_CELL_ERROR, EXIT_OK } from './exitCodes';
import { sheetSpectrumModel } from '../../web/plots/sheetSpectrumModel';
import { breakdownModels } from '../../web/plots/breakdownPlotModel';
import { plotFigure } from '../../web/plots/svgWriter';
import { FIGURE_SIZE_IDS, FIGURE_SIZES, type FigureSizeId } from '../../web/plots/figureSizes';
import type { VerticalQuantity } from '../../web/plots/spectrumPlotModel';
import type { PlotModel } from '../../web/plots/plotModel';

const QUANTITIES: VerticalQuantity[] = ['hc', 'omega', 'psd'];

const USAGE = `strainsheet plot FILE [--plot NAME] [--quantity hc|omega|psd] [--size SIZE] (--svg OUT | --pdf OUT)... [--set name=formula]...

Draws one of the app's plots of the sheet FILE as a figure file.
  --plot NAME          spectrum (default), or a breakdown the sheet has (see the error for the names)
  --quantity Q         vertical axis of the spectrum: hc (h_c, default), omega (Omega_gw), psd (residual power)
  --size SIZE          ${FIGURE_SIZE_IDS.map((s) => `${s} (${FIGURE_SIZES[s].label})`).join(', ')}; default column
  --svg OUT            write an SVG 1.1 file
  --pdf OUT            write a vector PDF with its font embedded
  --set name=formula   replace a cell's formula, or add the cell (repeatable)
Exit status: 0 written, 1 the plot has nothing to draw, 2 bad file or command line.`;

export const plotCommand: Command = {
  summary: 'draw a plot of a sheet as an SVG or PDF figure',
  usage: USAGE,
  async run(args, io) {
    const opts = parseOptions(args, { flags: ['help'], values: ['plot', 'quantity', 'size', 'svg', 'pdf', 'set'] });
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
    const quantity = one('quantity', 'hc');
    if (!QUANTITIES.includes(quantity as VerticalQuantity)) throw new UsageError(`--quantity must be one of ${QUANTITIES.join(', ')}, got "${quantity}"`);
    const svgOut = one('svg', '');
    const pdfOut = one('pdf', '');
    if (!svgOut && !pdfOut) throw new UsageError('give --svg OUT or --pdf OUT (or both)');
    const sheet = loadSheet(opts.positional[0]);
    applySetOptions(sheet, opts.values.get('set') ?? []);
    const reader = { cells: sheet.cells(), valueOf: (n: string) => sheet.value(n), stateOf: (n: string) => sheet.state(n) };
    const plot = one('plot', 'spectrum');
    let model: PlotModel | undefined;
    if (plot === 'spectrum') model = sheetSpectrumModel(reader, quantity as VerticalQuantity);
    else {
      const all = breakdownModels(reader.cells, reader.valueOf);
      model = all.find((m) => m.id === plot);
      if (!model) {
        io.err(`strainsheet plot: this sheet has no plot "${plot}"; it has: ${['spectrum', ...all.map((m) => m.id)].join(', ')}\n`);
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
      writeFileSync(pdfOut, await svgElementToPdf(svgElementFromText(svg), layout.width, layout.height, font, model.title));
    }
    return EXIT_OK;
  },
};
