// The cells finiteBinaries.ts gives each mass node: as wide as the node's weight, laid end to end from the
// lower limit. Each node lies inside its own cell by the separation theorem of Chebyshev, Markov and
// Stieltjes for Gauss rules (Szego 1939, Orthogonal Polynomials, 3.41; section number unverified): the
// weights before node k sum to less than its distance from the lower limit, and with node k to more.
// Checked here on the composite rules the project lays (equal panels of one Gauss-Legendre order).
import { describe, expect, it } from 'vitest';
import { compositeNodes } from '../../src/physics/gaussLegendre';

describe('cells of composite Gauss-Legendre nodes', () => {
  it('each node lies strictly inside the cell its weight spans, and the cells tile [a, b] (to 1e-12)', () => {
    for (const [a, b] of [[6, 11], [-1, 1], [0, 3.5]]) {
      for (const panels of [1, 2, 5]) {
        for (const order of [1, 2, 3, 8, 16, 24]) {
          const { nodes, weights } = compositeNodes(a, b, panels, order);
          let edge = a;
          for (let k = 0; k < nodes.length; k++) {
            const next = edge + weights[k];
            expect(nodes[k]).toBeGreaterThan(edge);
            expect(nodes[k]).toBeLessThan(next);
            edge = next;
          }
          expect(Math.abs(edge - b)).toBeLessThan(1e-12 * Math.max(1, Math.abs(b)));
        }
      }
    }
  });
});
