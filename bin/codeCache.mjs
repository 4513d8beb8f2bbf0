// Runs a CommonJS bundle (dist-cli/*.cjs) with V8's code cache, so that a start does not parse and
// compile its 1.4 MB again: the bundle is compiled as a script (node:vm) with the cached data kept
// next to it, and a run without a usable cache writes one after its work (node:vm, "cachedData",
// "script.createCachedData()"; Node 20 has no compile cache for ES modules).
//
// The cache file holds a header line and V8's data. It is used only when the header names this Node
// (version, architecture) and the CRC-32 of the bundle's bytes and of the data itself, so a cache left
// by another bundle (V8 checks only the text's length), a different Node or a damaged file is never
// handed to V8; V8's own checks (flags, version) come after. CRC-32 (node:zlib) rather than a
// cryptographic hash: node:crypto takes 3-7 ms to load, and no start of `evaluate` needs it otherwise. Writing goes through a temporary file
// and a rename, so parallel runs never read half a file; a folder that cannot be written is no error.
//
// import() does not work in a script compiled with a code cache (Node issue 43663): commands that
// load packages with it run the bundle through Node's loader instead (bin/strainsheet.mjs).
import { isAscii } from 'node:buffer';
import { accessSync, constants, readFileSync, renameSync, unlinkSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname } from 'node:path';
import vm from 'node:vm';
import { crc32 } from 'node:zlib';

const MAGIC = 'strainsheet-code-cache 2';
/** The header line is never longer than this (it is read before the data). */
const MAX_HEADER = 512;

/** The function CommonJS wraps a module's text in (as Node's loader does). */
const wrap = (source) => `(function (exports, require, module, __filename, __dirname) { ${source}\n});`;

const checksum = (bytes) => crc32(bytes).toString(16).padStart(8, '0');

function headerOf(sourceHash, dataHash, dataLength) {
  return `${MAGIC} ${process.version} ${process.arch} ${sourceHash} ${dataHash} ${dataLength}\n`;
}

/** The cached data for a source of hash `sourceHash`, or why there is none ('absent', 'stale', 'damaged'). */
function readCache(cachePath, sourceHash) {
  let bytes;
  try {
    bytes = readFileSync(cachePath);
  } catch {
    return { state: 'absent' };
  }
  const end = bytes.subarray(0, MAX_HEADER).indexOf(10);
  if (end < 0) return { state: 'damaged' };
  const fields = bytes.subarray(0, end).toString('latin1').split(' ');
  const data = bytes.subarray(end + 1);
  if (fields.length !== 7 || `${fields[0]} ${fields[1]}` !== MAGIC) return { state: 'damaged' };
  if (fields[2] !== process.version || fields[3] !== process.arch || fields[4] !== sourceHash) return { state: 'stale' };
  if (Number(fields[6]) !== data.length || fields[5] !== checksum(data)) return { state: 'damaged' };
  return { state: 'found', data };
}

/** Whether the cache's folder can be written (checked before the data is made: making it takes time). */
function writable(cachePath) {
  try {
    accessSync(dirname(cachePath), constants.W_OK);
    return true;
  } catch {
    return false;
  }
}

function writeCache(cachePath, sourceHash, data) {
  const temporary = `${cachePath}.${process.pid}.${Date.now()}.tmp`;
  try {
    writeFileSync(temporary, Buffer.concat([Buffer.from(headerOf(sourceHash, checksum(data), data.length), 'latin1'), data]));
    renameSync(temporary, cachePath);
    return true;
  } catch {
    try {
      unlinkSync(temporary);
    } catch {
      // nothing was written
    }
    return false;
  }
}

/**
 * Loads the CommonJS file `bundlePath` (its exports are returned) using the code cache at
 * `cachePath`. `cache` says what was found: 'used', or 'absent', 'stale', 'damaged' or 'rejected'
 * (refused by V8); call `save()` after the work, when the most functions are compiled: it writes a
 * new cache unless one was used, and tells whether it did.
 */
export function loadWithCodeCache(bundlePath, cachePath = `${bundlePath}.codecache`) {
  const bytes = readFileSync(bundlePath);
  const sourceHash = checksum(bytes);
  // esbuild writes ASCII (its default charset), which latin1 decodes as UTF-8 would, without the
  // decoder's checks (a tenth of the instructions for the 1.4 MB bundle)
  const source = bytes.toString(isAscii(bytes) ? 'latin1' : 'utf8');
  const found = readCache(cachePath, sourceHash);
  const script = new vm.Script(wrap(source), {
    filename: bundlePath,
    cachedData: found.data,
  });
  const cache = found.state === 'found' ? (script.cachedDataRejected ? 'rejected' : 'used') : found.state;
  const module = { exports: {} };
  script.runInThisContext().call(module.exports, module.exports, createRequire(bundlePath), module, bundlePath, dirname(bundlePath));
  return {
    exports: module.exports,
    cache,
    save: () => cache !== 'used' && writable(cachePath) && writeCache(cachePath, sourceHash, script.createCachedData()),
  };
}
