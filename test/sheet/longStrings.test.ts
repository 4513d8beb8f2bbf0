// Long string literals are taken out of a formula before parsing and put back (src/sheet/longStrings.ts).
// The reference is mathjs's own parser on the unchanged text (the kept parser, lockedMath().parse): the
// compiled tree must print the same and hold the same string values, whatever the quotes, escapes and
// comments around the literals.
import { describe, expect, it } from 'vitest';
import { compileFormula } from '../../src/sheet/formulaCompiler';
import { lockedMath } from '../../src/sheet/lockedMath';
import { LONG_STRING, takeLongStrings } from '../../src/sheet/longStrings';

const long = (seed: string) => seed.repeat(Math.ceil((LONG_STRING + 50) / seed.length));

function strings(tree: { traverse(cb: (n: { type: string; value?: unknown }) => void): void }): unknown[] {
  const out: unknown[] = [];
  tree.traverse((n) => {
    if (n.type === 'ConstantNode' && typeof n.value === 'string') out.push(n.value);
  });
  return out;
}

const cases: Array<[string, string]> = [
  ['double quotes', `concat("${long('ab;1.5@-7,')}", "x")`],
  ['single quotes holding double quotes and brackets', `concat('${long('a"(b[')}', "y")`],
  ['two long literals and a short one', `concat("${long('p')}", 'q', "${long('r')}")`],
  ['an escaped long literal (kept for the parser)', `concat("${long('a\\"b')}", "z")`],
  ['a comment with a quote before a long literal', `concat("${long('s')}", "t") # it's a comment`],
  ['a long quoted run inside a comment (not a literal)', `concat("short", "x") # it's "${long('v')}"`],
];

describe('long string literals', () => {
  for (const [what, text] of cases) {
    it(`${what}: the same tree and strings as mathjs parsing the text as it is`, () => {
      const reference = lockedMath().parse(text);
      const compiled = compileFormula(text, 'cell', new Set(['concat']));
      if (compiled.kind !== 'expression') throw new Error(`not compiled: ${JSON.stringify(compiled)}`);
      expect(compiled.tree.toString()).toBe(reference.toString());
      expect(strings(compiled.tree as never)).toEqual(strings(reference as never));
    });
  }

  it('takes out only unescaped literals longer than the limit', () => {
    expect(takeLongStrings(`"${'a'.repeat(LONG_STRING)}" + 1`)).toBeUndefined();
    expect(takeLongStrings(`"${long('a\\"')}"`)).toBeUndefined();
    const taken = takeLongStrings(`f("${long('a')}", 'b')`)!;
    expect(taken.strings.size).toBe(1);
    expect(taken.text.length).toBeLessThan(60);
  });

  it('a text that does not parse gives the error of the text as written (positions included)', () => {
    const text = `concat("${long('a')}", ) + `;
    const compiled = compileFormula(text, 'cell', new Set(['concat']));
    expect(compiled.kind).toBe('error');
    let message = '';
    try {
      lockedMath().parse(text);
    } catch (e) {
      message = (e as Error).message.replace(/\s*\(char \d+\)$/, '');
    }
    if (compiled.kind === 'error') expect(compiled.error.message).toContain(message);
  });

  it('brackets inside a long literal do not count towards the nesting limit', () => {
    const compiled = compileFormula(`concat("${'('.repeat(400)}", "x")`, 'cell', new Set(['concat']));
    expect(compiled.kind).toBe('expression');
  });
});
