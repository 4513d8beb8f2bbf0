// Reading a formula around the caret: the name being typed (for completion) and the function
// whose argument list the caret is in (for the help beside the formula box).

const IDENT_CHAR = /[A-Za-z0-9_]/;

/** The identifier that ends at the caret, if any (it must start with a letter or underscore). */
export function wordBeforeCaret(text: string, caret: number): { start: number; word: string } | null {
  let i = caret;
  while (i > 0 && IDENT_CHAR.test(text[i - 1])) i--;
  const word = text.slice(i, caret);
  if (!word || /^[0-9]/.test(word)) return null;
  // Inside a string literal nothing is a name.
  if (insideString(text, i)) return null;
  return { start: i, word };
}

/** Name of the innermost unclosed call around the caret, and which argument (0-based) it is in. */
export function callAroundCaret(text: string, caret: number): { name: string; argIndex: number } | null {
  let depth = 0;
  let commas = 0;
  for (let i = caret - 1; i >= 0; i--) {
    const ch = text[i];
    if (ch === '"' || ch === "'") {
      // Skip back over a string literal.
      const open = text.lastIndexOf(ch, i - 1);
      if (open < 0) return null;
      i = open;
      continue;
    }
    if (ch === ')' || ch === ']') depth++;
    else if (ch === '[') {
      if (depth === 0) return null;
      depth--;
    } else if (ch === '(') {
      if (depth === 0) {
        let j = i;
        while (j > 0 && text[j - 1] === ' ') j--;
        let k = j;
        while (k > 0 && IDENT_CHAR.test(text[k - 1])) k--;
        const name = text.slice(k, j);
        return name && !/^[0-9]/.test(name) ? { name, argIndex: commas } : null;
      }
      depth--;
    } else if (ch === ',' && depth === 0) commas++;
  }
  return null;
}

function insideString(text: string, pos: number): boolean {
  let quote: string | null = null;
  for (let i = 0; i < pos; i++) {
    const ch = text[i];
    if (quote) {
      if (ch === '\\') i++;
      else if (ch === quote) quote = null;
    } else if (ch === '"' || ch === "'") quote = ch;
  }
  return quote !== null;
}

export interface Completion {
  name: string;
  kind: 'cell' | 'function' | 'built-in';
  detail: string;
}

/** Candidates for a prefix: exact-case prefix matches first, then case-insensitive ones. */
export function completionsFor(prefix: string, candidates: Completion[], limit = 8): Completion[] {
  if (!prefix) return [];
  const lower = prefix.toLowerCase();
  const exact = candidates.filter((c) => c.name.startsWith(prefix) && c.name !== prefix);
  const loose = candidates.filter((c) => !c.name.startsWith(prefix) && c.name.toLowerCase().startsWith(lower));
  return [...exact, ...loose].slice(0, limit);
}
