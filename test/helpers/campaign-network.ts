/**
 * An invented network for the campaign tests and benchmark: stations named CAMP01, CAMP02 … on land-free
 * made-up coordinates, and for each station-day the residuals of the committed synthetic generator
 * (scripts/synthetic-residuals.ts) with a known ZWD truth, as a deposit body.
 */

import { generateSyntheticResiduals, toRequestBody, type SyntheticData } from '../../scripts/synthetic-residuals.js';

export interface InventedStation {
  id: string;
  body: { name: string; latitude_deg: number; longitude_deg: number; height_m: number };
}

export function inventedStations(count: number): InventedStation[] {
  return Array.from({ length: count }, (_, k) => ({
    id: `CAMP${String(k + 1).padStart(2, '0')}`,
    body: {
      name: `Invented station ${k + 1}`,
      latitude_deg: 40 + (k % 10) * 1.5,
      longitude_deg: 5 + Math.floor(k / 10) * 2,
      height_m: 200 + 37 * k,
    },
  }));
}

export interface StationDayData {
  data: SyntheticData;
  body: { observations: ReturnType<typeof toRequestBody>['observations'] };
}

/** One station-day of residuals: `hours` from 00:00 UTC at `samplingS`, seeded by station and day. */
export function stationDay(station: InventedStation, stationIndex: number, day: string, hours: number, samplingS: number): StationDayData {
  const seed = stationIndex * 1000 + Number(day.slice(8, 10));
  const data = generateSyntheticResiduals({
    seed,
    startIso: `${day}T00:00:00Z`,
    durationS: hours * 3600 - samplingS,
    samplingS,
    latitudeDeg: station.body.latitude_deg,
    longitudeDeg: station.body.longitude_deg,
    heightM: station.body.height_m,
  });
  return { data, body: { observations: toRequestBody(data).observations } };
}
