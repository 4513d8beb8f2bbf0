// The demo sheet (examples/demo.json): every cell evaluates, the names other parts rely on exist,
// A_yr equals the plain physics built from the sheet's own numbers (no builtin layer), and lands
// within a factor of three of the sheet's invented measured amplitude (the brief's requirement).
import { describe, expect, it } from 'vitest';
import { F_YR_HZ, GYR_S, MPC_M, M_SUN_KG } from '../../src/physics/constants';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import { isSheetObject } from '../../src/sheet/sheetObject';
import { loadDemo, siValues } from './demoSheet';
import { siOf } from './sheetHelpers';

const sheet = loadDemo();

describe('demo sheet', () => {
  it('every cell has a value', () => {
    for (const c of sheet.cells()) {
      const st = sheet.state(c.name);
      expect(st.status, `${c.name}: ${st.status === 'error' ? st.error.message : ''}`).toBe('value');
    }
  });
  it('has the cells the web app and statistics rely on: A_yr, spectrum, freqs, rate_norm', () => {
    expect(typeof sheet.value('A_yr')).toBe('number');
    const spec = sheet.value('spectrum');
    expect(isSheetObject(spec) && spec.kind).toBe('spectrum');
    expect(siValues(sheet.value('freqs')).length).toBe(40);
    expect(siOf(sheet.value('rate_norm'))).toBeGreaterThan(0);
  });
  it('every cell has a section, a note and a source', () => {
    const sections = new Set(sheet.cells().map((c) => c.section));
    for (const s of ['cosmology', 'population', 'orbits', 'array', 'measurement', 'results']) expect(sections.has(s)).toBe(true);
    for (const c of sheet.cells()) {
      expect(c.note?.length ?? 0, c.name).toBeGreaterThan(5);
      expect(c.source?.length ?? 0, c.name).toBeGreaterThan(5);
    }
  });
  it('A_yr equals the plain physics with the same numbers', () => {
    const cosmo = new FlatLambdaCdm({ hubbleSI: siOf(sheet.value('H0')), omegaM: siOf(sheet.value('omega_m')) });
    const pop = phenomenologicalPopulation({
      rateNorm: siOf(sheet.value('rate_norm')) * MPC_M ** 3 * GYR_S,
      alpha: siOf(sheet.value('mass_slope')),
      cutoffMass: siOf(sheet.value('cutoff_mass')) / M_SUN_KG,
      beta: 2.1, // the arguments of redshiftPowerExp in z_shape
      z0: 1.4,
      zMax: 5,
      log10MMin: Math.log10(siOf(sheet.value('min_mass')) / M_SUN_KG),
      log10MMax: Math.log10(siOf(sheet.value('max_mass')) / M_SUN_KG),
      massRatio: powerLawMassRatio(-0.4, 0.05), // the arguments of massRatioPowerLaw in q_shape
      cosmology: cosmo,
    });
    expect(sheet.get('z_shape')?.formula).toBe('redshiftPowerExp(2.1, 1.4, 5)');
    expect(sheet.get('q_shape')?.formula).toBe('massRatioPowerLaw(-0.4, 0.05)');
    const expected = Math.sqrt(characteristicStrainSquared(pop, [F_YR_HZ])[0]);
    expect(Math.abs((sheet.value('A_yr') as number) / expected - 1)).toBeLessThan(1e-12);
  });
  it('A_yr lies within a factor of three of the invented measured amplitude', () => {
    const ratio = (sheet.value('A_yr') as number) / (sheet.value('measured_A') as number);
    expect(ratio).toBeGreaterThan(1 / 3);
    expect(ratio).toBeLessThan(3);
  });
  it('names no real array: the invented array is the Heronsgate Pulsar Array', () => {
    expect(sheet.notes).toMatch(/fictional/);
    expect(JSON.stringify(sheet.toFile())).toMatch(/Heronsgate/);
  });
});
