/**
 * Who holds a ZWD request's body while it is estimated (issue 14, memory of 30-day requests): the pool's
 * task (zwdRequestTask, registered in src/http/compute-tasks.ts) owns its input and drops the body bytes
 * and a prepared body's typed columns once read, before the estimation starts (observed on the
 * zwdEstimationStart channel); handleZwdRequest, called in-process, leaves its caller's input as it was.
 * Both answer the same bytes. The expected behaviour is this project's own design (common practice:
 * a buffer no longer referenced can be collected); the answers are compared with each other, the
 * estimation's values being checked against their sources in test/estimation/.
 */

import { subscribe, unsubscribe } from 'node:diagnostics_channel';
import { afterEach, describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toCsv, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { COMPUTE_TASKS } from '../../src/http/compute-tasks.js';
import {
  handleZwdRequest,
  scanZwdRequest,
  zwdEstimationStart,
  zwdRequestTask,
  type ZwdRequestTaskInput,
} from '../../src/http/tasks/zwd-request.js';

const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const STATION = { site: { latitudeDeg: 46.2, longitudeDeg: 7.4, heightM: 520 } };
const data = generateSyntheticResiduals({ durationS: 3600, latitudeDeg: SITE.latitude_deg, seed: 5 });
const { observations } = toRequestBody(data);
const columns = {
  epoch: observations.map((o) => o.epoch),
  satellite: observations.map((o) => o.satellite),
  elevation_deg: observations.map((o) => o.elevation_deg),
  azimuth_deg: observations.map((o) => o.azimuth_deg),
  residual_m: observations.map((o) => o.residual_m),
};
const enc = (o: unknown) => new TextEncoder().encode(JSON.stringify(o));
const siteQuery = { latitude_deg: String(SITE.latitude_deg), longitude_deg: String(SITE.longitude_deg), height_m: String(SITE.height_m) };

const INPUTS: [string, () => ZwdRequestTaskInput][] = [
  ['columns JSON', () => ({ body: enc({ site: SITE, observations: columns }), format: 'json', query: {} })],
  ['rows JSON', () => ({ body: enc({ site: SITE, observations }), format: 'json', query: {} })],
  ['text/csv', () => ({ body: toCsv(data), format: 'csv', query: siteQuery })],
];

let listener: ((message: unknown) => void) | undefined;
afterEach(() => {
  if (listener) unsubscribe(zwdEstimationStart.name, listener);
  listener = undefined;
});

/** What the input holds when the estimation starts (the channel is published just before it). */
function watchInput(input: ZwdRequestTaskInput): { seen: { body: unknown; prepared: unknown; observations: unknown }[] } {
  const seen: { body: unknown; prepared: unknown; observations: unknown }[] = [];
  listener = (message) =>
    seen.push({ body: input.body, prepared: input.prepared, observations: (message as { observations: number }).observations });
  subscribe(zwdEstimationStart.name, listener);
  return { seen };
}

describe('zwdRequestTask: the body is dropped before the estimation', () => {
  it('the pool runs zwdRequestTask for zwd-estimate-request', () => {
    expect(COMPUTE_TASKS['zwd-estimate-request'].exportName).toBe('zwdRequestTask');
  });

  it.each(INPUTS)(
    '%s: the task empties its input before estimating, the answer is the in-process one byte for byte',
    async (_name, make) => {
      const callerInput = make();
      const sent = callerInput.body;
      const direct = await handleZwdRequest(callerInput);
      // handleZwdRequest leaves the caller's input as it was (it may be sent again).
      expect(callerInput.body).toBe(sent);

      const owned = make();
      const { seen } = watchInput(owned);
      const viaTask = await zwdRequestTask(owned);
      expect(seen).toEqual([{ body: '', prepared: undefined, observations: observations.length }]);
      expect(direct.ok && viaTask.ok).toBe(true);
      if (!direct.ok || !viaTask.ok) return;
      expect(Buffer.from(viaTask.output.json).equals(Buffer.from(direct.output.json))).toBe(true);
    },
  );

  it("a station's prepared body: its typed columns are dropped too, the answer unchanged", async () => {
    const query = {};
    const body = enc({ observations: columns });
    const scan = await scanZwdRequest({ body, format: 'json', query, queryKeys: [] });
    expect(scan.ok).toBe(true);
    if (!scan.ok) return;
    const prepared = scan.output.prepared;
    expect(prepared).toBeDefined();
    const direct = await handleZwdRequest({ body, format: 'json', query, queryKeys: [], station: STATION });
    const owned: ZwdRequestTaskInput = { body: '', format: 'json', query, queryKeys: [], station: STATION, prepared };
    const { seen } = watchInput(owned);
    const viaTask = await zwdRequestTask(owned);
    expect(seen).toEqual([{ body: '', prepared: undefined, observations: observations.length }]);
    expect(direct.ok && viaTask.ok).toBe(true);
    if (!direct.ok || !viaTask.ok) return;
    expect(Buffer.from(viaTask.output.json).equals(Buffer.from(direct.output.json))).toBe(true);
  });
});
