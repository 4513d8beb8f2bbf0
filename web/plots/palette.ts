// Strainsheet's own colours: deep ink, a slate blue family for model curves, ochre for what was
// measured. Chosen to stay distinct in greyscale print (different lightness) and for common
// colour-vision deficiencies (blue/orange contrast).

export const INK = '#1f2a36';
export const MEASURED_COLOR = '#c77d14';
export const BINS_COLOR = '#8a4f0b';
/** Realisations of a finite population: a slate violet apart from the model curves. */
export const REALISATION_COLOR = '#5b4a8b';

const CURVES = ['#1d4e89', '#3f8f8b', '#7a4e9c', '#5f6b2a', '#b0435d', '#2f6fb8', '#6b6f76', '#0e6b58'];

export function curveColor(i: number): string {
  return CURVES[((i % CURVES.length) + CURVES.length) % CURVES.length];
}
