// Speed of the realisations (issue 13). Target: 1,000 realisations of the demo population over 30
// bins in under 2 s on one core. Run with `npm run bench`.
//
// The demo sheet (examples/demo.json, an invented scenario) is loaded once, outside the timed
// functions; its population, cosmology, span and first 30 array bins are taken from the sheet.
// "cells + draws" builds the per-bin cells (24 z x 192 log10M x 6 q nodes per bin) and draws the
// realisations at the default threshold; the other entries time the two parts and other thresholds.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';
import type { Matrix, Unit } from 'mathjs';
import type { PopulationValue } from '../src/builtins/populationValue';
import { realisationCells } from '../src/physics/realisationCells';
import { drawRealisations } from '../src/physics/binaryRealisations';

const sheet = Sheet.fromFile(readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8'));
const pop = sheet.value('pop') as PopulationValue;
const freqs = Float64Array.from(((sheet.value('freqs') as Matrix).toArray() as unknown as Unit[]).slice(0, 30).map((u) => (u as Unit & { value: number }).value));
const span = (sheet.value('array_span') as Unit & { value: number }).value;
const cosmo = pop.cosmology!;
const cells = realisationCells(pop.population, cosmo, freqs, span);
const cells100 = realisationCells(pop.population, cosmo, freqs, span, { threshold: 100 });

describe('realisations of the demo population, 30 bins', () => {
  bench('1,000 realisations: cells + draws (default threshold K = 30)', () => {
    drawRealisations(realisationCells(pop.population, cosmo, freqs, span), 1, 0, 1000);
  });
  bench('cells only', () => {
    realisationCells(pop.population, cosmo, freqs, span);
  });
  bench('1,000 realisations: draws only, K = 30', () => {
    drawRealisations(cells, 2, 0, 1000);
  });
  bench('1,000 realisations: draws only, K = 100', () => {
    drawRealisations(cells100, 3, 0, 1000);
  });
});
