// The q rule of the spectrum integrals: composite Gauss-Legendre on [qMin, qMax] (gaussLegendre.ts), with
// the given number of panels on each piece between the population's qBreaks (points where its density in
// q changes character, such as the smallest galaxy mass ratio mapped to black holes in galaxyPairRoute.ts).
// Without breaks it is compositeNodes(qMin, qMax, panels, order) itself.
import { compositeNodes, type QuadratureRule } from './gaussLegendre';
import type { BinaryPopulation } from './populationTypes';

export function massRatioRule(pop: BinaryPopulation, panels: number, order: number): QuadratureRule {
  const inside = (pop.qBreaks ?? []).filter((q) => q > pop.qMin && q < pop.qMax);
  if (inside.length === 0) return compositeNodes(pop.qMin, pop.qMax, panels, order);
  const edges = [pop.qMin, ...inside.sort((a, b) => a - b), pop.qMax];
  const pieces = edges.slice(1).map((hi, i) => compositeNodes(edges[i], hi, panels, order));
  const n = pieces.reduce((s, r) => s + r.nodes.length, 0);
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  let at = 0;
  for (const r of pieces) {
    nodes.set(r.nodes, at);
    weights.set(r.weights, at);
    at += r.nodes.length;
  }
  return { nodes, weights };
}
