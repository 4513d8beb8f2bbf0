// Shows a formatted value with powers of ten and unit exponents as superscripts
// ("2.4e-15" becomes 2.4 × 10⁻¹⁵, "Mpc^-3" becomes Mpc⁻³), built as text nodes, never as HTML.
import { For } from 'solid-js';

export type TextPiece = { text: string; sup?: boolean };

const PATTERN = /(\d(?:\.\d+)?)e([+-]?\d+)|\^\(?(-?\d+(?:\.\d+)?(?:\/\d+)?)\)?/g;

/** Splits "1.5e-3 Mpc^-3" into pieces, some of them superscript. */
export function scientificPieces(text: string): TextPiece[] {
  const out: TextPiece[] = [];
  let last = 0;
  for (const m of text.matchAll(PATTERN)) {
    const at = m.index ?? 0;
    if (at > last) out.push({ text: text.slice(last, at) });
    if (m[1] !== undefined) {
      out.push({ text: m[1] === '1' ? '10' : `${m[1]} × 10` });
      out.push({ text: String(Number(m[2])).replace('-', '−'), sup: true });
    } else {
      out.push({ text: m[3].replace('-', '−'), sup: true });
    }
    last = at + m[0].length;
  }
  if (last < text.length) out.push({ text: text.slice(last) });
  return out;
}

export function ScientificText(props: { text: string }) {
  return <For each={scientificPieces(props.text)}>{(p) => (p.sup ? <sup>{p.text}</sup> : <>{p.text}</>)}</For>;
}
