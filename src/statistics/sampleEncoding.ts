// Compact text encoding of posterior samples so a measurement lives inside the sheet file (our own
// format). Each column of samples is quantised to 12 bits between its own minimum and maximum and
// written as two base64url characters per sample:
//   <min>:<max>:<count>:<payload>       min and max with 17 significant digits
// A sample is then off by at most (max - min) / 8190 (half a step), e.g. 5e-4 dex over a 4-dex
// spread: far below any kernel width a few thousand samples give, so densities change by less than
// 1e-3 relative (checked in test/statistics/sampleEncoding.test.ts).
//
// Free spectrum:  fs1;quantity=log10rho|log10hc;span_s=<T>;thin=<k>;bins=<f_Hz>@<column>|<f_Hz>@<column>...
// (A, gamma):     ag1;fref_hz=<f>;thin=<k>;log10A=<column>;gamma=<column>
import type { FreeSpectrumData, FreeSpectrumQuantity } from './freeSpectrum';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';
const INDEX = new Int16Array(128).fill(-1);
for (let i = 0; i < 64; i++) INDEX[ALPHABET.charCodeAt(i)] = i;
const LEVELS = 4095;

/** Most characters of encoded text a cell may hold (the sheet's formulas are at most 200,000 characters). */
export const MAX_ENCODED_CHARS = 190_000;
/** Most samples in all (over every bin or both columns) that fit that limit: two characters each. */
export const MAX_ENCODED_SAMPLES = 90_000;

export class SampleEncodingError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SampleEncodingError';
  }
}

export function encodeColumn(x: ArrayLike<number>): string {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < x.length; i++) {
    if (x[i] < min) min = x[i];
    if (x[i] > max) max = x[i];
  }
  const span = max - min;
  const chars: string[] = new Array(x.length);
  for (let i = 0; i < x.length; i++) {
    const q = span > 0 ? Math.round(((x[i] - min) / span) * LEVELS) : 0;
    chars[i] = ALPHABET[q >> 6] + ALPHABET[q & 63];
  }
  return `${min.toPrecision(17)}:${max.toPrecision(17)}:${x.length}:${chars.join('')}`;
}

export function decodeColumn(text: string, what: string): Float64Array {
  const parts = text.split(':');
  if (parts.length !== 4) throw new SampleEncodingError(`${what}: expected min:max:count:samples, found ${parts.length} fields`);
  const min = Number(parts[0]);
  const max = Number(parts[1]);
  const count = Number(parts[2]);
  const payload = parts[3];
  if (!Number.isFinite(min) || !Number.isFinite(max) || !(max >= min)) throw new SampleEncodingError(`${what}: bad range ${parts[0]} to ${parts[1]}`);
  if (!(Number.isInteger(count) && count >= 0)) throw new SampleEncodingError(`${what}: bad sample count ${parts[2]}`);
  if (payload.length !== 2 * count) throw new SampleEncodingError(`${what}: ${count} samples need ${2 * count} characters, found ${payload.length} (the text is damaged or cut)`);
  const codes = asciiCodes(payload);
  const out = new Float64Array(count);
  const step = (max - min) / LEVELS;
  for (let i = 0; i < count; i++) {
    const c0 = codes[2 * i];
    const c1 = codes[2 * i + 1];
    const a = c0 < 128 ? INDEX[c0] : -1;
    const b = c1 < 128 ? INDEX[c1] : -1;
    if (a < 0 || b < 0) throw new SampleEncodingError(`${what}: character ${2 * i + (a < 0 ? 1 : 2)} of the samples is not part of the encoding`);
    out[i] = min + ((a << 6) | b) * step;
  }
  return out;
}

const UTF8 = new TextEncoder();

/**
 * The text's character codes as bytes, any character beyond ASCII as 255 (not of the encoding):
 * read by index, cheaper than a charCodeAt call per character while the code runs cold.
 */
function asciiCodes(text: string): Uint8Array {
  const bytes = UTF8.encode(text);
  if (bytes.length === text.length) return bytes; // ASCII only: one byte per character
  const codes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    codes[i] = c < 128 ? c : 255;
  }
  return codes;
}

