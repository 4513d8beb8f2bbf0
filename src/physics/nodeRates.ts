// The frequency-independent parts of a population on composite Gauss-Legendre nodes in z, log10M and q,
// shared by the finite-number bins (finiteBinaries.ts) and the realisation cells (realisationCells.ts):
// binaries per second of rest-frame time per node, w n dV/dz |dz/dt| (Sesana, Vecchio & Colacino 2008,
// MNRAS 390, 192, eq. 6 integrand), and per-node masses, chirp masses, ISCO frequencies, distances, ages.
import { MPC_M, M_SUN_KG } from './constants';
import { chirpMassFromTotal } from './binaryMasses';
import { iscoGwFrequencyHz } from './circularKernel';
import type { FlatLambdaCdm } from './cosmology';
import type { BinaryPopulation } from './populationTypes';
import type { TimeCheck } from './timeCheck';

export interface NodeGrid {
  nodes: Float64Array;
  weights: Float64Array;
}

export interface NodeRates {
  /** Binaries per second of rest-frame time at node (iz * nm + im) * nq + iq: weight x n x dV/dz x |dz/dt|. */
  rate: Float64Array;
  /** M_c^(5/3), kg^(5/3), at (im * nq + iq). */
  mc53: Float64Array;
  /** Total mass, kg, per mass node. */
  massKg: Float64Array;
  /** GW frequency at the ISCO, Hz, per mass node. */
  fIsco: Float64Array;
  /** Comoving distance, m, per z node. */
  dc: Float64Array;
  /** Age of the Universe, s, per z node. */
  age: Float64Array;
}

/**
 * Sums over q of the GW-driven finite-number bins (finiteBinaries.ts): per (z, mass node) sum_q of
 * rate / M_c^(5/3) and of rate x M_c^(5/3), at iz * nm + im; per (z, q) the running sums over the mass
 * nodes of rate / M_c^(5/3), at (iz * nq + iq) * (nm + 1) + im (0 at im = 0).
 */
export interface NodeSumsOverQ {
  perMc53: Float64Array;
  timesMc53: Float64Array;
  perMc53ByQ: Float64Array;
}

const PER_MPC3 = 1 / (MPC_M * MPC_M * MPC_M);

/**
 * The node rates of `pop` (a density that is not finite and >= 0 at a node is an error naming the node).
 * Given `sums`, fills them in the same pass over the nodes (one pass instead of two: while the code runs
 * cold, each pass over the 27,648 nodes costs milliseconds).
 */
export function nodeRates(pop: BinaryPopulation, cosmo: FlatLambdaCdm, zr: NodeGrid, mr: NodeGrid, qr: NodeGrid, checkTime: TimeCheck, sums?: NodeSumsOverQ): NodeRates {
  const nz = zr.nodes.length;
  const nm = mr.nodes.length;
  const nq = qr.nodes.length;
  const rate = new Float64Array(nz * nm * nq);
  const mc53 = new Float64Array(nm * nq);
  const massKg = new Float64Array(nm);
  const fIsco = new Float64Array(nm);
  for (let im = 0; im < nm; im++) {
    const mKg = M_SUN_KG * Math.pow(10, mr.nodes[im]);
    massKg[im] = mKg;
    fIsco[im] = iscoGwFrequencyHz(mKg);
    for (let iq = 0; iq < nq; iq++) mc53[im * nq + iq] = Math.pow(chirpMassFromTotal(mKg, qr.nodes[iq]), 5 / 3);
  }
  // A separable density (populationTypes.ts) gives its factors: one density call per (z, M) node. Its
  // density is zMass(z, M) * massRatio(q), so the products are the same numbers.
  const sep = pop.separable;
  const qFactor = Float64Array.from(qr.nodes, (q) => (sep ? sep.massRatio(q) : 0));
  // A density that also factorises in z and M gives zMass = redshift(z) * exp(lnMass(log10M)): the mass
  // factors once per mass node, not once per (z, M) node (the same numbers).
  const lnMass = sep?.redshift ? sep.lnMass : undefined;
  const massFactor = lnMass ? Float64Array.from(mr.nodes, (x) => Math.exp(lnMass(x))) : undefined;
  const qWeights = qr.weights;
  const perByQ = sums?.perMc53ByQ;
  const dc = new Float64Array(nz);
  const age = new Float64Array(nz);
  for (let iz = 0; iz < nz; iz++) {
    checkTime();
    const z = zr.nodes[iz];
    dc[iz] = cosmo.comovingDistanceM(z);
    age[iz] = cosmo.ageS(z);
    const volumePerTime = (cosmo.comovingVolumeElementM3(z) / cosmo.dtdzS(z)) * PER_MPC3;
    const zFactor = massFactor && sep?.redshift ? sep.redshift(z) : 0;
    const zWeight = zr.weights[iz];
    let i = iz * nm * nq;
    for (let im = 0; im < nm; im++) {
      const zMass = massFactor ? zFactor * massFactor[im] : sep ? sep.zMass(z, mr.nodes[im]) : 0;
      // w_z w_M w_q n dV/dz |dz/dt|, multiplied in that order
      const zmWeight = zWeight * mr.weights[im];
      let per = 0;
      let times = 0;
      for (let iq = 0; iq < nq; iq++, i++) {
        const n = sep ? zMass * qFactor[iq] : pop.density(z, mr.nodes[im], qr.nodes[iq]);
        if (!(n >= 0) || n === Infinity) throw new RangeError(`population density is ${n} at z = ${z}, log10M = ${mr.nodes[im]}, q = ${qr.nodes[iq]}; it must be finite and >= 0`);
        const r = zmWeight * qWeights[iq] * n * volumePerTime;
        rate[i] = r;
        if (perByQ) {
          const m53 = mc53[im * nq + iq];
          const p = r / m53;
          per += p;
          times += r * m53;
          const at = (iz * nq + iq) * (nm + 1) + im;
          perByQ[at + 1] = perByQ[at] + p;
        }
      }
      if (sums) {
        sums.perMc53[iz * nm + im] = per;
        sums.timesMc53[iz * nm + im] = times;
      }
    }
  }
  return { rate, mc53, massKg, fIsco, dc, age };
}
