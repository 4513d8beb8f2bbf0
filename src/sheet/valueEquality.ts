// Whether a recomputed value equals the previous one, so that propagation can stop there.
// Numbers, Units and matrices compare by content; other objects (SheetObjects, functions) by identity.
import type { Matrix, Unit } from 'mathjs';
import { math } from './mathInstance';

export function sameValue(a: unknown, b: unknown): boolean {
  if (a === b) return typeof a !== 'number' || !Number.isNaN(a) || Number.isNaN(b as number);
  if (typeof a === 'number' && typeof b === 'number') return Number.isNaN(a) && Number.isNaN(b);
  if (math.isUnit(a) && math.isUnit(b)) {
    const ua = a as Unit & { value: number | null };
    const ub = b as Unit & { value: number | null };
    return ua.value === ub.value && ua.equalBase(ub) && ua.formatUnits() === ub.formatUnits();
  }
  if (math.isComplex(a) && math.isComplex(b)) {
    const ca = a as unknown as { re: number; im: number };
    const cb = b as unknown as { re: number; im: number };
    return ca.re === cb.re && ca.im === cb.im;
  }
  const ma = math.isMatrix(a);
  const mb = math.isMatrix(b);
  if ((ma || Array.isArray(a)) && (mb || Array.isArray(b))) {
    if (ma !== mb) return false;
    const sa = ma ? (a as Matrix).size() : null;
    const sb = mb ? (b as Matrix).size() : null;
    if (sa && sb && (sa.length !== sb.length || sa.some((d, i) => d !== sb[i]))) return false;
    const xa = (ma ? (a as Matrix).valueOf() : a) as unknown[];
    const xb = (mb ? (b as Matrix).valueOf() : b) as unknown[];
    if (xa.length !== xb.length) return false;
    for (let i = 0; i < xa.length; i++) if (!sameValue(xa[i], xb[i])) return false;
    return true;
  }
  return false;
}
