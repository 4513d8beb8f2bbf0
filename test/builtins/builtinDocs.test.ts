import { readFileSync } from 'node:fs';
import { describe, it, expect } from 'vitest';
import { allBuiltins } from '../../src/builtins/index';
import { builtinReference } from '../../scripts/builtinReference';

// Every built-in must carry the documentation the help panel and the reference page show:
// a published source (or "common practice, no source"), a summary, and each argument documented.
describe('built-in documentation', () => {
  const builtins = allBuiltins();

  it('has unique identifier names', () => {
    const names = builtins.map((b) => b.name);
    expect(new Set(names).size).toBe(names.length);
    for (const n of names) expect(n).toMatch(/^[A-Za-z][A-Za-z0-9_]*$/);
  });

  it.each(builtins.map((b) => [b.name, b] as const))('%s is documented', (_name, b) => {
    expect(b.summary.trim().length).toBeGreaterThan(10);
    expect(b.source.trim().length).toBeGreaterThan(5);
    expect(b.returns.description.trim().length).toBeGreaterThan(0);
    for (const a of b.args) {
      expect(a.name).toMatch(/^[A-Za-z][A-Za-z0-9_]*$/);
      expect(a.description.trim().length).toBeGreaterThan(0);
      expect(a.unit.trim().length).toBeGreaterThan(0);
    }
    // The implementation never declares more parameters than the documentation lists.
    expect(b.fn.length).toBeLessThanOrEqual(b.args.length);
  });

  it('docs/builtins.md is up to date (run npm run docs)', () => {
    const committed = readFileSync(new URL('../../docs/builtins.md', import.meta.url), 'utf8');
    expect(committed).toBe(builtinReference(builtins));
  });
});
