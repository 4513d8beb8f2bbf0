// The code cache of the command-line bundle (bin/codeCache.mjs): a cache is used only for the very
// text it was made from, on this Node; a stale, damaged or refused cache, or a folder that cannot be
// written, never changes what runs. V8 itself checks only the text's length (V8 code cache,
// "source hash" of SerializedCodeData; common practice, no source), hence the same-length edit below.
import { execFileSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { crc32 } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
// @ts-expect-error plain JavaScript module of the command line's entry, without type declarations
import { loadWithCodeCache } from '../../bin/codeCache.mjs';

interface Loaded {
  exports: { answer(): number };
  cache: 'used' | 'absent' | 'stale' | 'damaged' | 'rejected';
  save(): boolean;
}
const load = loadWithCodeCache as (bundle: string, cache?: string) => Loaded;

const dir = mkdtempSync(join(tmpdir(), 'strainsheet-code-cache-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const bundle = join(dir, 'small.cjs');
const cache = `${bundle}.codecache`;

describe('code cache of a CommonJS bundle', () => {
  it('is written after a run without one, then used', () => {
    writeFileSync(bundle, 'module.exports = { answer: () => 40 + 2 };\n');
    const first = load(bundle);
    expect(first.cache).toBe('absent');
    expect(first.exports.answer()).toBe(42);
    expect(first.save()).toBe(true);
    const second = load(bundle);
    expect(second.cache).toBe('used');
    expect(second.exports.answer()).toBe(42);
    expect(second.save()).toBe(false); // nothing new to write
  });

  it('a cache of another text of the same length is not used', () => {
    writeFileSync(bundle, 'module.exports = { answer: () => 40 + 3 };\n');
    const edited = load(bundle);
    expect(edited.cache).toBe('stale');
    expect(edited.exports.answer()).toBe(43);
    expect(edited.save()).toBe(true);
    expect(load(bundle).cache).toBe('used');
  });

  it('a cache of another Node version is not used', () => {
    const bytes = readFileSync(cache);
    writeFileSync(cache, Buffer.from(bytes.toString('latin1').replace(process.version, 'v0.0.1'), 'latin1'));
    const other = load(bundle);
    expect(other.cache).toBe('stale');
    expect(other.exports.answer()).toBe(43);
  });

  it('damaged or truncated caches are not handed to V8', () => {
    load(bundle).save();
    const good = readFileSync(cache);
    const flipped = Buffer.from(good);
    flipped[flipped.length - 5] ^= 0xff;
    writeFileSync(cache, flipped);
    const a = load(bundle);
    expect(a.cache).toBe('damaged');
    expect(a.exports.answer()).toBe(43);
    writeFileSync(cache, good.subarray(0, good.length - 10));
    expect(load(bundle).cache).toBe('damaged');
    writeFileSync(cache, Buffer.from('no header line at all'));
    expect(load(bundle).cache).toBe('damaged');
    // A damaged cache is replaced by a good one.
    const b = load(bundle);
    expect(b.save()).toBe(true);
    expect(load(bundle).cache).toBe('used');
  });

  it('data that passes the header checks but V8 refuses is ignored', () => {
    // A text this process has not compiled yet (V8 would take a compiled one from memory, not the cache).
    const text = 'module.exports = { answer: () => 40 + 4 };\n';
    writeFileSync(bundle, text);
    const junk = Buffer.from('not V8 code cache data, but the header has the right hashes');
    // CRC-32 of the bytes, as 8 hex digits (node:zlib crc32)
    const crc = (data: string | Buffer) => crc32(data).toString(16).padStart(8, '0');
    const header = `strainsheet-code-cache 2 ${process.version} ${process.arch} ${crc(text)} ${crc(junk)} ${junk.length}\n`;
    writeFileSync(cache, Buffer.concat([Buffer.from(header, 'latin1'), junk]));
    const refused = load(bundle);
    expect(refused.cache).toBe('rejected');
    expect(refused.exports.answer()).toBe(44);
    expect(refused.save()).toBe(true);
  });

  it('a bundle that is not ASCII is read as UTF-8', () => {
    const other = join(dir, 'utf8.cjs');
    writeFileSync(other, 'module.exports = { answer: () => "\u00e9\u4e2d\u{1f600}".length * 10 + [..."\u00e9\u4e2d\u{1f600}"].length };\n');
    expect(readFileSync(other).some((b) => b >= 0x80)).toBe(true);
    const first = load(other);
    // 4 UTF-16 code units (the emoji is a surrogate pair), 3 code points
    expect(first.exports.answer()).toBe(43);
    first.save();
    expect(load(other).cache).toBe('used');
    expect(load(other).exports.answer()).toBe(43);
  });

  it('a cache that cannot be written is no error', () => {
    const blocked = join(dir, 'a-file');
    writeFileSync(blocked, 'not a folder');
    const loaded = load(bundle, join(blocked, 'small.cjs.codecache'));
    expect(loaded.cache).toBe('absent');
    expect(loaded.exports.answer()).toBe(44);
    expect(loaded.save()).toBe(false);
    expect(existsSync(join(blocked, 'small.cjs.codecache'))).toBe(false);
  });
});

describe('the command-line bundle with its code cache', () => {
  const root = fileURLToPath(new URL('../..', import.meta.url));
  it('evaluates the demo the same with no cache, a fresh cache and a damaged cache', () => {
    // A copy of the bundle, so the project's own cache is left alone.
    const copy = join(dir, 'strainsheet.cjs');
    copyFileSync(join(root, 'dist-cli', 'strainsheet.cjs'), copy);
    const runner = join(dir, 'run.mjs');
    writeFileSync(
      runner,
      `import { loadWithCodeCache } from ${JSON.stringify(join(root, 'bin', 'codeCache.mjs'))};
const loaded = loadWithCodeCache(${JSON.stringify(copy)});
let out = '';
const code = await loaded.exports.main(['evaluate', ${JSON.stringify(join(root, 'examples', 'demo.json'))}], { out: (s) => { out += s; }, err: (s) => { out += s; } });
loaded.save();
process.stdout.write(JSON.stringify({ cache: loaded.cache, code, out }));`,
    );
    const run = () => JSON.parse(execFileSync(process.execPath, [runner], { encoding: 'utf8' })) as { cache: string; code: number; out: string };
    const none = run();
    const used = run();
    const bytes = readFileSync(`${copy}.codecache`);
    bytes[bytes.length >> 1] ^= 0xff;
    writeFileSync(`${copy}.codecache`, bytes);
    const damaged = run();
    expect([none.cache, used.cache, damaged.cache]).toEqual(['absent', 'used', 'damaged']);
    expect(none.code).toBe(0);
    expect(used).toEqual({ ...none, cache: 'used' });
    expect(damaged).toEqual({ ...none, cache: 'damaged' });
    expect(none.out).toMatch(/^A_yr\s+2\.\d+e-15/m);
  }, 60_000);
});

describe('commands that load packages with import()', () => {
  const root = fileURLToPath(new URL('../..', import.meta.url));
  it('plot --pdf runs through the bin while a code cache is present', () => {
    const bin = join(root, 'bin', 'strainsheet.mjs');
    execFileSync(process.execPath, [bin, 'evaluate', join(root, 'examples', 'demo.json')], { encoding: 'utf8' });
    expect(existsSync(join(root, 'dist-cli', 'strainsheet.cjs.codecache'))).toBe(true);
    const pdf = join(dir, 'spectrum.pdf');
    execFileSync(process.execPath, [bin, 'plot', join(root, 'examples', 'demo.json'), '--pdf', pdf], { encoding: 'utf8' });
    expect(readFileSync(pdf).subarray(0, 5).toString('latin1')).toBe('%PDF-'); // PDF header (ISO 32000-1, 7.5.2)
  }, 60_000);
});

describe('import() in the command-line bundle', () => {
  const root = fileURLToPath(new URL('../..', import.meta.url));
  it('loads only the packages of plot --pdf (a new import() must go with a command in IMPORTING_COMMANDS of bin/strainsheet.mjs)', () => {
    const text = readFileSync(join(root, 'dist-cli', 'strainsheet.cjs'), 'utf8');
    const imported = [...text.matchAll(/\bimport\(\s*"([^"]+)"\s*\)/g)].map((m) => m[1]).sort();
    expect(imported).toEqual(['jspdf', 'linkedom', 'svg2pdf.js/dist/svg2pdf.es.js']);
    expect(readFileSync(join(root, 'bin', 'strainsheet.mjs'), 'utf8')).toMatch(/IMPORTING_COMMANDS = new Set\(\['plot'\]\)/);
  });
});
