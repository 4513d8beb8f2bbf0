// Builds the reference page of every built-in (docs/builtins.md) from the Builtin docs themselves,
// so the page cannot drift from the code. Run: npm run docs
import type { Builtin } from '../src/sheet/builtin';

const CATEGORY_ORDER = ['utility', 'cosmology', 'population', 'spectrum', 'orbits', 'environment', 'statistics', 'array'];

function escapeCell(s: string): string {
  return s.replace(/\|/g, '\\|').replace(/\n/g, ' ');
}

export function builtinReference(builtins: Builtin[]): string {
  const out: string[] = [
    '# Built-in functions',
    '',
    'Generated from the built-ins\' own documentation by `npm run docs`; do not edit by hand.',
    'Arguments are positional. Quantities carry units (`3 Msun`, `70 km/s/Mpc`); values are SI inside.',
    '',
  ];
  const cats = [...new Set(builtins.map((b) => b.category))].sort(
    (a, b) => (CATEGORY_ORDER.indexOf(a) + 1 || 99) - (CATEGORY_ORDER.indexOf(b) + 1 || 99) || a.localeCompare(b),
  );
  for (const cat of cats) {
    out.push(`## ${cat[0].toUpperCase()}${cat.slice(1)}`, '');
    for (const b of builtins.filter((x) => x.category === cat).sort((x, y) => x.name.localeCompare(y.name))) {
      const sig = b.args.map((a) => (a.optional ? `[${a.name}]` : a.name)).join(', ');
      out.push(`### \`${b.name}(${sig})\``, '', b.summary, '');
      if (b.args.length > 0) {
        out.push('| argument | unit or kind | meaning |', '| --- | --- | --- |');
        for (const a of b.args) out.push(`| ${a.name}${a.optional ? ' (optional)' : ''} | ${escapeCell(a.unit)} | ${escapeCell(a.description)} |`);
        out.push('');
      }
      out.push(`Returns: ${b.returns.description} (${b.returns.unit}).`, '');
      if (b.example) out.push(`Example: \`${b.example}\``, '');
      out.push(`Source: ${b.source}`, '');
    }
  }
  return out.join('\n');
}
