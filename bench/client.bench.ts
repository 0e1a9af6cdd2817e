/**
 * What the client costs its caller: the CPU time of cutting an observation CSV into UTC days and hashing
 * each day's body (the work a rerun repeats before it can skip a day), and a deposit of those days to a
 * running service (SQLite, its own process) followed by the rerun that skips them all. CPU time of this
 * process (process.cpuUsage: the client's share only), wall time beside it; ranges over 3 runs.
 */

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { partText, splitCsvByDay } from '../client/src/day-split.js';
import { depositResiduals } from '../client/src/residual-deposit.js';
import { Service } from '../client/src/service.js';
import { sha256Hex } from '../client/src/upload-state.js';
import { generateSyntheticResiduals, toCsv } from '../scripts/synthetic-residuals.js';
import { startServerProcess } from '../test/helpers/server-process.js';

const DAYS = 7;
const KEY = 'client-bench-writer-0123456789';

function cpuMs(start: NodeJS.CpuUsage): number {
  const d = process.cpuUsage(start);
  return (d.user + d.system) / 1000;
}

const range = (xs: number[], digits = 0) => `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)}`;

export default async function clientBench(): Promise<string[]> {
  // 7 days of 30 s epochs from the committed generator (invented site and satellites)
  const csv = toCsv(generateSyntheticResiduals({ durationS: DAYS * 86_400 - 30, samplingS: 30 }));
  const rows = csv.split('\n').length - 2;
  const lines = [`input: ${DAYS} days, ${rows} observations, ${(csv.length / 1e6).toFixed(1)} MB of CSV`];

  const splitCpu: number[] = [];
  for (let run = 0; run < 3; run++) {
    const start = process.cpuUsage();
    const split = splitCsvByDay(csv, 'bench.csv', 'refuse');
    for (const part of split.parts) sha256Hex(partText(split, part));
    splitCpu.push(cpuMs(start));
  }
  lines.push(
    `cut into days + sha256 of each day: ${range(splitCpu)} ms CPU (${range(
      splitCpu.map((ms) => rows / ms / 1000),
      2,
    )} M observations per CPU-second)`,
  );

  const dataDir = mkdtempSync(join(tmpdir(), 'tropodelay-client-bench-'));
  const server = await startServerProcess({ TROPODELAY_DATA_DIR: dataDir, TROPODELAY_API_KEYS: `bench:admin:${KEY}` }, true);
  try {
    const service = new Service({ baseUrl: server.baseUrl, key: KEY });
    await service.request('PUT', '/v1/stations/BENCH', {
      json: { name: 'Bench (invented)', latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 },
    });
    const file = join(dataDir, 'bench.csv');
    writeFileSync(file, csv);
    const deposit: Array<[number, number]> = [];
    const rerun: Array<[number, number]> = [];
    for (let run = 0; run < 3; run++) {
      for (const [target, force] of [
        [deposit, true],
        [rerun, false],
      ] as const) {
        const start = process.cpuUsage();
        const t0 = performance.now();
        const result = await depositResiduals(service, { stationId: 'BENCH', file, force });
        target.push([cpuMs(start), performance.now() - t0]);
        if (result.daysSent + result.daysSkipped !== DAYS) throw new Error('not every day deposited or skipped');
      }
    }
    lines.push(
      `deposit of ${DAYS} days (forced): client ${range(deposit.map((d) => d[0]))} ms CPU, ${range(deposit.map((d) => d[1]))} ms wall`,
      `rerun, every day skipped (list + cut + hash): client ${range(rerun.map((d) => d[0]))} ms CPU, ${range(rerun.map((d) => d[1]))} ms wall`,
    );
  } finally {
    await server.stop();
    rmSync(dataDir, { recursive: true, force: true });
  }
  return lines;
}
