// A population from a table of merger densities stored inside the sheet (mergerTable("mt1;...")). The
// cells that `import --kind merger-table` writes from a file are made in mergerTableCells.ts, so the
// engine (and the app's bundles) do not carry the CSV reader.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { tabulatedPopulation } from '../physics/tabulatedPopulation';
import { decodeDensityTable, TableEncodingError } from '../statistics/mergerTableEncoding';
import { kindOf, where } from './args';
import { cosmologyArg } from './physicsArgs';
import { PopulationValue } from './populationValue';

export const mergerTableBuiltins: Builtin[] = [
  {
    name: 'mergerTable',
    category: 'population',
    summary: 'A population from a table of d^3n/(dz dlog10M dq) on a grid of z, log10 M (total mass, Msun) and q, stored in the sheet; trilinear in ln n between nodes (in n when a value is 0), 0 outside the grid; or from binned merger events (mh1;..., constant in each bin).',
    args: [
      { name: 'table', unit: 'text', description: 'the encoded table (mt1;... or mh1;...), written by `strainsheet import --kind merger-table` or `--kind merger-events`' },
      { name: 'cosmology', unit: 'cosmology', description: 'needed only by mergerRateDensityAt and for Omega_gw', optional: true },
    ],
    returns: { unit: 'population', description: 'a binary population for every population built-in (spectrum, counts per bin, realisations, checks)' },
    source: 'Phinney 2001, astro-ph/0108028 (n is a comoving number density of remnants); interpolation common practice, no source; file layouts and errors in docs/mergerTables.md',
    example: 'mergerTable("mt1;z=0,1,2;log10M=7,8,9;q=0.1,1;density=...")',
    fn: (table: unknown, cosmology?: unknown) => {
      const fn = 'mergerTable';
      if (typeof table !== 'string') throw new BuiltinError(`${where(fn, 'table')} must be the encoded table as text (made by \`strainsheet import --kind merger-table\`), got ${kindOf(table)}`);
      const cosmo = cosmology === undefined ? undefined : cosmologyArg(cosmology, fn).model;
      try {
        const t = decodeDensityTable(table);
        const pop = tabulatedPopulation(t);
        const label = t.binned ? `binned merger events (${t.z.length - 1} x ${t.log10M.length - 1} x ${t.q.length - 1} bins)` : `merger table (${t.z.length} x ${t.log10M.length} x ${t.q.length} nodes)`;
        return new PopulationValue(pop, label, { zNodes: t.z.length, massNodes: t.log10M.length, qNodes: t.q.length }, cosmo);
      } catch (e) {
        if (e instanceof TableEncodingError || e instanceof RangeError) throw new BuiltinError(`${where(fn, 'table')}: ${e.message}`);
        throw e;
      }
    },
  },
];
