// Figure sizes for exports: a journal's single column and full page width (the common two-column
// layouts set columns about 3.4 in wide and the page text about 7.1 in: common practice, no
// source), a 16:9 slide, and the screen size. Fonts in points stay readable at print size
// (journals ask for lettering of at least 6-7 pt in the printed figure: common practice, no source).

export type FigureSizeId = 'column' | 'double' | 'slides' | 'screen';

export interface FigureSize {
  id: FigureSizeId;
  label: string;
  /** Width of the figure in inches (the height follows the plot area and the legend). */
  widthIn: number;
  /** Height of the plot area over its width. */
  plotAspect: number;
  /** Axis titles, tick labels and legend text, in points. */
  labelPt: number;
  tickPt: number;
  legendPt: number;
  titlePt: number;
  /** Whether the plot's title is drawn (papers put it in the caption). */
  title: boolean;
  /** Scale of line widths given in screen pixels. */
  lineScale: number;
}

export const FIGURE_SIZES: Record<FigureSizeId, FigureSize> = {
  column: { id: 'column', label: 'journal column, 3.4 in', widthIn: 3.4, plotAspect: 0.7, labelPt: 8, tickPt: 7, legendPt: 6.5, titlePt: 9, title: false, lineScale: 0.55 },
  double: { id: 'double', label: 'journal page width, 7.1 in', widthIn: 7.1, plotAspect: 0.45, labelPt: 9, tickPt: 8, legendPt: 8, titlePt: 10, title: false, lineScale: 0.75 },
  slides: { id: 'slides', label: 'slide 16:9, 10 in', widthIn: 10, plotAspect: 0.42, labelPt: 16, tickPt: 14, legendPt: 13, titlePt: 18, title: true, lineScale: 1.5 },
  screen: { id: 'screen', label: 'screen, 800 px', widthIn: 800 / 96, plotAspect: 0.5, labelPt: 10, tickPt: 9, legendPt: 9, titlePt: 11, title: true, lineScale: 0.75 },
};

export const FIGURE_SIZE_IDS = Object.keys(FIGURE_SIZES) as FigureSizeId[];

/** Pixels per inch of the PNG export (print resolution for line art and text is commonly 300 dpi or more). */
export const PNG_DPI = 300;
