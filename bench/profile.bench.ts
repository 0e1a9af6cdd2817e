/**
 * Profile delays: integration and ray tracing at 10 elevations through a 100-level profile
 * (target < 20 ms, issue 6), through the domain function and through the HTTP route in-process.
 * The profile is the U.S. Standard Atmosphere 1976 with the generator's humidity rule, 100 levels
 * from 0 to 30 km (scripts/generators/us-standard-atmosphere-1976.ts).
 */

import { column, stretchedHeightsM, toApiLevels } from '../scripts/generators/us-standard-atmosphere-1976.js';
import { DEG } from '../src/domain/constants.js';
import { niellModel } from '../src/domain/mapping/niell.js';
import { computeProfileDelays } from '../src/domain/profile/profile-delays.js';
import { buildApp } from '../src/http/app.js';

const ELEVATIONS_DEG = [3, 5, 7, 10, 15, 20, 30, 45, 60, 90];

function stats(samplesMs: number[]): string {
  const s = [...samplesMs].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.floor(p * s.length))]!;
  return `median ${q(0.5).toFixed(2)} ms, p95 ${q(0.95).toFixed(2)} ms, min ${s[0]!.toFixed(2)} ms (${s.length} runs)`;
}

export default async function profileBench(): Promise<string[]> {
  const lines: string[] = [];
  for (const nLevels of [100, 1000]) {
    const generated = column(stretchedHeightsM(nLevels, 0, 30_000), { surfaceRelativeHumidityPct: 70 });
    const levels = generated.map((l) => ({
      heightM: l.heightM,
      pressureHpa: l.pressureHpa,
      temperatureC: l.temperatureK - 273.15,
      vapourPressureHpa: l.vapourPressureHpa,
    }));
    const modelMapping = niellModel.prepare({ latitudeRad: 45 * DEG, heightM: 0, dayOfYear: 119.3 });
    const run = () =>
      computeProfileDelays({
        latitudeRad: 45 * DEG,
        siteHeightM: 0,
        levels,
        elevationsRad: ELEVATIONS_DEG.map((e) => e * DEG),
        modelMapping,
      });
    let started = performance.now();
    const first = run();
    const coldMs = performance.now() - started;
    const samples: number[] = [];
    for (let i = 0; i < 200; i++) {
      started = performance.now();
      run();
      samples.push(performance.now() - started);
    }
    lines.push(
      `domain, ${nLevels} levels (${first.column.shells} shells), ZHD/ZWD/PWV/Tm + 10 rays: first call ${coldMs.toFixed(1)} ms; then ${stats(samples)}`,
    );
  }

  const app = await buildApp();
  try {
    const payload = {
      site: { latitude_deg: 45, longitude_deg: 10, height_m: 0 },
      epoch: '2026-04-29T07:00:00Z',
      levels: toApiLevels(column(stretchedHeightsM(100, 0, 30_000), { surfaceRelativeHumidityPct: 70 })),
      elevations_deg: ELEVATIONS_DEG,
    };
    for (let i = 0; i < 20; i++) await app.inject({ method: 'POST', url: '/v1/profile-delays', payload });
    const samples: number[] = [];
    for (let i = 0; i < 200; i++) {
      const started = performance.now();
      const res = await app.inject({ method: 'POST', url: '/v1/profile-delays', payload });
      samples.push(performance.now() - started);
      if (res.statusCode !== 200) throw new Error(`profile bench: HTTP ${res.statusCode} ${res.body}`);
    }
    lines.push(`HTTP in-process (inject), 100 levels, 10 elevations, validation + serialisation included: ${stats(samples)}`);
  } finally {
    await app.close();
  }
  lines.push('target (issue 6): integration and ray tracing at 10 elevations through a 100-level profile < 20 ms');
  return lines;
}
