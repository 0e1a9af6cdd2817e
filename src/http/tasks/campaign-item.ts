/**
 * One campaign item's estimation as a compute task (worker thread): the day's residuals in their stored
 * form are decoded, the campaign's options (the API's JSON, as validated at submission) go through the
 * options schema and the adapters of the estimation routes, and the estimation runs as for
 * POST /v1/stations/{id}/zwd-estimates without a body `met` or `apriori` (the station's stored met when
 * there is some). The rows to store come back; the campaign runner stores them.
 */

import { DEG } from '../../domain/constants.js';
import { decodeResidualDay } from '../../formats/residual-day-form.js';
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
}

export async function estimateCampaignItemTask(input: Omit<ItemEstimateInput, 'source'>): Promise<TaskOutcome<CampaignItemOutput>> {
  try {
    const day = decodeResidualDay(input.day, input.residuals);
    const observations = {
      epochMs: day.epochMs,
      satellite: day.satellite,
      elevationRad: day.elevationDeg.map((e) => e * DEG),
      azimuthRad: day.azimuthDeg.map((a) => a * DEG),
      residualM: day.residualM,
      sigmaM: day.sigmaM,
    };
    const options = zwdOptionsSchema.parse(input.options) as ZwdEstimationBody['options'];
    const site = { latitudeDeg: input.site.latitudeDeg, longitudeDeg: input.site.longitudeDeg, heightM: input.site.heightM };
    const result = runZwdEstimation(toZwdRequest(site, { options }, observations, input.storedMet));
    const delays = delayColumns(result);
    checkStorableDelays(delays);
    return {
      ok: true,
      output: { delays, modelFingerprint: result.modelFingerprint, models: result.models, observations: observations.epochMs.length },
    };
  } catch (err) {
    return asOutcome(err);
  }
}
