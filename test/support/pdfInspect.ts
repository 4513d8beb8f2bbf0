// Reads what a test needs from a PDF (ISO 32000-1:2008) written by jsPDF: the page size, the fonts
// the page uses and whether their font files are embedded (section 9.9), and each text string with
// its position on the page, decoded through the font's ToUnicode CMap (section 9.10.3), with
// positions from the text matrix and the graphics state's CTM (sections 8.3.4, 8.4.4, 9.4.2).
import { inflateSync } from 'node:zlib';

export interface PdfText {
  text: string;
  /** Start of the string on the page, in points from the lower-left corner. */
  x: number;
  y: number;
  /** Advance of the string along the baseline (font widths x size), in points. */
  width: number;
  fontSize: number;
  font: string;
}

export interface PdfSummary {
  mediaBox: [number, number, number, number];
  /** Resource name of each font the page's text uses -> its BaseFont and whether a font file is embedded. */
  fontsUsed: Record<string, { baseFont: string; embedded: boolean }>;
  texts: PdfText[];
}

type Matrix = [number, number, number, number, number, number];
const mul = (m: Matrix, n: Matrix): Matrix => [
  m[0] * n[0] + m[1] * n[2],
  m[0] * n[1] + m[1] * n[3],
  m[2] * n[0] + m[3] * n[2],
  m[2] * n[1] + m[3] * n[3],
  m[4] * n[0] + m[5] * n[2] + n[4],
  m[4] * n[1] + m[5] * n[3] + n[5],
];

export function inspectPdf(bytes: Buffer): PdfSummary {
  const s = bytes.toString('latin1');
  const objects = new Map<number, { dict: string; stream?: string }>();
  for (const m of s.matchAll(/(\d+) 0 obj\s*([\s\S]*?)endobj/g)) {
    const body = m[2];
    const at = body.indexOf('stream');
    if (at < 0) {
      objects.set(Number(m[1]), { dict: body });
      continue;
    }
    const dict = body.slice(0, at);
    const start = (m.index ?? 0) + m[0].indexOf(body) + at + 'stream'.length + (body[at + 6] === '\r' ? 2 : 1);
    const end = s.indexOf('endstream', start);
    const raw = bytes.subarray(start, end);
    let stream: string;
    try {
      stream = /FlateDecode/.test(dict) ? inflateSync(raw).toString('latin1') : raw.toString('latin1');
    } catch {
      stream = '';
    }
    objects.set(Number(m[1]), { dict, stream });
  }
  const ref = (dict: string, key: string) => {
    const m = new RegExp(`/${key}\\s+(\\d+) 0 R`).exec(dict);
    return m ? Number(m[1]) : null;
  };
  const mb = /\/MediaBox\s*\[([^\]]*)\]/.exec(s);
  if (!mb) throw new Error('no /MediaBox');
  const mediaBox = mb[1].trim().split(/\s+/).map(Number) as [number, number, number, number];
  const fontDict = /\/Font\s*<<([^>]*)>>/.exec(s)?.[1] ?? '';
  const fontRefs = new Map([...fontDict.matchAll(/\/(F\d+)\s+(\d+) 0 R/g)].map((m) => [m[1], Number(m[2])]));
  // Per font: BaseFont, embedded file, ToUnicode map and glyph widths (/W of the descendant font).
  const fontInfo = (name: string) => {
    const obj = objects.get(fontRefs.get(name) ?? -1);
    if (!obj) throw new Error(`font ${name} is not defined`);
    const baseFont = /\/BaseFont\s*\/(\S+)/.exec(obj.dict)?.[1] ?? '?';
    const desc = /\/DescendantFonts\s*\[\s*(\d+) 0 R/.exec(obj.dict);
    const cid = desc ? objects.get(Number(desc[1])) : undefined;
    const descriptor = objects.get(ref((cid ?? obj).dict, 'FontDescriptor') ?? -1);
    const embedded = !!descriptor && /\/FontFile[23]?\s+\d+ 0 R/.test(descriptor.dict);
    const toUnicode = new Map<number, string>();
    const cmap = objects.get(ref(obj.dict, 'ToUnicode') ?? -1)?.stream ?? '';
    for (const m of cmap.matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>/g)) {
      const code = parseInt(m[1], 16);
      const hex = m[2];
      let text = '';
      for (let i = 0; i < hex.length; i += 4) text += String.fromCharCode(parseInt(hex.slice(i, i + 4), 16));
      toUnicode.set(code, text);
    }
    const widths = new Map<number, number>();
    const w = cid ? /\/W\s*\[([\s\S]*?)\]\s*\n/.exec(cid.dict)?.[1] ?? '' : '';
    for (const m of w.matchAll(/(\d+)\s*\[([^\]]*)\]/g)) m[2].trim().split(/\s+/).forEach((v, k) => widths.set(Number(m[1]) + k, Number(v)));
    return { baseFont, embedded, toUnicode, widths };
  };
  const cache = new Map<string, ReturnType<typeof fontInfo>>();
  const texts: PdfText[] = [];
  const fontsUsed: PdfSummary['fontsUsed'] = {};
  for (const obj of objects.values()) {
    if (!obj.stream || !/\bBT\b/.test(obj.stream)) continue;
    let ctm: Matrix = [1, 0, 0, 1, 0, 0];
    const stack: Matrix[] = [];
    let font = '';
    let size = 0;
    let tm: Matrix = [1, 0, 0, 1, 0, 0];
    const tokens = obj.stream.match(/<[0-9a-fA-F]*>|\/[^\s/<>[\]()]+|[-+]?\d*\.?\d+|[A-Za-z*'"]+/g) ?? [];
    const nums: number[] = [];
    let name = '';
    for (const t of tokens) {
      if (/^[-+]?\d*\.?\d+$/.test(t)) nums.push(Number(t));
      else if (t.startsWith('/')) name = t.slice(1);
      else if (t.startsWith('<')) {
        if (!cache.has(font)) cache.set(font, fontInfo(font));
        const info = cache.get(font)!;
        fontsUsed[font] = { baseFont: info.baseFont, embedded: info.embedded };
        const codes: number[] = [];
        for (let i = 1; i + 4 <= t.length - 1; i += 4) codes.push(parseInt(t.slice(i, i + 4), 16));
        const device = mul(tm, ctm);
        const width = codes.reduce((a, c) => a + (info.widths.get(c) ?? 1000), 0) * (size / 1000);
        const scale = Math.hypot(device[0], device[1]);
        texts.push({ text: codes.map((c) => info.toUnicode.get(c) ?? '\ufffd').join(''), x: device[4], y: device[5], width: width * scale, fontSize: size * Math.hypot(device[2], device[3]), font });
      } else {
        if (t === 'q') stack.push(ctm);
        else if (t === 'Q') ctm = stack.pop() ?? ctm;
        else if (t === 'cm') ctm = mul(nums.slice(-6) as Matrix, ctm);
        else if (t === 'Tf') {
          font = name;
          size = nums.at(-1) ?? 0;
        } else if (t === 'Tm') tm = nums.slice(-6) as Matrix;
        else if (t === 'BT') tm = [1, 0, 0, 1, 0, 0];
        nums.length = 0;
      }
    }
  }
  return { mediaBox, fontsUsed, texts };
}
