// Mass combinations of a binary with total mass M = m1 + m2 and mass ratio q = m2/m1 <= 1.

/** Symmetric mass ratio eta = m1 m2 / M^2 = q / (1+q)^2 (definition). */
export function symmetricMassRatio(q: number): number {
  return q / ((1 + q) * (1 + q));
}

/** Chirp mass M_c = M q^(3/5) / (1+q)^(6/5) = M eta^(3/5) (Finn & Chernoff 1993, PRD 47, 2198). */
export function chirpMassFromTotal(totalMass: number, q: number): number {
  return totalMass * Math.pow(symmetricMassRatio(q), 0.6);
}

/** Chirp mass from the component masses, (m1 m2)^(3/5) / (m1 + m2)^(1/5). */
export function chirpMassFromComponents(m1: number, m2: number): number {
  return Math.pow(m1 * m2, 0.6) / Math.pow(m1 + m2, 0.2);
}

/** Component masses [m1, m2] of a binary of total mass M and mass ratio q. */
export function componentMasses(totalMass: number, q: number): [number, number] {
  const m1 = totalMass / (1 + q);
  return [m1, q * m1];
}
