/**
 * PWV/ZTD of stations as a netCDF file following the CF Conventions 1.8, discrete sampling geometry
 * "timeSeries" in the orthogonal multidimensional representation (CF 1.8 §9.3.1, Example H.2):
 * data variables (station, time) on one common time axis, missing values as _FillValue, the
 * station identifier with cf_role = "timeseries_id" (§9.5), coordinates lat, lon, height per station.
 *
 * Standard names (CF standard name table) where one exists:
 *   pwv            lwe_thickness_of_atmosphere_mass_content_of_water_vapor [mm]
 *   pwv_sigma      the same with the modifier "standard_error" (CF Appendix C)
 *   air_pressure   surface_air_pressure [hPa], air_temperature air_temperature [degC]
 *   lat, lon       latitude [degrees_north], longitude [degrees_east]
 *   height         height_above_reference_ellipsoid [m] (WGS84 ellipsoidal height of the antenna)
 *   altitude       altitude [m], positive up: height above the geoid (mean sea level) of the antenna,
 *                  the station's surface altitude in the sense of CF §9.5 (the vertical coordinate of a
 *                  timeSeries station)
 *   geoid_undulation  geoid_height_above_reference_ellipsoid [m] (EGM96 N; altitude = height − N)
 *   time           time ["seconds since 1970-01-01 00:00:00", standard calendar]
 * ZTD has no standard name: long_name only. Quality flags are a byte variable with flag_values and
 * flag_meanings (CF §3.5). Interval means carry time_bnds (CF §7.1) and cell_methods "time: mean" (§7.3).
 */

import { NC_FILL, writeNetcdfClassic, type NcAttributeValue, type NcVariable } from './netcdf-classic.js';

export interface NetcdfStation {
  stationId: string;
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  heightM: number;
  /** Geoid undulation N (EGM96) [m]. */
  geoidUndulationM: number;
  /** Altitude above mean sea level, heightM − geoidUndulationM [m]. */
  altitudeM: number;
}

/** One quantity of the file: its values row-major (station, time), null where missing. */
export interface NetcdfQuantity {
  key: keyof typeof QUANTITIES;
  values: (number | null)[];
}

const f = (...values: number[]) => ({ type: 'float' as const, values });

export const QUANTITIES = {
  pwv: { long_name: 'precipitable water vapour', standard_name: 'lwe_thickness_of_atmosphere_mass_content_of_water_vapor', units: 'mm' },
  pwv_sigma: {
    long_name: 'standard uncertainty of the precipitable water vapour',
    standard_name: 'lwe_thickness_of_atmosphere_mass_content_of_water_vapor standard_error',
    units: 'mm',
  },
  pwv_sd: { long_name: 'sample standard deviation of the precipitable water vapour within the interval', units: 'mm' },
  ztd: { long_name: 'zenith total delay', units: 'm' },
  ztd_sigma: { long_name: 'standard uncertainty of the zenith total delay', units: 'm' },
  air_pressure: {
    long_name: 'pressure at the antenna height used for the hydrostatic delay',
    standard_name: 'surface_air_pressure',
    units: 'hPa',
  },
  air_temperature: { long_name: 'air temperature at the antenna height used for Tm', standard_name: 'air_temperature', units: 'degC' },
  count: { long_name: 'number of records in the PWV mean', units: '1' },
} as const;

export interface NetcdfFlags {
  /** Flag per cell, an index into `meanings` (null: no record). */
  values: (number | null)[];
  meanings: readonly string[];
}

export interface PwvNetcdfInput {
  title: string;
  stations: readonly NetcdfStation[];
  /** Common time axis [ms since 1970], increasing. */
  timesMs: readonly number[];
  /** Interval length [s] when the values are interval means (adds time_bnds, cell_methods). */
  intervalS: number | null;
  quantities: readonly NetcdfQuantity[];
  flags: NetcdfFlags | null;
  /** Free-text global attributes (source, history, references, comment, models …). */
  globals: Record<string, string>;
}

const FLAG_FILL = -127;

