// The demo sheet (examples/demo.json) loaded through the sheet engine, for tests.
import { readFileSync } from 'node:fs';
import type { Matrix, Unit } from 'mathjs';
import { Sheet } from '../../src/sheet/sheet';

export function loadDemo(): Sheet {
  return Sheet.fromFile(readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8'));
}

/** SI values of a list of quantities. */
export function siValues(v: unknown): Float64Array {
  return Float64Array.from(((v as Matrix).toArray() as unknown as Unit[]).map((u) => (u as Unit & { value: number }).value));
}
