/**
 * The answer-size cap (MAX_ANSWER_NODES, src/services/answer-size.ts): an estimation whose output
 * nodes over the observations' span exceed it is refused with a 422 before the estimator runs, on
 * both ZWD entry points (the request task is called in-process as the routes call it; a spy on
 * estimateZwd shows it was not called). Node counts are worked out by hand below (nodes on round
 * UTC multiples of Δ, first at or before the first epoch, last at or after the last: span/Δ + 1
 * when both epochs sit on multiples of Δ).
 */

import { describe, expect, it, vi } from 'vitest';
import * as estimate from '../../src/estimation/estimate.js';
import { handleZwdRequest } from '../../src/http/tasks/zwd-request.js';
import { MAX_ANSWER_NODES } from '../../src/limits.js';
import { answerSize } from '../../src/services/answer-size.js';

vi.mock('../../src/estimation/estimate.js', { spy: true });

const T0 = Date.UTC(2026, 2, 14); // a multiple of 1 s, 30 s and 6 h
const H = 3_600_000;
const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
// Two epochs 55 h apart (the request of issue 11: a few hundred bytes that asked for a 61.9 MB answer).
const OBSERVATIONS = [
  { epoch: new Date(T0).toISOString(), satellite: 'G05', elevation_deg: 41.5, azimuth_deg: 120, residual_m: 0.012 },
  { epoch: new Date(T0 + 55 * H).toISOString(), satellite: 'G07', elevation_deg: 38.2, azimuth_deg: 250, residual_m: -0.004 },
];
const enc = (o: unknown) => new TextEncoder().encode(JSON.stringify(o));

describe('answer size: output nodes over the span (hand-counted)', () => {
  it('55 h at 1-s ZWD nodes and 6-h gradient nodes: 198 001 + 10 (55 h / 6 h rounded up, + 1)', () => {
    expect(answerSize([T0, T0 + 55 * H], { zwdIntervalS: 1, gradients: true, gradientIntervalS: 21_600 })).toEqual({
      zwdNodes: 198_001,
      gradientNodes: 11,
    });
    expect(answerSize([T0 + 55 * H, T0], { zwdIntervalS: 1, gradients: false, gradientIntervalS: 21_600 })).toEqual({
      zwdNodes: 198_001,
      gradientNodes: 0,
    });
  });

  it('the largest legitimate answer fits: 30 days at 30 s (86 401) with 6-h gradients (121)', () => {
    const size = answerSize([T0, T0 + 30 * 24 * H], { zwdIntervalS: 30, gradients: true, gradientIntervalS: 21_600 });
    expect(size).toEqual({ zwdNodes: 86_401, gradientNodes: 121 });
    expect(size.zwdNodes + size.gradientNodes).toBeLessThanOrEqual(MAX_ANSWER_NODES);
    // 30 days at 20 s: 129 601 nodes, over the cap.
    expect(answerSize([T0, T0 + 30 * 24 * H], { zwdIntervalS: 20, gradients: false, gradientIntervalS: 21_600 }).zwdNodes).toBeGreaterThan(
      MAX_ANSWER_NODES,
    );
  });
});

const ENTRY_POINTS = [
  [
    'POST /v1/zwd-estimates',
    { body: enc({ site: SITE, observations: OBSERVATIONS, options: { zwd_interval_s: 1 } }), format: 'json' as const, query: {} },
  ],
  [
    'POST /v1/stations/{id}/zwd-estimates',
    {
      body: enc({ observations: OBSERVATIONS, options: { zwd_interval_s: 1 } }),
      format: 'json' as const,
      query: {},
      station: { site: { latitudeDeg: 46.2, longitudeDeg: 7.4, heightM: 520 } },
    },
  ],
] as const;

describe.each(ENTRY_POINTS)('%s: the amplification request', (_name, input) => {
  it('is a 422 naming zwd_interval_s and how to ask for less, and the estimator is not called', async () => {
    expect(input.body.byteLength).toBeLessThan(600);
    vi.mocked(estimate.estimateZwd).mockClear();
    const outcome = await handleZwdRequest(input);
    expect(vi.mocked(estimate.estimateZwd)).not.toHaveBeenCalled();
    expect(outcome.ok).toBe(false);
    if (outcome.ok) return;
    expect(outcome.error.status).toBe(422);
    expect(outcome.error.errors?.[0]?.field).toBe('options.zwd_interval_s');
    expect(outcome.error.detail).toMatch(/198012 output nodes .* at most 90000/);
    // Room for 90 000 − 11 = 89 989 ZWD nodes: at 3 s 198 000/3 + 1 = 66 001 fit, at 2 s 99 001 do not.
    expect(outcome.error.detail).toMatch(/zwd_interval_s of at least 3 s for this span, or a shorter span/);
  });

  it('the same observations at 300-s nodes are estimated', async () => {
    vi.mocked(estimate.estimateZwd).mockClear();
    const body = JSON.parse(new TextDecoder().decode(input.body)) as { options: Record<string, unknown> };
    body.options.zwd_interval_s = 300;
    const outcome = await handleZwdRequest({ ...input, body: enc(body) });
    expect(outcome.ok, JSON.stringify(outcome)).toBe(true);
    expect(vi.mocked(estimate.estimateZwd)).toHaveBeenCalledTimes(1);
  });
});
