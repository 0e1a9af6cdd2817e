/**
 * Stored met at the antenna height: the one place that turns a station's met rows (taken at
 * met_height_m) into pressure and temperature at the antenna (heightM), for the estimation of a
 * station (storedMetAtAntenna) and the station PWV retrieval (antennaReduction).
 *
 * Reduction: src/domain/meteo/height-reduction.ts (hypsometric pressure, −6.5 K/km); heights more
 * than MAX_REDUCTION_HEIGHT_DIFFERENCE_M apart are refused (ModelDomainError, 422).
 */

import { checkReductionHeight, reducePressureHpa, reduceTemperatureC } from '../domain/meteo/height-reduction.js';
import type { MetRow, Station } from '../storage/repository.js';

/** Met columns in domain units: epoch [ms], pressure [hPa], temperature [°C]; element i belongs to record i. */
export interface MetColumns {
  epochMs: number[];
  pressureHpa: number[];
  temperatureC: number[];
}

/** The station's reduction from the met sensor to the antenna: ΔH = antenna − sensor [m] and the two functions. */
export function antennaReduction(station: Pick<Station, 'heightM' | 'metHeightM'>, field = 'station.met_height_m') {
  const dHeightM = station.metHeightM === null ? 0 : station.heightM - station.metHeightM;
  checkReductionHeight(dHeightM, field);
  return {
    dHeightM,
    /** Pressure at the antenna [hPa] from the sensor's pressure [hPa] and temperature [°C]. */
    pressureHpa: (pressureHpa: number, temperatureC: number) =>
      dHeightM === 0 ? pressureHpa : reducePressureHpa(pressureHpa, temperatureC, dHeightM),
    /** Temperature at the antenna [°C]. */
    temperatureC: (temperatureC: number) => reduceTemperatureC(temperatureC, dHeightM),
  };
}

/**
 * Stored met rows (sorted by epoch, source) → met at the antenna height for an estimation: rows
 * with both pressure and temperature, one per epoch (the first source in name order), reduced.
 */
export function storedMetAtAntenna(station: Pick<Station, 'heightM' | 'metHeightM'>, rows: readonly MetRow[]): MetColumns {
  const reduce = antennaReduction(station);
  const out: MetColumns = { epochMs: [], pressureHpa: [], temperatureC: [] };
  let lastEpochMs = Number.NaN;
  for (const r of rows) {
    if (r.pressureHpa === null || r.temperatureC === null || r.epochMs === lastEpochMs) continue;
    lastEpochMs = r.epochMs;
    out.epochMs.push(r.epochMs);
    out.pressureHpa.push(reduce.pressureHpa(r.pressureHpa, r.temperatureC));
    out.temperatureC.push(reduce.temperatureC(r.temperatureC));
  }
  return out;
}
