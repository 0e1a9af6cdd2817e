/**
 * One campaign item's estimation as a compute task (worker thread): the residuals of the days it reads,
 * in their stored form, are decoded and cut to the item's window [fromMs, toMs); the campaign's options
 * (the API's JSON, as validated at submission) go through the options schema and the adapters of the
 * estimation routes, and the estimation runs as for POST /v1/stations/{id}/zwd-estimates without a body
 * `met` or `apriori` (the station's stored met when there is some). The rows to store come back (the
 * campaign runner stores those of the kept part); `noInput` when the kept part has no observation.
 */

import { DEG } from '../../domain/constants.js';
import { decodeResidualDay } from '../../formats/residual-day-form.js';
import { MAX_OBSERVATIONS } from '../../limits.js';
import type { ItemEstimateInput } from '../../services/campaigns/campaign-runner.js';
import { checkStorableDelays, delayColumns, runZwdEstimation, type DelayColumns } from '../../services/zwd-estimation.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { toZwdRequest } from '../adapters/zwd-estimation.js';
import { zwdOptionsSchema, type ZwdEstimationBody } from '../schemas/zwd-estimates.js';
import { asOutcome } from './task-errors.js';

export interface CampaignItemOutput {
  delays: DelayColumns;
  modelFingerprint: string;
  models: Record<string, string | number | boolean | null>;
  observations: number;
  /** True when no observation lies in the item's kept part: nothing was estimated. */
  noInput: boolean;
}

const NO_DELAYS = (): DelayColumns => ({
  epochMs: new Float64Array(0),
  ztdM: new Float64Array(0),
  sigmaM: new Float64Array(0),
  zwdM: new Float64Array(0),
  northGradientM: new Float64Array(0),
  eastGradientM: new Float64Array(0),
  northGradientSigmaM: new Float64Array(0),
  eastGradientSigmaM: new Float64Array(0),
});

/** The observations of the item's days within [fromMs, toMs), in time order (days are sorted by epoch). */
function windowObservations(input: Omit<ItemEstimateInput, 'source'>) {
  const out = {
    epochMs: [] as number[],
    satellite: [] as string[],
    elevationRad: [] as number[],
    azimuthRad: [] as number[],
    residualM: [] as number[],
    sigmaM: undefined as (number | null)[] | undefined,
  };
  const sigma: (number | null)[] = [];
  let anySigma = false;
  for (const { day, data } of [...input.residuals].sort((a, b) => (a.day < b.day ? -1 : 1))) {
    const d = decodeResidualDay(day, data);
    for (let k = 0; k < d.epochMs.length; k++) {
      const t = d.epochMs[k]!;
      if (t < input.fromMs || t >= input.toMs) continue;
      out.epochMs.push(t);
      out.satellite.push(d.satellite[k]!);
      out.elevationRad.push(d.elevationDeg[k]! * DEG);
      out.azimuthRad.push(d.azimuthDeg[k]! * DEG);
      out.residualM.push(d.residualM[k]!);
      const s = d.sigmaM?.[k] ?? null;
      if (s !== null) anySigma = true;
      sigma.push(s);
    }
  }
  if (anySigma) out.sigmaM = sigma;
  return out;
}

export async function estimateCampaignItemTask(input: Omit<ItemEstimateInput, 'source'>): Promise<TaskOutcome<CampaignItemOutput>> {
  try {
    const observations = windowObservations(input);
    if (observations.epochMs.length > MAX_OBSERVATIONS) {
      const n = observations.epochMs.length;
      return {
        ok: false,
        error: {
          status: 413,
          detail: `${n} observations in the item's window; one estimation takes at most ${MAX_OBSERVATIONS}: use a shorter window`,
        },
      };
    }
    if (!observations.epochMs.some((t) => t >= input.keepFromMs && t < input.keepToMs)) {
      return { ok: true, output: { delays: NO_DELAYS(), modelFingerprint: '', models: {}, observations: 0, noInput: true } };
    }
    const options = zwdOptionsSchema.parse(input.options) as ZwdEstimationBody['options'];
    const site = { latitudeDeg: input.site.latitudeDeg, longitudeDeg: input.site.longitudeDeg, heightM: input.site.heightM };
    const result = runZwdEstimation(toZwdRequest(site, { options }, observations, input.storedMet));
    const delays = delayColumns(result);
    checkStorableDelays(delays);
    return {
      ok: true,
      output: {
        delays,
        modelFingerprint: result.modelFingerprint,
        models: result.models,
        observations: observations.epochMs.length,
        noInput: false,
      },
    };
  } catch (err) {
    return asOutcome(err);
  }
}
