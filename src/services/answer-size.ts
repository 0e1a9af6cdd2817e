/**
 * The size of an estimation's answer, checked before any work: the output nodes (ZWD nodes plus
 * gradient nodes on round UTC epochs over the observations' time span, nodeCount of
 * src/estimation/design.ts) must not exceed MAX_ANSWER_NODES. A small request (two epochs 55 h
 * apart at 1-s nodes) would otherwise make an answer of ~60 MB; the 422 says how to ask for less.
 * Used by runZwdEstimation, so by both ZWD routes (request and station).
 */

import { nodeCount } from '../estimation/design.js';
import { MAX_ANSWER_NODES } from '../limits.js';
import { CallerError } from './caller-error.js';
import type { ZwdOptionValues } from './zwd-options.js';

export interface AnswerSize {
  zwdNodes: number;
  gradientNodes: number;
}

// Counted loops in functions of their own (no iterator, nothing after the loop): optimised whole, they box no
// number (issue 14: the for-of loop ran unoptimised on most requests, ~1.5 MB of iterator results a GPS-like day).
/** The earliest epoch [ms]; +Infinity without epochs. */
export function earliest(epochMs: Float64Array | readonly number[]): number {
  let first = Infinity;
  for (let i = 0; i < epochMs.length; i++) if (epochMs[i]! < first) first = epochMs[i]!;
  return first;
}

/** The latest epoch [ms]; -Infinity without epochs. */
export function latest(epochMs: Float64Array | readonly number[]): number {
  let last = -Infinity;
  for (let i = 0; i < epochMs.length; i++) if (epochMs[i]! > last) last = epochMs[i]!;
  return last;
}

/** Output nodes of an estimation over the epochs [ms] with the options' node intervals; zero nodes without epochs. */
export function answerSize(
  epochMs: Float64Array | readonly number[],
  options: Pick<ZwdOptionValues, 'zwdIntervalS' | 'gradients' | 'gradientIntervalS'>,
): AnswerSize {
  const first = earliest(epochMs);
  const last = latest(epochMs);
  if (!(first <= last)) return { zwdNodes: 0, gradientNodes: 0 };
  return {
    zwdNodes: nodeCount(first, last, options.zwdIntervalS),
    gradientNodes: options.gradients ? nodeCount(first, last, options.gradientIntervalS) : 0,
  };
}

/**
 * @throws CallerError 422 naming the interval to raise when the answer would hold more than
 *   MAX_ANSWER_NODES output nodes
 */
export function checkAnswerSize(
  epochMs: Float64Array | readonly number[],
  options: Pick<ZwdOptionValues, 'zwdIntervalS' | 'gradients' | 'gradientIntervalS'>,
): void {
  const { zwdNodes, gradientNodes } = answerSize(epochMs, options);
  if (zwdNodes + gradientNodes <= MAX_ANSWER_NODES) return;
  let first = Infinity;
  let last = -Infinity;
  for (const t of epochMs) {
    first = Math.min(first, t);
    last = Math.max(last, t);
  }
  const spanS = (last - first) / 1000;
  const spanH = (spanS / 3600).toFixed(1);
  const room = MAX_ANSWER_NODES - gradientNodes;
  // The smallest whole-second ZWD interval that fits next to the gradient nodes: span/Δ + 2 nodes at most (unaligned ends).
  const zwdMinS = room > 2 ? Math.ceil(spanS / (room - 2)) : null;
  const parts = [
    `the answer would hold ${zwdNodes + gradientNodes} output nodes (${zwdNodes} ZWD at ${options.zwdIntervalS} s${options.gradients ? `, ${gradientNodes} gradient at ${options.gradientIntervalS} s` : ''}) over the ${spanH} h of observations; at most ${MAX_ANSWER_NODES}`,
    zwdMinS !== null
      ? `ask for less: zwd_interval_s of at least ${zwdMinS} s for this span, or a shorter span (at ${options.zwdIntervalS} s, at most ${(((MAX_ANSWER_NODES - 1 - gradientNodes) * options.zwdIntervalS) / 3600).toFixed(1)} h)`
      : 'ask for less: larger zwd_interval_s and gradient interval_s, or a shorter span',
  ];
  const field = gradientNodes > zwdNodes ? 'options.gradients.interval_s' : 'options.zwd_interval_s';
  throw new CallerError(422, `${field}: ${parts.join('; ')}`, [{ field, message: parts.join('; ') }]);
}
