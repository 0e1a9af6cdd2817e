/**
 * One least-squares solution of the network: the clocks of every epoch eliminated by
 * EpochClockSystem (epoch-clocks.ts), the reduced epoch normals R (in the epoch's z of every
 * station) mapped to the nodes through the interpolation weights (x_node → z = Bᵀx, so N += B R Bᵀ)
 * and accumulated, with the random-walk and a-priori constraints of the single-station estimator
 * (../least-squares.ts: randomWalkWeight, constraintCount), in the network frontal solver. Then, in
 * the reverse sweep that computes the selected inverse, per epoch: post-fit residuals, their
 * standard deviations σ_v (for screening), and the covariances of every station's ZWD at the epoch
 * (absolute, relative to the reference station, and of the network mean).
 *
 * Parameters: station s owns ids [s·P, (s+1)·P): ZWD nodes, north nodes, east nodes (P per station),
 * all stations on the same node layout.
 */

import { constraintCount, EPOCH_NORMAL_ENTRIES, randomWalkStepWeight, type ParameterLayout } from '../least-squares.js';
import type { PiecewiseLinearSettings, ZwdEstimationOptions } from '../types.js';
import { EpochClockSystem } from './epoch-clocks.js';
import { reducedEpoch, type ReducedEpoch, type ReducedEpochCache } from './reduced-epochs.js';
import type { NetworkDesign } from './network-design.js';
import { FrontalLdl, type ReverseFrontView } from '../frontal-ldl.js';

export interface EpochCovariances {
  /** Per station (NaN when the station has no epoch here): σ² of δw(t) and of δw − δw_ref [m²]. */
  variance: Float64Array;
  relativeVariance: Float64Array;
  /** Variance of the mean δw of all stations [m²]. */
  meanVariance: number;
  /**
   * Correlation of the network mean with the epoch's mean clock term (the mean over the used
   * observations of ρ_a + σ_k: datum-free); NaN without satellite clocks.
   */
  meanClockCorrelation: number;
}

export interface NetworkSolution {
  x: Float64Array;
  inverseDiagonal: Float64Array;
  /** Per station: Cov(x_node, x_ref node) of the ZWD nodes [m²]. */
  nodeCovarianceWithReference: Float64Array[];
  /** Per parameter p: Cov(x_p, x_{p+1}) when p + 1 is the next node of the same family [m²]. */
  adjacentCovariance: Float64Array;
  /** Per station design observation: post-fit residual [m] and σ_v² [m²] (0 when not included). */
  fittedResidualM: Float64Array[];
  residualVarianceM2: Float64Array[];
  /** Receiver clock estimate per station epoch [m] (NaN when not estimated or datum-dependent). */
  receiverClockM: Float64Array[];
  /** Per station design observation: 1 when it took part (used and informative). */
  included: Uint8Array[];
  /** Per network epoch. */
  epochs: EpochCovariances[];
  /**
   * Per station, per station epoch: its 3×3 block of the epoch's reduced normal matrix R (clocks
   * eliminated), entries ww, wn, we, nn, ne, ee (EPOCH_NORMAL_ENTRIES each; 0 without data) [1/m²]:
   * the epoch's information on the station's ZWD and gradients, for the correlated-noise inflation.
   */
  epochNormal: Float64Array[];
  weightedSquareSum: number;
  residualSquareSumM2: number;
  observationsUsed: number;
  clockUnknowns: number;
  constraints: number;
}

/** Layout of one station's parameters, in the shape the single-station helpers take. */
export function stationLayout(net: NetworkDesign): ParameterLayout {
  const zwdCount = net.zwd.count;
  const gradientCount = net.gradients?.count ?? 0;
  return { zwdCount, gradientCount, northOffset: zwdCount, eastOffset: zwdCount + gradientCount, parameters: zwdCount + 2 * gradientCount };
}

interface Family {
  offset: number;
  count: number;
  settings: PiecewiseLinearSettings;
  current: number;
  /** Node epochs [ms] (random-walk step weights follow the actual spacing). */
  nodeMs: Float64Array;
}