export function writePwvNetcdf(input: PwvNetcdfInput): Uint8Array {
  const nStation = input.stations.length;
  const nTime = input.timesMs.length;
  if (nStation === 0 || nTime === 0) throw new Error('a netCDF file needs at least one station and one epoch');
  const nameLength = Math.max(1, ...input.stations.map((s) => new TextEncoder().encode(s.stationId).length));
  const coordinates = 'lat lon altitude station_id';
  const variables: NcVariable[] = [
    {
      name: 'station_id',
      type: 'char',
      dimensions: ['station', 'id_strlen'],
      attributes: { long_name: 'station identifier', cf_role: 'timeseries_id' },
      values: input.stations.map((s) => s.stationId),
    },
    {
      name: 'lat',
      type: 'double',
      dimensions: ['station'],
      attributes: { standard_name: 'latitude', long_name: 'geodetic latitude (WGS84)', units: 'degrees_north' },
      values: input.stations.map((s) => s.latitudeDeg),
    },
    {
      name: 'lon',
      type: 'double',
      dimensions: ['station'],
      attributes: { standard_name: 'longitude', long_name: 'longitude (WGS84)', units: 'degrees_east' },
      values: input.stations.map((s) => (s.longitudeDeg > 180 ? s.longitudeDeg - 360 : s.longitudeDeg)),
    },
    {
      name: 'height',
      type: 'double',
      dimensions: ['station'],
      attributes: {
        standard_name: 'height_above_reference_ellipsoid',
        long_name: 'antenna height above the WGS84 ellipsoid',
        units: 'm',
        positive: 'up',
        axis: 'Z',
      },
      values: input.stations.map((s) => s.heightM),
    },
    {
      name: 'altitude',
      type: 'double',
      dimensions: ['station'],
      attributes: {
        standard_name: 'altitude',
        long_name: 'antenna altitude above mean sea level (EGM96 geoid)',
        units: 'm',
        positive: 'up',
      },
      values: input.stations.map((s) => s.altitudeM),
    },
    {
      name: 'geoid_undulation',
      type: 'double',
      dimensions: ['station'],
      attributes: {
        standard_name: 'geoid_height_above_reference_ellipsoid',
        long_name: 'EGM96 geoid undulation N at the station (altitude = height - N)',
        units: 'm',
      },
      values: input.stations.map((s) => s.geoidUndulationM),
    },
    {
      name: 'time',
      type: 'double',
      dimensions: ['time'],
      attributes: {
        standard_name: 'time',
        long_name: input.intervalS === null ? 'epoch (UTC)' : 'start of the averaging interval (UTC)',
        units: 'seconds since 1970-01-01 00:00:00',
        calendar: 'standard',
        axis: 'T',
        ...(input.intervalS === null ? {} : { bounds: 'time_bnds' }),
      },
      values: input.timesMs.map((t) => t / 1000),
    },
  ];
  if (input.intervalS !== null) {
    const bounds: number[] = [];
    for (const t of input.timesMs) bounds.push(t / 1000, t / 1000 + input.intervalS);
    variables.push({ name: 'time_bnds', type: 'double', dimensions: ['time', 'nv'], attributes: {}, values: bounds });
  }
  for (const q of input.quantities) {
    const meta = QUANTITIES[q.key];
    const attributes: Record<string, NcAttributeValue> =
      q.key === 'count'
        ? { long_name: meta.long_name, units: meta.units, _FillValue: { type: 'int', values: [NC_FILL.int] } }
        : { ...meta, _FillValue: f(NC_FILL.float) };
    attributes.coordinates = coordinates;
    if (input.intervalS !== null && q.key !== 'count') {
      attributes.cell_methods = q.key === 'pwv_sd' ? 'time: standard_deviation' : 'time: mean';
    }
    if (input.flags && q.key !== 'count') attributes.ancillary_variables = 'quality_flag';
    variables.push({
      name: q.key,
      type: q.key === 'count' ? 'int' : 'float',
      dimensions: ['station', 'time'],
      attributes,
      values: q.values,
    });
  }
  if (input.flags) {
    variables.push({
      name: 'quality_flag',
      type: 'byte',
      dimensions: ['station', 'time'],
      attributes: {
        long_name: 'quality of the PWV record',
        flag_values: { type: 'byte', values: input.flags.meanings.map((_, i) => i) },
        flag_meanings: input.flags.meanings.join(' '),
        _FillValue: { type: 'byte', values: [FLAG_FILL] },
        coordinates,
      },
      values: input.flags.values,
    });
  }
  return writeNetcdfClassic({
    dimensions: [
      { name: 'station', length: nStation },
      { name: 'time', length: nTime },
      { name: 'id_strlen', length: nameLength },
      ...(input.intervalS === null ? [] : [{ name: 'nv', length: 2 }]),
    ],
    attributes: { Conventions: 'CF-1.8', featureType: 'timeSeries', title: input.title, ...input.globals },
    variables,
  });
}
