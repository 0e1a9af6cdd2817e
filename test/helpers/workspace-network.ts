/**
 * An invented network for the page tests and benchmarks, written straight into a repository:
 * stations on land (inland places of central and western Europe chosen by hand, names invented),
 * delays every `stepMin` minutes whose ZTD comes from the known truth of scripts/synthetic/network.ts,
 * hourly met at the antenna, and a few planted flags:
 *   2nd station: ztd_sigma_m 0.03 m every 7th epoch (delay-sigma-large)
 *   3rd station: no ztd_sigma_m on the second day (delay-sigma-unknown)
 *   4th station: a met outage of 8 h on the first day (met-missing)
 *   the last station: no delays at all (no value on the map)
 */

import { provenance } from '../../src/domain/provenance.js';
import type { DelayRow, MetRow, Repository } from '../../src/storage/repository.js';
import { round1, truthSeries, type SyntheticStation } from '../../scripts/synthetic/network.js';

/** Inland places (lat, lon) [deg]: each more than 50 km from any coast. */
const INLAND: [number, number][] = [
  [48.5, 9.0],
  [50.1, 8.0],
  [47.0, 2.0],
  [46.6, 11.4],
  [51.4, 10.5],
  [49.6, 17.8],
  [52.0, 13.0],
  [44.3, 4.6],
  [48.0, 16.0],
  [50.4, 4.9],
  [47.4, 6.5],
  [45.6, 9.6],
];
const SYLLABLES = ['bra', 'cen', 'dor', 'fal', 'gry', 'hol', 'isk', 'kel', 'lum', 'mor', 'nev', 'pel', 'quo', 'rist', 'sal', 'tov'];

export interface SeedOptions {
  stations: number;
  days: number;
  stepMin: number;
  startMs: number;
}

export function workspaceStations(n: number): SyntheticStation[] {
  return Array.from({ length: n }, (_, i) => {
    const [lat, lon] = INLAND[i % INLAND.length]!;
    // Beyond the 12 places: small offsets around them (at most ±0.8°, still inland).
    const k = Math.floor(i / INLAND.length);
    const dLat = k === 0 ? 0 : ((k * 37) % 17) / 10 - 0.8;
    const dLon = k === 0 ? 0 : ((k * 53) % 17) / 10 - 0.8;
    const name = `${SYLLABLES[i % 16]}${SYLLABLES[(i * 7 + 3) % 16]}`;
    return {
      stationId: `WS${String(i + 1).padStart(4, '0')}`,
      name: `${name[0]!.toUpperCase()}${name.slice(1)} (invented)`,
      latitudeDeg: Math.round((lat + dLat) * 1000) / 1000,
      longitudeDeg: Math.round((lon + dLon) * 1000) / 1000,
      heightM: 150 + ((i * 97) % 600),
      description: 'Invented station for the workspace tests (demo data)',
    };
  });
}

export const WORKSPACE_MODELS = provenance({ producer: 'workspace test network', mapping: 'niell' });

export async function seedWorkspaceNetwork(repo: Repository, options: SeedOptions): Promise<SyntheticStation[]> {
  const stations = workspaceStations(options.stations);
  const stepMs = options.stepMin * 60_000;
  const count = Math.round((options.days * 86_400_000) / stepMs);
  const modelSet = { modelFingerprint: WORKSPACE_MODELS.model_fingerprint, models: WORKSPACE_MODELS.models };
  for (const [i, s] of stations.entries()) {
    await repo.putStation(s.stationId, {
      name: s.name,
      latitudeDeg: s.latitudeDeg,
      longitudeDeg: s.longitudeDeg,
      heightM: s.heightM,
      metHeightM: null,
      description: s.description,
    });
    if (i === stations.length - 1 && stations.length > 3) continue;
    const truth = truthSeries(s, options.startMs, count, stepMs, i + 1);
    const met: MetRow[] = [];
    for (const r of truth) {
      if (r.epochMs % 3_600_000 !== 0) continue;
      const hour = (r.epochMs - options.startMs) / 3_600_000;
      if (i === 3 && hour >= 6 && hour < 14) continue;
      met.push({
        epochMs: r.epochMs,
        source: 'met-sensor',
        pressureHpa: round1(r.pressureHpa),
        temperatureC: round1(r.temperatureC),
        relativeHumidityPct: round1(r.relativeHumidityPct),
        dewpointC: null,
        vapourPressureHpa: null,
      });
    }
    await repo.writeMet(s.stationId, met);
    const delays: DelayRow[] = truth.map((r, k) => ({
      epochMs: r.epochMs,
      source: 'gnss-run',
      ztdM: Math.round(r.ztdM * 1e4) / 1e4,
      ztdSigmaM: i === 1 && k % 7 === 0 ? 0.03 : i === 2 && r.epochMs >= options.startMs + 86_400_000 ? null : 0.004,
      zwdM: null,
      zwdSigmaM: null,
      northGradientM: null,
      eastGradientM: null,
      northGradientSigmaM: null,
      eastGradientSigmaM: null,
      modelFingerprint: WORKSPACE_MODELS.model_fingerprint,
    }));
    await repo.writeDelays(s.stationId, delays, modelSet);
  }
  return stations;
}
