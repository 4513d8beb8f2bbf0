// Engine benchmarks (targets: editing the head of a 10,000-cell chain and recalculating < 50 ms
// median). Run with `npm run bench`.
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';
import { compileFormula } from '../src/sheet/formulaCompiler';
import type { CellSpec } from '../src/sheet/types';

function chain(n: number): Sheet {
  const cells: CellSpec[] = [{ name: 'c0', formula: '0' }];
  for (let i = 1; i < n; i++) cells.push({ name: `c${i}`, formula: `c${i - 1} + 1` });
  return new Sheet({ cells });
}

describe('10,000-cell chain', () => {
  const s = chain(10_000);
  let k = 0;
  bench('edit the head and recalculate all 10,000 cells (target < 50 ms)', () => {
    s.updateCell('c0', { formula: String(++k) });
  }, { time: 3000, warmupIterations: 3 });
});

describe('1,000-cell sheet with wide fan-out', () => {
  // one input read by 999 cells
  const cells: CellSpec[] = [{ name: 'hub', formula: '1' }];
  for (let i = 1; i < 1000; i++) cells.push({ name: `leaf${i}`, formula: `hub * ${i} + sqrt(${i})` });
  const s = new Sheet({ cells });
  let k = 1;
  bench('edit the hub and recalculate its 999 readers', () => {
    s.updateCell('hub', { formula: String(++k) });
  }, { time: 3000 });
  bench('evaluateWith the hub replaced, one output', () => {
    s.evaluateWith({ hub: ++k }, ['leaf500']);
  }, { time: 2000 });
  bench('evaluateWith the hub replaced, all 999 outputs', () => {
    s.evaluateWith({ hub: ++k }, cells.slice(1).map((c) => c.name));
  }, { time: 3000 });
});

describe('parse and compile', () => {
  // Fresh names on every run, so that no lookup remembered from an earlier run helps.
  let run = 0;
  bench('parse + allow-list walk + compile 1,000 formulas (names never seen before)', () => {
    const p = `r${++run}_`;
    for (let i = 0; i < 1000; i++) {
      compileFormula(`sqrt(${p}x${i} ^ 2 + 3 km/s * ${p}y${i}) * (${p}z${i} > 0 ? 1 : -1) + [1, 2, 3][${(i % 3) + 1}]`, `cell${i}`);
    }
  }, { time: 3000 });
  const same = Array.from({ length: 1000 }, (_, i) => `sqrt(x${i % 50} ^ 2 + 3 km/s * y${i % 50}) * (z > 0 ? 1 : -1)`);
  bench('parse + allow-list walk + compile 1,000 formulas over 150 recurring names', () => {
    for (let i = 0; i < same.length; i++) compileFormula(same[i], `cell${i}`);
  }, { time: 3000 });
});
