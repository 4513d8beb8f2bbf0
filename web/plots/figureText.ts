// Axis, tick and legend text in the trade's notation, as runs of normal, subscript and superscript
// text: h_c -> h with subscript c, Omega_gw -> Ω with subscript gw, 10^-15 -> 10 with superscript
// −15, Mpc^-3 -> Mpc with superscript −3. Only one-letter (or Greek) bases take a subscript of at
// most three characters, so cell names such as rate_norm or z_origin stay as written; nothing is
// ever upper-cased (A_yr stays A_yr).
// DOM-free: used by the SVG figure writer, the screen's labels and the command line.
import { WIDTHS_EM } from './textWidths';

export type Shift = 'normal' | 'sub' | 'super';
export interface TextRun {
  text: string;
  shift: Shift;
}

const GREEK: Record<string, string> = { Omega: 'Ω', gamma: 'γ', rho: 'ρ', sigma: 'σ', alpha: 'α', tau: 'τ', mu: 'µ', Delta: 'Δ', delta: 'δ', chi: 'χ' };

/** Greek letters for their spelled-out names (whole words, or before a subscript: Omega_gw). */
export function withGreek(text: string): string {
  return text.replace(/\b(Omega|gamma|rho|sigma|alpha|tau|mu|Delta|delta|chi)(?=_|\b)/g, (w) => GREEK[w] ?? w);
}

/** A typographic minus for a hyphen used as a sign (before a digit, after start, space, (, ^, = or e). */
function minusSigns(text: string): string {
  return text.replace(/(^|[\s(^=,{])-(?=\d|\.\d)/g, '$1−');
}

/**
 * Splits text into runs: `_x` after a one-letter or Greek base is a subscript (letters and digits,
 * or `_{...}`); `^x` is a superscript (optional sign, then digits, letters, '.' and '/', or `^{...}`).
 */
export function richRuns(raw: string): TextRun[] {
  const text = withGreek(raw);
  const runs: TextRun[] = [];
  const push = (t: string, shift: Shift) => {
    if (!t) return;
    const last = runs.at(-1);
    if (last && last.shift === shift) last.text += t;
    else runs.push({ text: t, shift });
  };
  // A subscript is short (c, gw, yr, ref): a longer word after the underscore is part of a name (z_origin).
  const re = /(?<![A-Za-z0-9_])([A-Za-zΑ-Ωα-ωµ])_(\{[^}]*\}|[A-Za-z0-9]{1,3}(?![A-Za-z0-9_]))|\^(\{[^}]*\}|[-+−]?[0-9A-Za-z./]+)/g;
  let at = 0;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    push(text.slice(at, m.index), 'normal');
    if (m[1] !== undefined) {
      push(m[1], 'normal');
      push(unbrace(m[2]), 'sub');
    } else {
      push(minusSigns(unbrace(m[3]).replace(/^-/, '−')), 'super');
    }
    at = m.index + m[0].length;
  }
  push(text.slice(at), 'normal');
  return runs.map((r) => (r.shift === 'normal' ? { ...r, text: minusSigns(r.text) } : r));
}

function unbrace(s: string): string {
  return s.startsWith('{') && s.endsWith('}') ? s.slice(1, -1) : s;
}

/** Size of sub- and superscript text relative to the line's font size. */
export const SCRIPT_SCALE = 0.72;

/** Width in the unit of fontSize of text in DejaVu Sans (unknown characters count as 0.6 em). */
export function textWidth(text: string, fontSize: number): number {
  let em = 0;
  for (const ch of text) em += WIDTHS_EM[ch] ?? 0.6;
  return em * fontSize;
}

/** Width of rich text: scripts are set at SCRIPT_SCALE. */
export function runsWidth(runs: TextRun[], fontSize: number): number {
  return runs.reduce((w, r) => w + textWidth(r.text, r.shift === 'normal' ? fontSize : fontSize * SCRIPT_SCALE), 0);
}

const SUPER_DIGITS: Record<string, string> = { '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', '−': '⁻', '-': '⁻', '+': '⁺' };
const SUB_CHARS: Record<string, string> = { '0': '₀', '1': '₁', '2': '₂', '3': '₃', '4': '₄', '5': '₅', '6': '₆', '7': '₇', '8': '₈', '9': '₉', a: 'ₐ', e: 'ₑ', h: 'ₕ', k: 'ₖ', l: 'ₗ', m: 'ₘ', n: 'ₙ', o: 'ₒ', p: 'ₚ', s: 'ₛ', t: 'ₜ', x: 'ₓ' };

/**
 * One line of plain Unicode for places that cannot set scripts (the chart on screen, window
 * titles): superscripts and subscripts with Unicode's script characters where every character has
 * one, else the marked-up form (h_c stays h_c: Unicode has no subscript c).
 */
export function unicodeText(raw: string): string {
  return richRuns(raw)
    .map((r) => {
      if (r.shift === 'normal') return r.text;
      const table = r.shift === 'super' ? SUPER_DIGITS : SUB_CHARS;
      const chars = [...r.text];
      if (chars.every((c) => table[c])) return chars.map((c) => table[c]).join('');
      return (r.shift === 'super' ? '^' : '_') + r.text;
    })
    .join('');
}
