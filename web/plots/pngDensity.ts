// Records the print resolution in a PNG: a pHYs chunk (W3C PNG specification, 2003, section
// 11.3.5.3: pixels per metre, unit 1 = metre) inserted after IHDR, with its CRC-32 (ISO 3309, as
// the PNG specification's annex D computes it). Browsers' canvas encoders write none.

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

export function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

/** The PNG with a pHYs chunk saying dpi (rounded to whole pixels per metre); an existing one is kept. */
export function withDensity(png: Uint8Array, dpi: number): Uint8Array {
  const ihdrEnd = 8 + 8 + 13 + 4; // signature, IHDR length+type, IHDR data, CRC
  const type = (at: number) => String.fromCharCode(...png.subarray(at + 4, at + 8));
  for (let at = 8; at + 8 <= png.length; ) {
    const len = new DataView(png.buffer, png.byteOffset + at).getUint32(0);
    if (type(at) === 'pHYs') return png;
    if (type(at) === 'IDAT') break;
    at += 12 + len;
  }
  const ppm = Math.round(dpi / 0.0254);
  const chunk = new Uint8Array(21);
  const dv = new DataView(chunk.buffer);
  dv.setUint32(0, 9);
  chunk.set([0x70, 0x48, 0x59, 0x73], 4); // "pHYs"
  dv.setUint32(8, ppm);
  dv.setUint32(12, ppm);
  chunk[16] = 1;
  dv.setUint32(17, crc32(chunk.subarray(4, 17)));
  const out = new Uint8Array(png.length + chunk.length);
  out.set(png.subarray(0, ihdrEnd));
  out.set(chunk, ihdrEnd);
  out.set(png.subarray(ihdrEnd), ihdrEnd + chunk.length);
  return out;
}