/** Weight of the random-walk step between nodes j and j + 1 of a family, or null (none). */
const stepWeight = (f: Family, j: number) => randomWalkStepWeight(f.settings, f.nodeMs[j]!, f.nodeMs[j + 1]!);

/**
 * @param used per station, 1 for each design observation that takes part
 * @param reference station index the relative variances refer to
 * @param cache reduced epochs of an earlier solution (the caller invalidates the epochs whose
 *        observations changed); filled with the epochs reduced now
 * @throws SingularParameterError (from the frontal solver) naming an undetermined parameter
 */
export function solveNetworkOnce(
  net: NetworkDesign,
  options: ZwdEstimationOptions,
  used: readonly Uint8Array[],
  reference: number,
  cache?: ReducedEpochCache,
): NetworkSolution {
  const S = net.stations.length;
  const layout = stationLayout(net);
  const P = layout.parameters;
  const d = net.gradients ? 3 : 1;
  const local = net.gradients ? 6 : 2;
  // Every node has at most the front (S·local − 1) as neighbours in L.
  const frontal = new FrontalLdl(S * P, S * local, S * P * (S * local - 1));
  const families: Family[] = [];
  for (let s = 0; s < S; s++) {
    const o = s * P;
    families.push({ offset: o, count: layout.zwdCount, settings: options.zwd, current: -1, nodeMs: net.zwd.nodeMs });
    if (options.gradients) {
      families.push({
        offset: o + layout.northOffset,
        count: layout.gradientCount,
        settings: options.gradients,
        current: -1,
        nodeMs: net.gradients!.nodeMs,
      });
      families.push({
        offset: o + layout.eastOffset,
        count: layout.gradientCount,
        settings: options.gradients,
        current: -1,
        nodeMs: net.gradients!.nodeMs,
      });
    }
  }
  // Moving a family to the node interval of an epoch takes two steps, run for all families in turn:
  // first every node that no later epoch uses is eliminated, then the new nodes enter the front.
  // Eliminating before activating keeps the front smaller during the eliminations (the node
  // elimination and the reverse sweep cost O(front²) per node).
  const retire = (f: Family, interval: number) => {
    if (f.current < 0) return;
    for (let j = f.current; j < interval; j++) frontal.eliminate(f.offset + j);
  };
  const enter = (f: Family, interval: number) => {
    if (f.current < 0) {
      frontal.activate(f.offset);
      if (f.settings.aprioriSigmaM !== null) frontal.addValueConstraint(f.offset, 1 / f.settings.aprioriSigmaM ** 2);
      if (f.count > 1) {
        frontal.activate(f.offset + 1);
        const rw = stepWeight(f, 0);
        if (rw !== null) frontal.addDifferenceConstraint(f.offset + 1, f.offset, rw);
      }
      f.current = 0;
    }
    while (f.current < interval) {
      frontal.activate(f.offset + f.current + 2);
      const rw = stepWeight(f, f.current + 1);
      if (rw !== null) frontal.addDifferenceConstraint(f.offset + f.current + 2, f.offset + f.current + 1, rw);
      f.current++;
    }
  };
  const intervalOf = (f: number, k: number) => (f % perStationFamilies === 0 ? net.zwdInterval[k]! : net.gradientInterval[k]!);
  const perStationFamilies = families.length / S;

  let maxEntries = 1;
  for (let k = 0; k < net.epochMs.length; k++) maxEntries = Math.max(maxEntries, net.entryStart[k + 1]! - net.entryStart[k]!);
  const sys = new EpochClockSystem(net, maxEntries);
  const epochs = net.epochMs.length;
  const stamp = new Int32Array(epochs);
  // Local parameter ids and interpolation weights of station s at epoch k: a_p = interp[p] · m[family[p]].
  const ids = new Int32Array(local * S);
  const interp = new Float64Array(local * S);
  const fam = net.gradients ? [0, 0, 1, 1, 2, 2] : [0, 0];
  const fillLocal = (k: number, s: number) => {
    const o = s * P;
    const base = s * local;
    const j = net.zwdInterval[k]!;
    const alpha = net.zwdAlpha[k]!;
    ids[base] = o + j;
    ids[base + 1] = layout.zwdCount > 1 ? o + j + 1 : -1;
    interp[base] = 1 - alpha;
    interp[base + 1] = alpha;
    if (net.gradients) {
      const l = net.gradientInterval[k]!;
      const beta = net.gradientAlpha[k]!;
      const two = layout.gradientCount > 1;
      ids[base + 2] = o + layout.northOffset + l;
      ids[base + 3] = two ? o + layout.northOffset + l + 1 : -1;
      ids[base + 4] = o + layout.eastOffset + l;
      ids[base + 5] = two ? o + layout.eastOffset + l + 1 : -1;
      interp[base + 2] = interp[base + 4] = 1 - beta;
      interp[base + 3] = interp[base + 5] = beta;
    }
  };
  const slots = new Int32Array(local * S);
  const projSlots = new Int32Array(local * S);
  const projCoeff = new Float64Array(local * S);
  const projRows = new Int32Array(local * S);
  let clockUnknowns = 0;
  const stationEpochAt = net.stations.map((st) => {
    const m = new Int32Array(epochs).fill(-1);
    st.networkEpoch.forEach((ke, ks) => (m[ke] = ks));
    return m;
  });
  const epochNormal = net.stations.map((st) => new Float64Array(st.design.epochMs.length * EPOCH_NORMAL_ENTRIES));

  // Forward pass: assembly and elimination.
  for (let k = 0; k < epochs; k++) {
    for (let f = 0; f < families.length; f++) retire(families[f]!, intervalOf(f, k));
    for (let f = 0; f < families.length; f++) enter(families[f]!, intervalOf(f, k));
    stamp[k] = frontal.eliminatedCount;
    let epoch: ReducedEpoch | null | undefined = cache?.get(k);
    if (epoch === undefined) {
      const built = sys.build(k, used);
      epoch = cache ? cache.store(k, built ? sys : null, net.receiverClocks) : built ? reducedEpoch(sys, net.receiverClocks) : null;
    }
    if (epoch === null || epoch === undefined || epoch.present.length === 0) continue;
    const Sp = epoch.present.length;
    clockUnknowns += epoch.clockUnknowns;
    keepStationBlocks(epoch, d, k, stationEpochAt, epochNormal);
    for (let a = 0; a < Sp; a++) {
      const s = epoch.present[a]!;
      fillLocal(k, s);
      for (let p = 0; p < local; p++) {
        const id = ids[s * local + p]!;
        slots[a * local + p] = id >= 0 ? frontal.slot(id) : -1;
        if (id >= 0) frontal.addDirectDiagonal(id, interp[s * local + p]! ** 2 * epoch.direct[d * a + fam[p]!]!);
      }
    }
    // N += B R Bᵀ, g += B r_z.
    let count = 0;
    for (let a = 0; a < Sp; a++) {
      const sa = epoch.present[a]!;
      for (let p = 0; p < local; p++) {
        const sp = slots[a * local + p]!;
        if (sp < 0) continue;
        projSlots[count] = sp;
        projCoeff[count] = interp[sa * local + p]!;
        projRows[count] = d * a + fam[p]!;
        count++;
      }
    }
    frontal.addProjected(count, projSlots, projCoeff, projRows, epoch.r, epoch.rz);
  }
  frontal.eliminateAll();
  const x = frontal.solve();

  // Reverse sweep: selected inverse, residuals, σ_v, epoch covariances.
  const fittedResidualM = net.stations.map((st) => new Float64Array(st.design.residualM.length));
  const residualVarianceM2 = net.stations.map((st) => new Float64Array(st.design.residualM.length));
  const receiverClockM = net.stations.map((st) => new Float64Array(st.design.epochMs.length).fill(Number.NaN));
  const included = net.stations.map((st) => new Uint8Array(st.design.residualM.length));
  const nodeCovarianceWithReference = net.stations.map(() => new Float64Array(layout.zwdCount).fill(Number.NaN));
  const adjacentCovariance = new Float64Array(S * P);
  const familyEnd = (id: number) => {
    const j = id % P;
    return j === layout.zwdCount - 1 || j === layout.eastOffset - 1 || j === P - 1;
  };
  const epochCov: EpochCovariances[] = new Array(epochs);
  const byStamp = new Map<number, number[]>();
  for (let k = 0; k < epochs; k++) {
    const list = byStamp.get(stamp[k]!);
    if (list) list.push(k);
    else byStamp.set(stamp[k]!, [k]);
  }
  let weightedSquareSum = 0;
  let residualSquareSumM2 = 0;
  let observationsUsed = 0;
  const refOffset = reference * P;
  const maxDz = d * S;
  const q = new Float64Array(maxDz * maxDz);
  const listSlot = new Int32Array(local * S);
  const listCoeff = new Float64Array(local * S);
  const listRow = new Int32Array(local * S);
  const zhat = new Float64Array(maxDz);
  const maxK = sys.maxSatellites;
  const satClock = new Float64Array(maxK);
  const phi = new Float64Array(maxDz * maxK);
  const psi = new Float64Array(maxK * maxK);
  const omega = new Float64Array(maxK);
  const tau = new Float64Array(maxK);
  const psiOmega = new Float64Array(maxK);
  const phiOmega = new Float64Array(3);

  frontal.reverseSweep({
    onPair(p, r, z) {
      const lo = Math.min(p, r);
      if (Math.max(p, r) === lo + 1 && !familyEnd(lo)) adjacentCovariance[lo] = z;
      // ZWD node j of a station with the reference station's node j.
      const sp = Math.floor(p / P);
      const sr = Math.floor(r / P);
      const jp = p - sp * P;
      const jr = r - sr * P;
      if (jp !== jr || jp >= layout.zwdCount) return;
      if (sr === reference) nodeCovarianceWithReference[sp]![jp] = z;
      else if (sp === reference) nodeCovarianceWithReference[sr]![jr] = z;
    },
    onStamp(c, get, view) {
      const list = byStamp.get(c);
      if (!list) return;
      for (const k of list) {
        epochCov[k] = epochCovariances(k, get);
        if (!sys.build(k, used, false)) continue;
        residualsOfEpoch(k, view);
        if (net.satelliteClocks) epochCov[k]!.meanClockCorrelation = clockCorrelation(k, get, epochCov[k]!.meanVariance);
      }
    },
  });
  for (let s = 0; s < S; s++)
    nodeCovarianceWithReference[s]!.forEach((v, j) => {
      if (Number.isNaN(v) && s === reference) nodeCovarianceWithReference[s]![j] = frontal.inverseDiagonal[refOffset + j]!;
    });

  function wetCoefficients(k: number, s: number, out: { p0: number; p1: number; w0: number; w1: number }) {
    const j = net.zwdInterval[k]!;
    out.p0 = s * P + j;
    out.w0 = 1 - net.zwdAlpha[k]!;
    out.p1 = layout.zwdCount > 1 ? s * P + j + 1 : -1;
    out.w1 = net.zwdAlpha[k]!;
  }

  function epochCovariances(k: number, get: (p: number, q: number) => number): EpochCovariances {
    const variance = new Float64Array(S).fill(Number.NaN);
    const relativeVariance = new Float64Array(S).fill(Number.NaN);
    const cs = Array.from({ length: S }, () => ({ p0: 0, p1: 0, w0: 0, w1: 0 }));
    for (let s = 0; s < S; s++) wetCoefficients(k, s, cs[s]!);
    const cov = (s: number, t: number) => {
      const a = cs[s]!;
      const b = cs[t]!;
      let v = a.w0 * b.w0 * get(a.p0, b.p0);
      if (a.p1 >= 0) v += a.w1 * b.w0 * get(a.p1, b.p0);
      if (b.p1 >= 0) v += a.w0 * b.w1 * get(a.p0, b.p1);
      if (a.p1 >= 0 && b.p1 >= 0) v += a.w1 * b.w1 * get(a.p1, b.p1);
      return v;
    };
    let meanVariance = 0;
    const rowSum = new Float64Array(S);
    for (let s = 0; s < S; s++) {
      for (let t = 0; t <= s; t++) {
        const v = cov(s, t);
        rowSum[s]! += v;
        if (t !== s) rowSum[t]! += v;
        meanVariance += t === s ? v : 2 * v;
      }
    }
    meanVariance /= S * S;
    const vRef = cov(reference, reference);
    for (let s = 0; s < S; s++) {
      if (stationEpochAt[s]![k]! < 0) continue;
      const vs = cov(s, s);
      variance[s] = vs;
      relativeVariance[s] = s === reference ? 0 : Math.max(vs + vRef - 2 * cov(s, reference), 0);
    }
    return { variance, relativeVariance, meanVariance, meanClockCorrelation: Number.NaN };
  }

  function residualsOfEpoch(k: number, view: ReverseFrontView): void {
    const Sp = sys.presentCount;
    const dz = d * Sp;
    const K = sys.satelliteClockCount;
    const rc = net.receiverClocks;
    // ẑ = Bᵀx and Q_zz = Bᵀ Q B for the present stations: the local parameters of all present
    // stations as one list (front slot, interpolation weight, row of z), then Q_zz from the reverse
    // front directly (lower triangle, mirrored).
    let n = 0;
    for (let a = 0; a < Sp; a++) {
      const sa = sys.present[a]!;
      fillLocal(k, sa);
      for (let f = 0; f < d; f++) zhat[d * a + f] = 0;
      for (let p = 0; p < local; p++) {
        const id = ids[sa * local + p]!;
        if (id < 0) continue;
        const w = interp[sa * local + p]!;
        zhat[d * a + fam[p]!]! += w * x[id]!;
        const slot = view.slot[id]!;
        if (slot < 0) throw new Error(`node ${id} is not in the reverse front at epoch ${k}`);
        listSlot[n] = slot;
        listCoeff[n] = w;
        listRow[n] = d * a + fam[p]!;
        n++;
      }
    }
    q.fill(0, 0, dz * dz);
    const z = view.z;
    const ld = view.ld;
    for (let i = 0; i < n; i++) {
      const zi = listSlot[i]! * ld;
      const ci = listCoeff[i]!;
      const ri = listRow[i]! * dz;
      for (let j = 0; j < n; j++) {
        const rj = listRow[j]!;
        if (rj > listRow[i]!) break;
        q[ri + rj]! += ci * listCoeff[j]! * z[zi + listSlot[j]!]!;
      }
    }
    for (let p = 0; p < dz; p++) for (let r = 0; r < p; r++) q[r * dz + p] = q[p * dz + r]!;
    // Satellite clocks σ̂ = t − K_σ ẑ (datum 0); Φ = Q K_σᵀ (dz×K, kept transposed: phi[k·dz + p]), Ψ = K_σ Φ (K×K).
    const ks = sys.ks;
    for (let kk = 0; kk < K; kk++) {
      let v = sys.t[kk]!;
      for (let p = 0; p < dz; p++) v -= ks[kk * dz + p]! * zhat[p]!;
      satClock[kk] = sys.satDatum[kk] ? 0 : v;
    }
    phiTransposed(q, ks, dz, K, phi);
    for (let k1 = 0; k1 < K; k1++) {
      const row1 = k1 * dz;
      for (let k2 = 0; k2 <= k1; k2++) {
        let v = 0;
        const row2 = k2 * dz;
        for (let p = 0; p < dz; p++) v += ks[row1 + p]! * phi[row2 + p]!;
        psi[k1 * K + k2] = v;
        psi[k2 * K + k1] = v;
      }
    }
    const Sinv = sys.sInv;
    const eW = sys.entryWeight;
    const eM = sys.entryMapping;
    const eC = sys.entryCentred;
    const eR = sys.entryResidual;
    const eS = sys.entrySat;
    const e0 = net.entryStart[k]!;
    for (let a = 0; a < Sp; a++) {
      const s = sys.present[a]!;
      const st = net.stations[s]!;
      const u0 = sys.stationStart[a]!;
      const u1 = sys.stationStart[a + 1]!;
      const Da = sys.stationD[a]!;
      // ω_a (satellite weights of the station / D_a), τ_a = S⁻¹ ω_a, Φ ω_a, ω Ψ ω, (Ψ ω)_k, ω·σ̂.
      omega.fill(0, 0, K);
      if (rc && K > 0) for (let u = u0; u < u1; u++) omega[eS[sys.stationEntry[u]!]!]! += eW[sys.stationEntry[u]!]! / Da;
      let omegaClock = 0;
      let omegaTau = 0;
      let omegaPsiOmega = 0;
      if (rc && K > 0) {
        for (let k1 = 0; k1 < K; k1++) {
          let tv = 0;
          let pv = 0;
          for (let k2 = 0; k2 < K; k2++) {
            tv += Sinv[k1 * K + k2]! * omega[k2]!;
            pv += psi[k1 * K + k2]! * omega[k2]!;
          }
          tau[k1] = tv;
          psiOmega[k1] = pv;
          omegaClock += omega[k1]! * satClock[k1]!;
          omegaTau += omega[k1]! * tv;
          omegaPsiOmega += omega[k1]! * pv;
        }
        for (let f = 0; f < d; f++) {
          let v = 0;
          const p = d * a + f;
          for (let k1 = 0; k1 < K; k1++) v += phi[k1 * dz + p]! * omega[k1]!;
          phiOmega[f] = v;
        }
      }
      const ks2 = stationEpochAt[s]![k]!;
      if (rc && K === 0) {
        // Receiver clock = epoch bias (satellite clocks known): ρ̂ = r̄ − m̄ᵀẑ, plus the part removed beforehand.
        let v = sys.stationMeanResidual[a]!;
        for (let f = 0; f < d; f++) v -= sys.stationMeanMapping[3 * a + f]! * zhat[d * a + f]!;
        receiverClockM[s]![ks2] = v + st.receiverShiftM[ks2]!;
      }
      for (let u = u0; u < u1; u++) {
        const xe = sys.stationEntry[u]!;
        const kk = eS[xe]!;
        const i = net.entryObservation[e0 + xe]!;
        const w = eW[xe]!;
        // v = (r − r̄) − cᵀẑ − (σ̂_k − Σ ω σ̂)
        let v = eR[xe]!;
        for (let f = 0; f < d; f++) v -= (rc ? eC[3 * xe + f]! : eM[3 * xe + f]!) * zhat[d * a + f]!;
        if (K > 0) v -= satClock[kk]! - omegaClock;
        fittedResidualM[s]![i] = v;
        included[s]![i] = 1;
        observationsUsed++;
        weightedSquareSum += w * v * v;
        residualSquareSumM2 += v * v;
        // u₂ = E_a c − β_k + γ_a
        let quad = 0;
        const cx = rc ? eC : eM;
        for (let f = 0; f < d; f++)
          for (let g = 0; g < d; g++) quad += cx[3 * xe + f]! * q[(d * a + f) * dz + d * a + g]! * cx[3 * xe + g]!;
        let clockTerm = rc ? 1 / Da : 0;
        if (K > 0) {
          quad += psi[kk * K + kk]!;
          for (let f = 0; f < d; f++) quad -= 2 * cx[3 * xe + f]! * phi[kk * dz + d * a + f]!;
          clockTerm += Sinv[kk * K + kk]!;
          if (rc) {
            quad += omegaPsiOmega - 2 * psiOmega[kk]!;
            for (let f = 0; f < d; f++) quad += 2 * cx[3 * xe + f]! * phiOmega[f]!;
            clockTerm += omegaTau - 2 * tau[kk]!;
          }
        }
        const sigma = Math.sqrt(st.design.observationVarianceM2[i]!);
        residualVarianceM2[s]![i] = sigma * sigma - clockTerm - quad;
      }
    }
  }

  /**
   * Correlation of the network-mean ZWD ζ with χ = Σ_a (n_a/n) ρ̂_a + Σ_k (n_k/n) σ̂_k (n_a, n_k, n:
   * used observations per station, per satellite, in all). Through the two stages (epoch-clocks.ts):
   * χ = const + u₂ᵀẑ with u₁ = (−(n_a/n) m̄_a at z_a; e_σ − Σ_a (n_a/n) ω_a at σ), u₂ = u₁z − K_σᵀu₁σ;
   * Var χ = Σ_a (n_a/n)²/D_a + u₁σᵀS⁻¹u₁σ + u₂ᵀQ_zz u₂, Cov(χ, ζ) = u₂ᵀ Cov(ẑ, ζ).
   * Must run right after residualsOfEpoch(k) (it uses Q_zz and the epoch system).
   */
  function clockCorrelation(k: number, get: (p: number, q: number) => number, meanVariance: number): number {
    const Sp = sys.presentCount;
    const dz = d * Sp;
    const K = sys.satelliteClockCount;
    const rc = net.receiverClocks;
    const n = sys.stationStart[Sp]!;
    if (n === 0 || K === 0) return Number.NaN;
    const u1s = new Float64Array(K);
    const u2 = new Float64Array(dz);
    for (let kk = 0; kk < K; kk++) {
      let c = 0;
      for (let e = sys.satFirst[kk]!; e < sys.satFirst[kk]! + sys.satCount[kk]!; e++) c += sys.included[e - net.entryStart[k]!]!;
      u1s[kk] = c / n;
    }
    let varChi = 0;
    if (rc) {
      for (let a = 0; a < Sp; a++) {
        const ea = (sys.stationStart[a + 1]! - sys.stationStart[a]!) / n;
        const Da = sys.stationD[a]!;
        varChi += (ea * ea) / Da;
        for (let f = 0; f < d; f++) u2[d * a + f] = -ea * sys.stationMeanMapping[3 * a + f]!;
        for (let u = sys.stationStart[a]!; u < sys.stationStart[a + 1]!; u++) {
          const xe = sys.stationEntry[u]!;
          u1s[sys.entrySat[xe]!]! -= (ea * sys.entryWeight[xe]!) / Da;
        }
      }
    }
    for (let kk = 0; kk < K; kk++) {
      const v = u1s[kk]!;
      if (v === 0) continue;
      for (let p = 0; p < dz; p++) u2[p]! -= sys.ks[kk * dz + p]! * v;
      for (let l = 0; l < K; l++) varChi += v * sys.sInv[kk * K + l]! * u1s[l]!;
    }
    for (let p = 0; p < dz; p++) {
      let v = 0;
      for (let r = 0; r < dz; r++) v += q[p * dz + r]! * u2[r]!;
      varChi += u2[p]! * v;
    }
    // Cov(ẑ, ζ), ζ = (1/S) Σ_t δw_t(t_k). With every station present, δw_t(t_k) is one of ẑ and
    // the covariances are in Q_zz (q) already; otherwise from the reverse front.
    if (Sp === S) {
      let cov = 0;
      for (let p = 0; p < dz; p++) {
        const row = p * dz;
        let c = 0;
        for (let a = 0; a < Sp; a++) c += q[row + d * a]!;
        cov += u2[p]! * c;
      }
      cov /= S;
      return varChi > 0 && meanVariance > 0 ? cov / Math.sqrt(varChi * meanVariance) : Number.NaN;
    }
    const j = net.zwdInterval[k]!;
    const alpha = net.zwdAlpha[k]!;
    let cov = 0;
    for (let a = 0; a < Sp; a++) {
      const sa = sys.present[a]!;
      fillLocal(k, sa);
      for (let p = 0; p < local; p++) {
        const ip = ids[sa * local + p]!;
        if (ip < 0) continue;
        const coefficient = interp[sa * local + p]! * u2[d * a + fam[p]!]!;
        if (coefficient === 0) continue;
        let c = 0;
        for (let t = 0; t < S; t++) {
          c += (1 - alpha) * get(ip, t * P + j);
          if (layout.zwdCount > 1) c += alpha * get(ip, t * P + j + 1);
        }
        cov += (coefficient * c) / S;
      }
    }
    return varChi > 0 && meanVariance > 0 ? cov / Math.sqrt(varChi * meanVariance) : Number.NaN;
  }

  // Constraint residuals.
  for (const f of families) {
    if (f.settings.aprioriSigmaM !== null) weightedSquareSum += (x[f.offset]! / f.settings.aprioriSigmaM) ** 2;
    for (let j = 0; j + 1 < f.count; j++) {
      const rw = stepWeight(f, j);
      if (rw !== null) weightedSquareSum += rw * (x[f.offset + j + 1]! - x[f.offset + j]!) ** 2;
    }
  }

  return {
    x,
    inverseDiagonal: frontal.inverseDiagonal,
    nodeCovarianceWithReference,
    adjacentCovariance,
    fittedResidualM,
    residualVarianceM2,
    receiverClockM,
    included,
    epochs: epochCov,
    epochNormal,
    weightedSquareSum,
    residualSquareSumM2,
    observationsUsed,
    clockUnknowns,
    constraints: S * constraintCount(layout, options),
  };
}

