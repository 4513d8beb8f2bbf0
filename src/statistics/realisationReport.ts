// Plain-text outputs of a realisations run that the command line (`strainsheet realise --csv`) and
// the app (its CSV export) share, so both write the same bytes for the same seed.
import type { RealisationSummary } from './realisationSummary';

/** What the per-bin table needs of a run (RealiseResult, or the app's copy of it without the draws). */
export interface RealisationBinsRun {
  cell: string;
  count: number;
  seed: number;
  threshold: number | 'all';
  dropLongResidence: boolean;
  frequencyHz: ArrayLike<number>;
  smoothHc: ArrayLike<number>;
  expectedCount: ArrayLike<number>;
  longResidenceH2Fraction: ArrayLike<number>;
  summary: RealisationSummary;
}

function num(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(15))) : '';
}

/** The comment line heading both CSV files of a run. */
export function realisationCsvHead(r: Omit<RealisationBinsRun, 'frequencyHz' | 'smoothHc' | 'expectedCount' | 'longResidenceH2Fraction' | 'summary'>): string {
  return `# ${r.count} realisations of ${r.cell}, seed ${r.seed}, threshold ${r.threshold}${r.dropLongResidence ? ', long-residence cells dropped' : ''}; outshine: loudest h^2 > sum of the other binaries' h^2 in the bin`;
}

export const REALISATION_BIN_COLUMNS = [
  'frequency [nHz]',
  'smooth_hc',
  'mean_hc',
  'rms_hc',
  'median_hc',
  'lower68_hc',
  'upper68_hc',
  'lower95_hc',
  'upper95_hc',
  'outshine_probability',
  'outshine_error',
  'median_loudest_strain',
  'expected_binaries',
  'long_residence_hc2_fraction',
];

/** One row per bin: the smooth h_c, the bands over the realisations, the outshine outlook, counts. */
export function realisationBinsCsv(r: RealisationBinsRun): string {
  const s = r.summary;
  const lines = [realisationCsvHead(r), REALISATION_BIN_COLUMNS.join(',')];
  for (let k = 0; k < r.frequencyHz.length; k++) {
    lines.push(
      [r.frequencyHz[k] * 1e9, r.smoothHc[k], s.meanHc[k], s.rmsHc[k], s.medianHc[k], s.lower68[k], s.upper68[k], s.lower95[k], s.upper95[k], s.outshineProbability[k], s.outshineError[k], s.medianLoudestStrain[k], r.expectedCount[k], r.longResidenceH2Fraction[k]]
        .map(num)
        .join(','),
    );
  }
  return lines.join('\n') + '\n';
}
