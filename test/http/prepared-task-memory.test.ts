/**
 * The storing estimation routes scan a body first and, when it passes the checks, hand the estimation task the
 * parsed columns with an empty `body` (src/http/tasks/prepared-request.ts). The pool's memory budget counts a task
 * by its body (taskMemoryBytes, src/http/plugins/compute-pool.ts), so such a task must say its size itself
 * (`memoryBytes`): otherwise a station's 30-day request would run beside others as if it took nothing, the budget
 * that keeps a replica under its memory limit (README "Operations") blind to it. Checked here on the calls the
 * routes make to the pool: the estimation task counts what its scan counted, for a station's estimation and for a
 * network's. (Found by the engineer of the network routes' scan hand-over: the station route lost the count when
 * its scan began handing bodies on.)
 */

import { afterEach, describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { taskMemoryBytes } from '../../src/http/plugins/compute-pool.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';
import { APRIORI, observationsOf, putStations, sim } from './network-fixtures.js';

const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const { observations } = toRequestBody(generateSyntheticResiduals({ durationS: 3600, latitudeDeg: SITE.latitude_deg, seed: 11 }));

describe('the estimation task of a storing route counts what its scan counted in the memory budget', () => {
  const { api, app, auth } = useArchiveApp(BACKENDS[0]!);
  /** The pool calls of a request, by task: the memory each is counted with. */
  let calls: { task: string; bytes: number; prepared: boolean }[] = [];
  let restore: (() => void) | undefined;

  function watchPool() {
    const compute = app().compute;
    const run = compute.run.bind(compute);
    calls = [];
    compute.run = ((task: string, input: unknown, transfer?: ArrayBuffer[]) => {
      const prepared = (input as { prepared?: unknown }).prepared !== undefined;
      calls.push({ task, bytes: taskMemoryBytes(input), prepared });
      return run(task as never, input as never, transfer);
    }) as typeof compute.run;
    restore = () => {
      compute.run = run;
    };
  }
  afterEach(() => restore?.());

  it('POST /v1/stations/{id}/zwd-estimates', async () => {
    await api()
      .put('/v1/stations/MEM1')
      .set('authorization', auth)
      .send({ name: 'Memory share test (invented)', ...SITE })
      .expect(201);
    watchPool();
    await api()
      .post('/v1/stations/MEM1/zwd-estimates')
      .set('authorization', auth)
      .send({ observations, apriori: { zhd_m: 2.17, zwd_m: 0.05 }, options: { zwd_interval_s: 900 } })
      .expect(200);
    const scan = calls.find((c) => c.task === 'zwd-request-scan')!;
    const estimation = calls.find((c) => c.task === 'zwd-estimate-request')!;
    expect(scan.bytes).toBeGreaterThan(0);
    expect(estimation.prepared).toBe(true); // the hand-over took place: the body went on as columns
    expect(estimation.bytes).toBe(scan.bytes);
  });

  it('POST /v1/network/zwd-estimates', { timeout: 60_000 }, async () => {
    const s = sim(37, 'estimated');
    await putStations(api, auth, s);
    watchPool();
    await api()
      .post('/v1/network/zwd-estimates?source=memory-share')
      .set('authorization', auth)
      .send({
        stations: s.stations.map((st) => ({ id: st.name, apriori: APRIORI })),
        observations: observationsOf(s),
        options: { zwd_interval_s: 600 },
      })
      .expect(200);
    const scan = calls.find((c) => c.task === 'network-request-scan')!;
    const estimation = calls.find((c) => c.task === 'network-estimate-request')!;
    expect(scan.bytes).toBeGreaterThan(0);
    expect(estimation.prepared).toBe(true);
    expect(estimation.bytes).toBe(scan.bytes);
  });
});