function fields(text: string, tag: string, what: string): Map<string, string> {
  const parts = text.split(';');
  if (parts[0] !== tag) throw new SampleEncodingError(`${what}: the text does not start with "${tag}" (not an encoded ${what})`);
  const m = new Map<string, string>();
  for (const p of parts.slice(1)) {
    const eq = p.indexOf('=');
    if (eq < 0) throw new SampleEncodingError(`${what}: field "${p.slice(0, 20)}" has no "="`);
    m.set(p.slice(0, eq), p.slice(eq + 1));
  }
  return m;
}

function need(m: Map<string, string>, key: string, what: string): string {
  const v = m.get(key);
  if (v === undefined) throw new SampleEncodingError(`${what}: the field "${key}" is missing`);
  return v;
}

/** Free-spectrum samples (without the prior, which the cell states separately). */
export function encodeFreeSpectrum(data: Omit<FreeSpectrumData, 'prior'>, thin: number): string {
  const q = data.quantity === 'log10Rho' ? 'log10rho' : 'log10hc';
  const bins = data.samples.map((s, k) => `${data.frequencyHz[k].toPrecision(17)}@${encodeColumn(s)}`).join('|');
  return `fs1;quantity=${q};span_s=${data.spanS.toPrecision(17)};thin=${thin};bins=${bins}`;
}

export function decodeFreeSpectrum(text: string): Omit<FreeSpectrumData, 'prior'> & { thin: number } {
  const what = 'free spectrum';
  if (text.length > MAX_ENCODED_CHARS) throw new SampleEncodingError(`${what}: the text has ${text.length} characters; at most ${MAX_ENCODED_CHARS}`);
  const m = fields(text, 'fs1', what);
  const q = need(m, 'quantity', what);
  if (q !== 'log10rho' && q !== 'log10hc') throw new SampleEncodingError(`${what}: quantity must be log10rho or log10hc, found "${q}"`);
  const spanS = Number(need(m, 'span_s', what));
  const thin = Number(m.get('thin') ?? '1');
  const frequencyHz: number[] = [];
  const samples: Float64Array[] = [];
  need(m, 'bins', what)
    .split('|')
    .forEach((b, k) => {
      const at = b.indexOf('@');
      if (at < 0) throw new SampleEncodingError(`${what}: bin ${k + 1} has no frequency@samples`);
      frequencyHz.push(Number(b.slice(0, at)));
      samples.push(decodeColumn(b.slice(at + 1), `${what}, bin ${k + 1}`));
    });
  const quantity: FreeSpectrumQuantity = q === 'log10rho' ? 'log10Rho' : 'log10Hc';
  return { quantity, spanS, frequencyHz: Float64Array.from(frequencyHz), samples, thin };
}

export function encodeAmplitudeGamma(log10A: ArrayLike<number>, gamma: ArrayLike<number>, fRefHz: number, thin: number): string {
  return `ag1;fref_hz=${fRefHz.toPrecision(17)};thin=${thin};log10A=${encodeColumn(log10A)};gamma=${encodeColumn(gamma)}`;
}

export function decodeAmplitudeGamma(text: string): { log10A: Float64Array; gamma: Float64Array; fRefHz: number; thin: number } {
  const what = '(A, gamma) samples';
  if (text.length > MAX_ENCODED_CHARS) throw new SampleEncodingError(`${what}: the text has ${text.length} characters; at most ${MAX_ENCODED_CHARS}`);
  const m = fields(text, 'ag1', what);
  const fRefHz = Number(need(m, 'fref_hz', what));
  const thin = Number(m.get('thin') ?? '1');
  const log10A = decodeColumn(need(m, 'log10A', what), `${what}, log10A`);
  const gamma = decodeColumn(need(m, 'gamma', what), `${what}, gamma`);
  if (log10A.length !== gamma.length) throw new SampleEncodingError(`${what}: ${log10A.length} log10A samples but ${gamma.length} gamma samples`);
  return { log10A, gamma, fRefHz, thin };
}

/** Smallest whole thinning factor that brings `total` samples within `limit`. */
export function thinningFactor(total: number, limit: number): number {
  return total <= limit ? 1 : Math.ceil(total / limit);
}

/** Every k-th sample, starting with the first. */
export function thinSamples(x: ArrayLike<number>, k: number): Float64Array {
  const out = new Float64Array(Math.ceil(x.length / k));
  for (let i = 0, j = 0; i < x.length; i += k, j++) out[j] = x[i];
  return out;
}