/** Copies each present station's diagonal block of R (packed lower triangle) into its epoch's normal entries. */
function keepStationBlocks(epoch: ReducedEpoch, d: number, k: number, stationEpochAt: Int32Array[], out: Float64Array[]): void {
  const R = epoch.r;
  const at = (p: number, q: number) => R[(p * (p + 1)) / 2 + q]!;
  for (let a = 0; a < epoch.present.length; a++) {
    const s = epoch.present[a]!;
    const o = stationEpochAt[s]![k]! * EPOCH_NORMAL_ENTRIES;
    const z = d * a;
    const e = out[s]!;
    e[o] = at(z, z);
    if (d === 3) {
      e[o + 1] = at(z + 1, z);
      e[o + 2] = at(z + 2, z);
      e[o + 3] = at(z + 1, z + 1);
      e[o + 4] = at(z + 2, z + 1);
      e[o + 5] = at(z + 2, z + 2);
    }
  }
}

/**
 * Φᵀ = K_σ Q (K×dz, row k at k·dz) for symmetric Q (dz×dz) and K_σ (K×dz): four rows of K_σ per
 * pass over Q, so each element of Q is loaded once for four products (the largest cost of the
 * residual variances: K·dz² multiply-adds per epoch).
 */
function phiTransposed(q: Float64Array, ks: Float64Array, dz: number, K: number, out: Float64Array): void {
  let k = 0;
  for (; k + 3 < K; k += 4) {
    const r0 = k * dz;
    const r1 = r0 + dz;
    const r2 = r1 + dz;
    const r3 = r2 + dz;
    for (let p = 0; p < dz; p++) {
      const rowQ = p * dz;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      for (let r = 0; r < dz; r++) {
        const v = q[rowQ + r]!;
        s0 += v * ks[r0 + r]!;
        s1 += v * ks[r1 + r]!;
        s2 += v * ks[r2 + r]!;
        s3 += v * ks[r3 + r]!;
      }
      out[r0 + p] = s0;
      out[r1 + p] = s1;
      out[r2 + p] = s2;
      out[r3 + p] = s3;
    }
  }
  for (; k < K; k++) {
    const r0 = k * dz;
    for (let p = 0; p < dz; p++) {
      const rowQ = p * dz;
      let s0 = 0;
      for (let r = 0; r < dz; r++) s0 += q[rowQ + r]! * ks[r0 + r]!;
      out[r0 + p] = s0;
    }
  }
}
