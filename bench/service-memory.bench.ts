/**
 * Peak memory of one replica under estimation load through HTTP (issue 14: "peak RSS per replica under
 * the estimation benchmark stated, and under 600 MB with default settings"). The service runs in its own
 * process with its default settings (worker pool of TROPODELAY_ESTIMATION_WORKERS=2, as on a 2-core
 * replica); two clients send one day of 30-s synthetic data as column arrays, back to back, then one
 * near-limit request (the largest number of observations under MAX_OBSERVATIONS, columns JSON, and the
 * same as an Arrow table) while the clients go on. The figure is the service process's peak resident set
 * (VmHWM of /proc/<pid>/status: the main thread, the workers and their heaps), and the resident set after.
 */

import { readFileSync } from 'node:fs';
import { tableFromArrays, tableToIPC, type Table } from 'apache-arrow';
import { generateSyntheticResiduals, toRequestBody } from '../scripts/synthetic-residuals.js';
import { MAX_OBSERVATIONS } from '../src/limits.js';
import { startServerProcess, type ServerProcess } from '../test/helpers/server-process.js';

const ARROW = 'application/vnd.apache.arrow.stream';

const statusMb = (pid: number, field: string) => {
  const m = new RegExp(`${field}:\\s+(\\d+) kB`).exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : NaN;
};

/** Synthetic observations of `days` days as the API's columns, with the rest of the request. */
function columnsRequest(days: number, maxRows = Infinity) {
  const body = toRequestBody(generateSyntheticResiduals({ durationS: days * 86_400, grossErrors: 5 * days }));
  const rows = body.observations.slice(0, maxRows);
  const columns = Object.fromEntries(
    (['epoch', 'satellite', 'elevation_deg', 'azimuth_deg', 'residual_m'] as const).map((k) => [k, rows.map((r) => r[k])]),
  );
  return { rest: { site: body.site, apriori: { zhd_m: 2.2 } }, columns, count: rows.length };
}

async function post(server: ServerProcess, body: string | Uint8Array<ArrayBuffer>, type: string) {
  const res = await fetch(`${server.baseUrl}/v1/zwd-estimates?fields=ztd_m,sigma_m`, {
    method: 'POST',
    body,
    headers: { 'content-type': type },
  });
  await res.arrayBuffer();
  if (!res.ok) throw new Error(`${res.status}`);
}

export default async function bench(): Promise<string[]> {
  const server = await startServerProcess({ TROPODELAY_ESTIMATION_WORKERS: '2' }, true);
  const pid = server.child.pid!;
  try {
    const day = columnsRequest(1);
    const dayBody = JSON.stringify({ ...day.rest, observations: day.columns });
    // The near-limit request: 22 days hold more than MAX_OBSERVATIONS at this sky; the first MAX_OBSERVATIONS rows.
    const big = columnsRequest(22, MAX_OBSERVATIONS);
    const bigJson = JSON.stringify({ ...big.rest, observations: big.columns });
    const table = tableFromArrays({
      epoch: big.columns.epoch as string[],
      satellite: big.columns.satellite as string[],
      elevation_deg: Float64Array.from(big.columns.elevation_deg as number[]),
      azimuth_deg: Float64Array.from(big.columns.azimuth_deg as number[]),
      residual_m: Float64Array.from(big.columns.residual_m as number[]),
    }) as Table;
    table.schema.metadata.set('request', JSON.stringify(big.rest));
    const bigArrow = tableToIPC(table, 'stream') as Uint8Array<ArrayBuffer>;

    const idleMb = statusMb(pid, 'VmRSS');
    let running = true;
    let dayRequests = 0;
    const client = async () => {
      while (running) {
        await post(server, dayBody, 'application/json');
        dayRequests++;
      }
    };
    const clients = [client(), client()];
    await new Promise((r) => setTimeout(r, 5000));
    const loadMb = statusMb(pid, 'VmHWM');
    const t0 = performance.now();
    await post(server, bigJson, 'application/json');
    const jsonS = (performance.now() - t0) / 1000;
    const afterJsonMb = statusMb(pid, 'VmHWM');
    const t1 = performance.now();
    await post(server, bigArrow, ARROW);
    const arrowS = (performance.now() - t1) / 1000;
    running = false;
    await Promise.all(clients);
    const peakMb = statusMb(pid, 'VmHWM');
    return [
      `service memory, default settings with 2 workers (MB): idle ${idleMb.toFixed(0)}, peak under two clients of 1-day requests (${day.count} observations, columns JSON) ${loadMb.toFixed(0)},`,
      `  peak with a near-limit request too (${big.count} observations: columns JSON ${(bigJson.length / 1e6).toFixed(1)} MB in ${jsonS.toFixed(1)} s) ${afterJsonMb.toFixed(0)}, and as Arrow (${(bigArrow.length / 1e6).toFixed(1)} MB in ${arrowS.toFixed(1)} s) ${peakMb.toFixed(0)} (target < 600); ${dayRequests} day requests meanwhile`,
    ];
  } finally {
    await server.stop();
  }
}
