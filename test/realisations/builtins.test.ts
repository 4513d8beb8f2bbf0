// The realisation built-ins on a sheet: values, argument errors naming the argument.
import { describe, expect, it } from 'vitest';
import type { Matrix } from 'mathjs';
import { loadDemo } from '../physics/demoSheet';

function numbers(v: unknown): number[] {
  return (v as Matrix).toArray() as number[];
}

describe('realisation built-ins on the demo sheet', () => {
  const sheet = loadDemo();
  sheet.setCell({ name: 'rz', formula: 'realiseBackground(pop, freqs, array_span, 40, 3)' });
  sheet.setCell({ name: 'rz_median', formula: 'realisedQuantile(rz, 0.5)' });
  sheet.setCell({ name: 'rz_low', formula: 'realisedQuantile(rz, 0.16)' });
  sheet.setCell({ name: 'rz_first', formula: 'realisationStrain(rz, 1)' });
  sheet.setCell({ name: 'rz_loud', formula: 'loudestBinaries(rz, 1)' });
  sheet.setCell({ name: 'rz_out', formula: 'outshineProbability(rz)' });
  sheet.setCell({ name: 'rz_long', formula: 'longResidenceFraction(rz)' });
  sheet.setCell({ name: 'rz_mean', formula: 'realisedMean(rz)' });

  it('gives one value per bin, bands ordered, probabilities in [0, 1]', () => {
    const st = sheet.state('rz');
    expect(st.status, st.status === 'error' ? st.error.message : '').toBe('value');
    const med = numbers(sheet.value('rz_median'));
    const low = numbers(sheet.value('rz_low'));
    expect(med.length).toBe(40);
    med.forEach((m, k) => expect(low[k]).toBeLessThanOrEqual(m));
    numbers(sheet.value('rz_out')).forEach((p) => expect(p >= 0 && p <= 1).toBe(true));
    numbers(sheet.value('rz_long')).forEach((p) => expect(p >= 0 && p <= 1).toBe(true));
    expect(numbers(sheet.value('rz_first')).length).toBe(40);
    expect(numbers(sheet.value('rz_mean')).length).toBe(40);
    const loud = (sheet.value('rz_loud') as Matrix).size();
    expect(loud).toEqual([40, 4]);
  });

  it('bad arguments name the built-in and the argument', () => {
    const s = loadDemo();
    s.setCell({ name: 'bad1', formula: 'realiseBackground(pop, freqs, array_span, 0, 3)' });
    s.setCell({ name: 'bad2', formula: 'realiseBackground(pop, freqs, array_span, 10, -1)' });
    s.setCell({ name: 'bad3', formula: 'realiseBackground(pop, freqs, array_span, 10, 1, -2)' });
    s.setCell({ name: 'rz', formula: 'realiseBackground(pop, freqs, array_span, 5, 1)' });
    s.setCell({ name: 'bad4', formula: 'realisationStrain(rz, 6)' });
    s.setCell({ name: 'bad5', formula: 'realisedQuantile(rz, 1.5)' });
    const msg = (c: string) => {
      const st = s.state(c);
      return st.status === 'error' ? st.error.message : `no error (${st.status})`;
    };
    expect(msg('bad1')).toMatch(/count.*realiseBackground|realiseBackground.*count/);
    expect(msg('bad2')).toMatch(/seed.*realiseBackground|realiseBackground.*seed/);
    expect(msg('bad3')).toMatch(/threshold.*realiseBackground|realiseBackground.*threshold/);
    expect(msg('bad4')).toMatch(/index.*realisationStrain|realisationStrain.*index/);
    expect(msg('bad5')).toMatch(/argument p of realisedQuantile/);
  });
});
