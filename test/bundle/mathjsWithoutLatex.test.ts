// The app's build gives mathjs's expression nodes a LaTeX module with empty tables
// (scripts/mathjsWithoutLatex.mjs), which is right only while nothing in the engine or the app
// asks mathjs for LaTeX (toTex) or for its tables.
import { readFileSync, readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(import.meta.dirname, '../..');

function sources(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? sources(join(dir, e.name)) : /\.tsx?$/.test(e.name) ? [join(dir, e.name)] : [],
  );
}

describe('mathjs without its LaTeX output in the app', () => {
  it('no file of src/ or web/ calls toTex or reads mathjs’s LaTeX tables', () => {
    const users = [...sources(join(ROOT, 'src')), ...sources(join(ROOT, 'web'))].filter((f) =>
      /\btoTex\b|utils\/latex|latexFunctions|latexOperators|latexSymbols/.test(readFileSync(f, 'utf8')),
    );
    expect(users).toEqual([]);
  });
});
