// Renaming a cell rewrites the formulas that refer to it. The user's text is kept as written:
// only identifier tokens equal to the old name are replaced, found by a scanner that follows the
// mathjs expression syntax (quoted text, number literals with exponents and radix prefixes,
// identifiers). The result is then parsed and its names compared with the original's, so a
// rename never silently changes what a formula means.
import type { MathNode } from 'mathjs';
import { lockedMath } from './lockedMath';

export interface IdentifierToken {
  name: string;
  start: number;
  end: number;
}

const isDigit = (c: string) => c >= '0' && c <= '9';
// mathjs accepts letters, _, $ and many non-ASCII letters in names; anything above ASCII is
// treated as a name character here, which can only make a token longer, never split one.
const isNameStart = (c: string) => /[A-Za-z_$]/.test(c) || c.charCodeAt(0) > 127;
const isNamePart = (c: string) => isNameStart(c) || isDigit(c);

/** Identifier tokens of a formula, in order, outside quoted text and number literals. */
export function identifierTokens(text: string): IdentifierToken[] {
  const tokens: IdentifierToken[] = [];
  let i = 0;
  while (i < text.length) {
    const c = text[i];
    if (c === '"' || c === "'") {
      i++;
      while (i < text.length && text[i] !== c) i += text[i] === '\\' ? 2 : 1;
      i++;
    } else if (isDigit(c) || (c === '.' && isDigit(text[i + 1] ?? ''))) {
      if (c === '0' && /[xbo]/i.test(text[i + 1] ?? '')) {
        // radix literal 0x1F, 0b101, 0o17, with an optional word-size suffix i32
        i += 2;
        while (i < text.length && /[0-9A-Fa-f.]/.test(text[i])) i++;
        if (text[i] === 'i' && isDigit(text[i + 1] ?? '')) {
          i++;
          while (isDigit(text[i] ?? '')) i++;
        }
        continue;
      }
      while (isDigit(text[i] ?? '')) i++;
      if (text[i] === '.') {
        i++;
        while (isDigit(text[i] ?? '')) i++;
      }
      if ((text[i] === 'e' || text[i] === 'E') && (isDigit(text[i + 1] ?? '') || (/[+-]/.test(text[i + 1] ?? '') && isDigit(text[i + 2] ?? '')))) {
        i += 2;
        while (isDigit(text[i] ?? '')) i++;
      }
    } else if (isNameStart(c)) {
      const start = i;
      while (i < text.length && isNamePart(text[i])) i++;
      tokens.push({ name: text.slice(start, i), start, end: i });
    } else {
      i++;
    }
  }
  return tokens;
}

/** Every name a parsed formula mentions (symbols, called functions, a function cell's name and parameters). */
export function mentionedNames(tree: MathNode): string[] {
  const names: string[] = [];
  tree.traverse((node) => {
    const n = node as MathNode & { name?: string; params?: string[] };
    if (n.type === 'SymbolNode') names.push(n.name!);
    else if (n.type === 'FunctionAssignmentNode') names.push(n.name!, ...n.params!);
    else if (n.type === 'AssignmentNode' && typeof n.name === 'string') names.push(n.name);
  });
  return names.sort();
}

/**
 * The formula with references to `oldName` replaced by `newName`. Returns undefined when the
 * rewritten text would not parse to the same formula with the name changed (then the caller
 * refuses the rename). A formula that does not parse is rewritten token by token unchecked.
 */
export function renameInFormula(text: string, oldName: string, newName: string): string | undefined {
  const tokens = identifierTokens(text).filter((t) => t.name === oldName && text[t.start - 1] !== '.');
  if (tokens.length === 0) return text;
  let out = '';
  let last = 0;
  for (const t of tokens) {
    out += text.slice(last, t.start) + newName;
    last = t.end;
  }
  out += text.slice(last);
  const { parse } = lockedMath();
  let before: MathNode;
  try {
    before = parse(text);
  } catch {
    return out;
  }
  try {
    const expected = mentionedNames(before).map((n) => (n === oldName ? newName : n)).sort();
    const actual = mentionedNames(parse(out));
    if (expected.length !== actual.length || expected.some((n, i) => n !== actual[i])) return undefined;
  } catch {
    return undefined;
  }
  return out;
}
