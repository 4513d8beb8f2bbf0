// Long string literals in formulas (the encoded measurements of a sheet run to tens of thousands of
// characters) are read by the kept mathjs parser one character at a time, about 15 ms per start of
// the demo. Before parsing, each literal longer than LONG_STRING characters without a backslash (so
// that its value is its text) is replaced by a short placeholder, and the value is put back into the
// parsed tree. A replacement is kept only when every placeholder comes back as the value of exactly
// one string constant; otherwise the caller parses the original text (formulaCompiler.ts).

/** Literals longer than this many characters are taken out before parsing. */
export const LONG_STRING = 256;

export interface TakenStrings {
  /** The text with each long literal's content replaced by its placeholder. */
  text: string;
  /** Placeholder -> the literal's content. */
  strings: Map<string, string>;
}

/** The text with its long string literals taken out, or undefined when it has none. */
export function takeLongStrings(text: string): TakenStrings | undefined {
  if (text.length <= LONG_STRING) return undefined;
  const strings = new Map<string, string>();
  let out = '';
  let from = 0;
  let k = 0;
  // indexOf and a regular expression find the quotes, so the long contents are never walked in JavaScript
  const special = /["'#]/g;
  let m: RegExpExecArray | null;
  let nextSlash = -1; // the first backslash at or after the search position (Infinity: none)
  while ((m = special.exec(text)) !== null) {
    const i = m.index;
    const ch = text[i];
    if (ch === '#') {
      // a comment runs to the end of the line
      const end = text.indexOf('\n', i);
      if (end < 0) break;
      special.lastIndex = end + 1;
      continue;
    }
    let j = i + 1;
    let escaped = false;
    for (;;) {
      const close = text.indexOf(ch, j);
      if (nextSlash < j) nextSlash = text.indexOf('\\', j) < 0 ? Infinity : text.indexOf('\\', j);
      if (nextSlash !== Infinity && (close < 0 || nextSlash < close)) {
        escaped = true;
        j = nextSlash + 2;
        continue;
      }
      j = close;
      break;
    }
    if (j < 0) break; // not closed: the parser reports it
    if (!escaped && j - i - 1 > LONG_STRING) {
      let key: string;
      do key = `strainsheet long string ${k++}`;
      while (text.includes(key));
      strings.set(key, text.slice(i + 1, j));
      out += text.slice(from, i + 1) + key;
      from = j;
    }
    special.lastIndex = j + 1;
  }
  return strings.size === 0 ? undefined : { text: out + text.slice(from), strings };
}

interface Visitable {
  type: string;
  value?: unknown;
  traverse(callback: (node: Visitable) => void): void;
}

/**
 * Puts the literals back into the tree parsed from `taken.text`. False (the tree then must not be
 * used) unless each placeholder is the value of exactly one string constant.
 */
export function restoreLongStrings(tree: Visitable, taken: TakenStrings): boolean {
  const found = new Map<string, Visitable[]>();
  tree.traverse((node) => {
    if (node.type === 'ConstantNode' && typeof node.value === 'string' && taken.strings.has(node.value)) {
      const list = found.get(node.value) ?? [];
      list.push(node);
      found.set(node.value, list);
    }
  });
  if (found.size !== taken.strings.size) return false;
  for (const list of found.values()) if (list.length !== 1) return false;
  for (const [key, [node]] of found) node.value = taken.strings.get(key);
  return true;
}
