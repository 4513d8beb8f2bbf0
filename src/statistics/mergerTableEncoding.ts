// Text encoding of a density table so that it lives inside the sheet file, as the argument of
// mergerTable("mt1;..."), our own format:
//   mt1;z=<nodes>;log10M=<nodes>;q=<nodes>;density=<base64url of the float64 values, little-endian>
// and for a histogram of merger events (bin edges, one mean density per bin):
//   mh1;z=<edges>;log10M=<edges>;q=<edges>;density=<...>
// Nodes are written as the shortest text that reads back as the same number; values keep all 64 bits.
import type { DensityTable } from '../physics/tabulatedPopulation';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';
const INDEX = new Int16Array(128).fill(-1);
for (let i = 0; i < 64; i++) INDEX[ALPHABET.charCodeAt(i)] = i;

export class TableEncodingError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'TableEncodingError';
  }
}

function toBase64Url(bytes: Uint8Array): string {
  let out = '';
  for (let i = 0; i < bytes.length; i += 3) {
    const b0 = bytes[i];
    const b1 = i + 1 < bytes.length ? bytes[i + 1] : 0;
    const b2 = i + 2 < bytes.length ? bytes[i + 2] : 0;
    const n = (b0 << 16) | (b1 << 8) | b2;
    const chars = i + 2 < bytes.length ? 4 : i + 1 < bytes.length ? 3 : 2;
    for (let c = 0; c < chars; c++) out += ALPHABET[(n >> (18 - 6 * c)) & 63];
  }
  return out;
}

function fromBase64Url(text: string, byteCount: number): Uint8Array {
  const need = Math.ceil((byteCount * 4) / 3);
  if (text.length !== need) throw new TableEncodingError(`density: ${byteCount / 8} values need ${need} characters, found ${text.length} (the text is damaged or cut)`);
  const out = new Uint8Array(byteCount);
  let o = 0;
  for (let i = 0; i < text.length; i += 4) {
    let n = 0;
    const chars = Math.min(4, text.length - i);
    for (let c = 0; c < 4; c++) {
      const code = c < chars ? text.charCodeAt(i + c) : 65;
      const v = code < 128 ? INDEX[code] : -1;
      if (v < 0) throw new TableEncodingError(`density: character ${i + c + 1} ("${text[i + c]}") is not part of the encoding`);
      n = (n << 6) | v;
    }
    for (let b = 0; b < chars - 1 && o < byteCount; b++) out[o++] = (n >> (16 - 8 * b)) & 255;
  }
  return out;
}

export function encodeDensityTable(t: DensityTable): string {
  const bytes = new Uint8Array(t.density.length * 8);
  const view = new DataView(bytes.buffer);
  t.density.forEach((v, i) => view.setFloat64(8 * i, v, true));
  const nodes = (a: Float64Array) => Array.from(a, (x) => String(x)).join(',');
  return `${t.binned ? 'mh1' : 'mt1'};z=${nodes(t.z)};log10M=${nodes(t.log10M)};q=${nodes(t.q)};density=${toBase64Url(bytes)}`;
}

export function decodeDensityTable(text: string): DensityTable {
  const parts = text.split(';');
  if (parts[0] !== 'mt1' && parts[0] !== 'mh1') throw new TableEncodingError(`expected text starting "mt1;" or "mh1;" (made by \`strainsheet import --kind merger-table\` or \`merger-events\`), found "${text.slice(0, 12)}"`);
  const binned = parts[0] === 'mh1';
  const fields = new Map<string, string>();
  for (const p of parts.slice(1)) {
    const eq = p.indexOf('=');
    if (eq < 0) throw new TableEncodingError(`field "${p.slice(0, 20)}" has no "="`);
    fields.set(p.slice(0, eq), p.slice(eq + 1));
  }
  const axis = (name: string): Float64Array => {
    const f = fields.get(name);
    if (f === undefined) throw new TableEncodingError(`the field ${name}= is missing`);
    const xs = f.split(',').map(Number);
    if (xs.some((x) => !Number.isFinite(x))) throw new TableEncodingError(`${name}: "${f.slice(0, 40)}" holds a value that is not a number`);
    return Float64Array.from(xs);
  };
  const z = axis('z');
  const log10M = axis('log10M');
  const q = axis('q');
  const d = fields.get('density');
  if (d === undefined) throw new TableEncodingError('the field density= is missing');
  const d0 = binned ? 1 : 0;
  const count = (z.length - d0) * (log10M.length - d0) * (q.length - d0);
  if (!(count > 0)) throw new TableEncodingError(`the grid needs at least 2 ${binned ? 'edges' : 'nodes'} on each axis`);
  const bytes = fromBase64Url(d, count * 8);
  const view = new DataView(bytes.buffer);
  const density = new Float64Array(count);
  for (let i = 0; i < count; i++) density[i] = view.getFloat64(8 * i, true);
  return binned ? { z, log10M, q, density, binned } : { z, log10M, q, density };
}
