// Prints the benchmarks of a `vitest bench --outputJson FILE` run as a Markdown table (file, group,
// benchmark, median, mean, min, samples; times in ms), for the README's performance section:
//   npx vitest bench --run --outputJson bench.json && node scripts/benchTable.mjs bench.json
import { readFileSync } from 'node:fs';
import { relative } from 'node:path';

const file = process.argv[2];
if (!file) {
  console.error('usage: node scripts/benchTable.mjs BENCH_JSON');
  process.exit(2);
}
const report = JSON.parse(readFileSync(file, 'utf8'));
/** A time in ms with three significant figures (or whole ms above 100). */
const ms = (t) => (t >= 100 ? t.toFixed(0) : t.toPrecision(3));
console.log('| file | group | benchmark | median (ms) | mean (ms) | min (ms) | samples |');
console.log('| --- | --- | --- | --- | --- | --- | --- |');
for (const f of report.files) {
  for (const g of f.groups) {
    const group = g.fullName.split(' > ').slice(1).join(' > ');
    for (const b of g.benchmarks) {
      console.log(`| ${relative(process.cwd(), f.filepath)} | ${group} | ${b.name} | ${ms(b.median)} | ${ms(b.mean)} | ${ms(b.min)} | ${b.sampleCount} |`);
    }
  }
}
