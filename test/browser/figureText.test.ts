// The figure's text and PNG helpers in node: the trade's notation as sub- and superscript runs, tick
// labels, and the PNG density chunk.
import { describe, expect, it } from 'vitest';
import { richRuns, unicodeText, textWidth } from '../../web/plots/figureText';
import { formatTick, ticksFor } from '../../web/plots/axisTicks';
import { crc32, withDensity } from '../../web/plots/pngDensity';

describe('trade notation in figure text', () => {
  it('sets h_c, Omega_gw and A_yr with subscripts on one-letter or Greek bases, and leaves cell names alone', () => {
    expect(richRuns('characteristic strain h_c')).toEqual([{ text: 'characteristic strain h', shift: 'normal' }, { text: 'c', shift: 'sub' }]);
    expect(richRuns('Omega_gw(f)')).toEqual([{ text: 'Ω', shift: 'normal' }, { text: 'gw', shift: 'sub' }, { text: '(f)', shift: 'normal' }]);
    expect(richRuns('A_yr')).toEqual([{ text: 'A', shift: 'normal' }, { text: 'yr', shift: 'sub' }]);
    expect(richRuns('rate_norm = 2e-3')).toEqual([{ text: 'rate_norm = 2e-3', shift: 'normal' }]);
    expect(richRuns('by redshift (z_origin), f_ref')).toEqual([{ text: 'by redshift (z_origin), f', shift: 'normal' }, { text: 'ref', shift: 'sub' }]);
  });
  it('writes powers as superscripts with a typographic minus (Unicode U+2212)', () => {
    expect(richRuns('10^{-15}')).toEqual([{ text: '10', shift: 'normal' }, { text: '−15', shift: 'super' }]);
    expect(richRuns('rate (Mpc^-3 Gyr^-1)')).toEqual([
      { text: 'rate (Mpc', shift: 'normal' },
      { text: '−3', shift: 'super' },
      { text: ' Gyr', shift: 'normal' },
      { text: '−1', shift: 'super' },
      { text: ')', shift: 'normal' },
    ]);
    expect(unicodeText('10^{-15}')).toBe('10⁻¹⁵');
    expect(unicodeText('h_c')).toBe('h_c'); // Unicode has no subscript c: kept as written
    expect(unicodeText('A_yr')).not.toMatch(/A_YR/);
  });
  it('measures text with the embedded font’s widths (DejaVu Sans digits are 0.636 em)', () => {
    expect(textWidth('10', 10)).toBeCloseTo(12.72, 2);
  });
});

describe('ticks shared by the screen and the figures', () => {
  it('labels every decade 10^n and puts minor ticks at 2..9 x 10^n', () => {
    const t = ticksFor('log', 2e-9, 3e-7);
    expect(t.filter((x) => x.label).map((x) => x.label)).toEqual(['10^{-8}', '10^{-7}']);
    expect(t.filter((x) => !x.major).length).toBe(8 + 8 + 2); // 2..9e-9, 2..9e-8, 2e-7, 3e-7
  });
  it('labels every whole mantissa on an axis much shorter than a decade (an (A, gamma) amplitude axis: 2.2e-15 to 7e-15), where 2 and 5 alone would give one label (common practice, no source)', () => {
    const t = ticksFor('log', 2.2e-15, 7e-15);
    expect(t.filter((x) => x.label).map((x) => Number(x.value.toPrecision(12)))).toEqual([3e-15, 4e-15, 5e-15, 6e-15, 7e-15]);
    expect(ticksFor('log', 1.5e-15, 6e-15).filter((x) => x.label).map((x) => Number(x.value.toPrecision(12)))).toEqual([2e-15, 3e-15, 4e-15, 5e-15, 6e-15]);
  });
  it('labels every third decade of eighteen (at most eight labels), keeping a major tick at each', () => {
    const t = ticksFor('log', 1e-20, 1e-3);
    expect(t.filter((x) => x.label).map((x) => x.label)).toEqual(['10^{-18}', '10^{-15}', '10^{-12}', '10^{-9}', '10^{-6}', '10^{-3}']);
    expect(t.filter((x) => x.major).length).toBe(18);
  });
  it('puts linear ticks on 1-2-5 steps with unlabelled minor ticks between', () => {
    const t = ticksFor('linear', -0.25, 0.75);
    expect(t.filter((x) => x.major).map((x) => x.value)).toEqual([-0.2, 0, 0.2, 0.4, 0.6]);
    expect(t.some((x) => !x.major && x.label === '')).toBe(true);
    expect(formatTick(2.5e-15)).toBe('2.5·10^{-15}');
  });
});

describe('PNG density chunk (W3C PNG specification 2003, 11.3.5.3)', () => {
  it('computes CRC-32 with the standard check value of "123456789" (0xCBF43926, ISO 3309 / PNG annex D)', () => {
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
  });
  it('inserts pHYs after IHDR with 300 dpi as 11811 pixels per metre', () => {
    // A minimal PNG head: signature, IHDR (1 x 1, 8-bit grey), IEND; IHDR's CRC is not checked here.
    const head = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 0, 0, 0, 0, 0, 0, 0, 0]);
    const iend = Uint8Array.from([0, 0, 0, 0, 0x49, 0x45, 0x4e, 0x44, 0xae, 0x42, 0x60, 0x82]);
    const png = new Uint8Array([...head, ...iend]);
    const out = withDensity(png, 300);
    const dv = new DataView(out.buffer);
    expect(String.fromCharCode(...out.subarray(37, 41))).toBe('pHYs');
    expect(dv.getUint32(41)).toBe(Math.round(300 / 0.0254));
    expect(out[49]).toBe(1);
    expect(dv.getUint32(50)).toBe(crc32(out.subarray(37, 50)));
    expect(withDensity(out, 300)).toBe(out); // already there: unchanged
  });
});
