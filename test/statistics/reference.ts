// Loads the scipy fixtures written by test/reference/generate_statistics.py.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const path = fileURLToPath(new URL('../reference/statistics_reference.json', import.meta.url));
export const reference = JSON.parse(readFileSync(path, 'utf8'));

/** Relative (or absolute near zero) closeness with a readable failure message. */
export function expectClose(actual: number, expected: number, tol: number, what: string): void {
  const err = Math.abs(actual - expected) / Math.max(Math.abs(expected), 1e-300);
  const ok = expected === 0 ? Math.abs(actual) <= tol : err <= tol;
  if (!ok) throw new Error(`${what}: expected ${expected}, got ${actual}, relative error ${err.toExponential(2)} > ${tol}`);
}
