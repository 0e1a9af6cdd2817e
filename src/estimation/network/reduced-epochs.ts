/**
 * The reduced normal equations of every epoch (epoch-clocks.ts: clocks eliminated, R and r_z in the
 * epoch's troposphere unknowns), kept between the solutions of the screening loop. A rejection
 * changes the observations of one epoch only, so only that epoch is reduced again; the others are
 * added to the front from here (the clock elimination, O(K·(dS)²) per epoch, is the largest part of
 * the assembly). Memory: (dS)(dS + 1)/2 + 2 dS numbers per epoch, about 90 kB at 50 stations with
 * gradients (d = 3), 260 MB for a day at 30 s.
 */

import type { EpochClockSystem } from './epoch-clocks.js';

/** What the forward pass of network-solve.ts takes from one epoch. */
export interface ReducedEpoch {
  /** Stations with used observations at this epoch, local index a → station (length = their number). */
  present: Int32Array;
  /** Own-diagonal contribution per local station and family (singularity test). */
  direct: Float64Array;
  /** R as its packed lower triangle, and r_z. */
  r: Float64Array;
  rz: Float64Array;
  /** Receiver and satellite clocks eliminated, datum clocks not counted. */
  clockUnknowns: number;
}

const EMPTY: ReducedEpoch = {
  present: new Int32Array(0),
  direct: new Float64Array(0),
  r: new Float64Array(0),
  rz: new Float64Array(0),
  clockUnknowns: 0,
};

/** Numbers per pool block (8 M: 64 MB); an epoch larger than that gets a block of its own. */
const POOL_BLOCK = 1 << 23;

/**
 * Copies live in a few large blocks instead of four small arrays per epoch: thousands of separate
 * buffers of 90 kB made the garbage collector run often (12 % of a 50-station day in a profile).
 * The space of an invalidated epoch is not reused (a rejection touches few epochs).
 */
class NumberPool {
  private block = new Float64Array(0);
  private used = 0;

  take(values: Float64Array): Float64Array {
    if (this.used + values.length > this.block.length) {
      this.block = new Float64Array(Math.max(POOL_BLOCK, values.length));
      this.used = 0;
    }
    const out = this.block.subarray(this.used, this.used + values.length);
    out.set(values);
    this.used += values.length;
    return out;
  }
}

export class ReducedEpochCache {
  private readonly epochs: (ReducedEpoch | undefined)[];
  private readonly pool = new NumberPool();

  constructor(epochCount: number) {
    this.epochs = new Array<ReducedEpoch | undefined>(epochCount);
  }

  get(epoch: number): ReducedEpoch | undefined {
    return this.epochs[epoch];
  }

  /** Keeps a copy of the epoch system just built (null: nothing of the epoch was left). */
  store(epoch: number, sys: EpochClockSystem | null, receiverClocks: boolean): ReducedEpoch {
    if (sys === null) return (this.epochs[epoch] = EMPTY);
    const reduced = reducedEpoch(sys, receiverClocks);
    const copy: ReducedEpoch = {
      present: reduced.present.slice(),
      direct: this.pool.take(reduced.direct),
      r: this.pool.take(reduced.r),
      rz: this.pool.take(reduced.rz),
      clockUnknowns: reduced.clockUnknowns,
    };
    this.epochs[epoch] = copy;
    return copy;
  }

  /** The epoch's observations changed (a rejection): reduce it again in the next solution. */
  invalidate(epoch: number): void {
    this.epochs[epoch] = undefined;
  }

  /**
   * Every weight changed by the same factor c: R, r_z and the direct diagonal scale by c (the clock
   * elimination is homogeneous of degree one in the weights).
   */
  scaleWeights(c: number): void {
    for (const e of this.epochs) {
      if (e === undefined || e === EMPTY) continue;
      for (const a of [e.direct, e.r, e.rz]) for (let i = 0; i < a.length; i++) a[i]! *= c;
    }
  }

  /** The weights changed otherwise: every epoch is reduced again. */
  clear(): void {
    this.epochs.fill(undefined);
  }
}

/** The epoch system's current buffers as a ReducedEpoch (views, valid until the next build). */
export function reducedEpoch(sys: EpochClockSystem, receiverClocks: boolean): ReducedEpoch {
  const Sp = sys.presentCount;
  const dz = sys.d * Sp;
  return {
    present: sys.present.subarray(0, Sp),
    direct: sys.direct.subarray(0, dz),
    r: sys.r.subarray(0, (dz * (dz + 1)) / 2),
    rz: sys.rz.subarray(0, dz),
    clockUnknowns: (receiverClocks ? Sp : 0) + sys.satelliteClockCount - sys.datums,
  };
}
