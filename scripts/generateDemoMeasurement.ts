// Writes the demo's INVENTED measurement (examples/data/): a free spectrum and an (A, gamma)
// posterior made from an invented model plus invented noise. No real array or measurement is
// described. Run: npx tsx scripts/generateDemoMeasurement.ts  (same seed, same files).
//
// How they are made (all numbers invented):
// - truth: h_c(f) = A (f/f_yr)^(-2/3) (1 + (f_bend/f)^kappa)^(-1/2), a power law bent at low
//   frequency as an environment would bend it;
// - free spectrum, bins f_k = k/T, k = 1..14, T = 14 yr: the bin's measured power is
//   y_k = log10(rho_s^2 + rho_n^2) + eps_k, eps_k ~ N(0, sigma_y), rho_s from the truth
//   (rho^2 = h_c^2/(12 pi^2 f^3 T)) and rho_n a white-noise level; samples of log10 rho_s are
//   drawn from L(x) = exp(-(log10(10^(2x) + rho_n^2) - y_k)^2 / (2 sigma_y^2)) under a uniform
//   prior on [-10, -4], by inverting its cdf on a 6,000-point grid;
// - (A, gamma): the truth's power-law fit over the lowest 5 bins (equal weights in log), moved by
//   one draw of the invented measurement error, then samples of that 2-D Gaussian.
import { writeFileSync } from 'node:fs';
import { F_YR_HZ, YEAR_S } from '../src/physics/constants';
import { seededRandom } from '../src/statistics/prng';
import { fitEffectivePowerLaw } from '../src/statistics/effectivePowerLaw';
import { rhoFromStrain } from '../src/statistics/freeSpectrum';

export const TRUTH = {
  amplitude: 2.7e-15,
  fBendHz: 3.5e-9,
  kappa: 10 / 3,
  spanYears: 14,
  bins: 14,
  log10RhoNoise: -7.8,
  sigmaY: 0.25,
  prior: [-10, -4] as const,
  samplesPerBin: 1500,
  agSamples: 3000,
  agSigmaLog10A: 0.1,
  agSigmaGamma: 0.45,
  agCorrelation: -0.8,
  seed: 20261202,
};

export function truthStrain(fHz: number, t = TRUTH): number {
  return t.amplitude * Math.pow(fHz / F_YR_HZ, -2 / 3) / Math.sqrt(1 + Math.pow(t.fBendHz / fHz, t.kappa));
}

function main(): void {
  const rng = seededRandom(TRUTH.seed);
  const T = TRUTH.spanYears * YEAR_S;
  const f = Array.from({ length: TRUTH.bins }, (_, k) => (k + 1) / T);
  const grid = Array.from({ length: 6000 }, (_, i) => TRUTH.prior[0] + ((i + 0.5) * (TRUTH.prior[1] - TRUTH.prior[0])) / 6000);
  const rn2 = Math.pow(10, 2 * TRUTH.log10RhoNoise);
  const columns: number[][] = f.map((fk) => {
    const rs = rhoFromStrain(truthStrain(fk), fk, T);
    const y = Math.log10(rs * rs + rn2) + TRUTH.sigmaY * rng.normal();
    const w = grid.map((x) => Math.exp(-0.5 * ((Math.log10(Math.pow(10, 2 * x) + rn2) - y) / TRUTH.sigmaY) ** 2));
    const cdf: number[] = [];
    w.reduce((a, b, i) => (cdf[i] = a + b), 0);
    const total = cdf[cdf.length - 1];
    const step = grid[1] - grid[0];
    return Array.from({ length: TRUTH.samplesPerBin }, () => {
      const u = rng.uniform() * total;
      let lo = 0;
      let hi = cdf.length - 1;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (cdf[mid] < u) lo = mid + 1;
        else hi = mid;
      }
      return grid[lo] + (rng.uniform() - 0.5) * step; // uniform within the grid cell
    });
  });
  const head = [
    '# INVENTED free spectrum for the Strainsheet demo (fictional Heronsgate Pulsar Array); no real data.',
    '# Made by scripts/generateDemoMeasurement.ts from an invented bent power law plus invented noise:',
    `# truth h_c = ${TRUTH.amplitude} (f/yr^-1)^(-2/3) (1 + (${TRUTH.fBendHz * 1e9} nHz/f)^${TRUTH.kappa.toFixed(4)})^(-1/2); T = ${TRUTH.spanYears} yr;`,
    `# white-noise level log10 rho_n = ${TRUTH.log10RhoNoise}; measured power scatter ${TRUTH.sigmaY} dex; seed ${TRUTH.seed}.`,
    `# Values: samples of log10 rho_k (s), rho_k^2 = h_c^2/(12 pi^2 f^3 T); prior uniform on [${TRUTH.prior[0]}, ${TRUTH.prior[1]}].`,
  ];
  const header = f.map((x) => `${(x * 1e9).toPrecision(10)} nHz`).join(',');
  const rows = Array.from({ length: TRUTH.samplesPerBin }, (_, i) => columns.map((c) => c[i].toFixed(5)).join(','));
  writeFileSync(new URL('../examples/data/heronsgate_free_spectrum.csv', import.meta.url), [...head, header, ...rows].join('\n') + '\n');

  const fit = fitEffectivePowerLaw(f, f.map((x) => truthStrain(x)), F_YR_HZ, 5);
  const { agSigmaLog10A: sa, agSigmaGamma: sg, agCorrelation: r } = TRUTH;
  const draw = () => {
    const z1 = rng.normal();
    const z2 = r * z1 + Math.sqrt(1 - r * r) * rng.normal();
    return [sa * z1, sg * z2];
  };
  const [da, dg] = draw();
  const centre = [fit.log10A + da, fit.gamma + dg];
  const ag = Array.from({ length: TRUTH.agSamples }, () => {
    const [a, g] = draw();
    return `${(centre[0] + a).toFixed(5)},${(centre[1] + g).toFixed(5)}`;
  });
  const agHead = [
    '# INVENTED (A, gamma) posterior for the Strainsheet demo (fictional Heronsgate Pulsar Array); no real data.',
    '# Made by scripts/generateDemoMeasurement.ts: the invented truth (see heronsgate_free_spectrum.csv) fitted',
    `# over its lowest 5 bins gives log10 A = ${fit.log10A.toFixed(4)}, gamma = ${fit.gamma.toFixed(4)} at f_ref = 1/yr; moved by one draw of`,
    `# an invented Gaussian error (sd ${sa} dex, ${sg}, correlation ${r}); samples of that Gaussian. Seed ${TRUTH.seed}.`,
  ];
  writeFileSync(new URL('../examples/data/heronsgate_A_gamma.csv', import.meta.url), [...agHead, 'log10_A,gamma', ...ag].join('\n') + '\n');
  writeFileSync(new URL('../examples/data/heronsgate_truth.json', import.meta.url), JSON.stringify({ note: 'INVENTED truth of the demo measurement (scripts/generateDemoMeasurement.ts)', ...TRUTH }, null, 2) + '\n');
  console.log('wrote examples/data/heronsgate_free_spectrum.csv, heronsgate_A_gamma.csv, heronsgate_truth.json');
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').pop()!)) main();
