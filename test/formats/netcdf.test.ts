/**
 * The netCDF classic (64-bit offset) writer and the CF station time-series files:
 *   - a tiny file byte for byte as the format specification lays it out (Unidata, "The NetCDF
 *     Classic Format Specification", netCDF User's Guide appendix), worked out by hand here;
 *   - read back with netcdfjs (npm, an independent reader): dimensions, attributes, every type;
 *   - read back with the netCDF C library through python3-netCDF4 and xarray (Debian's packages)
 *     when they are installed: values, _FillValue masking, time decoding, CF attributes.
 */

import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { NetCDFReader } from 'netcdfjs';
import { afterAll, describe, expect, it } from 'vitest';
import { NC_FILL, writeNetcdfClassic } from '../../src/formats/netcdf-classic.js';
import { writePwvNetcdf } from '../../src/formats/pwv-netcdf.js';

const dir = mkdtempSync(join(tmpdir(), 'tropodelay-nc-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Debian's python3 first (its packages python3-netcdf4 and python3-xarray), then the one on PATH. */
const PYTHON = ['/usr/bin/python3', 'python3'].find((python) => {
  try {
    execFileSync(python, ['-c', 'import netCDF4, xarray'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
});
const hasPythonNetcdf = PYTHON !== undefined;
if (!hasPythonNetcdf)
  console.warn(
    'netCDF read-back with python3-netcdf4/python3-xarray skipped: not installed (apt-get install python3-netcdf4 python3-xarray)',
  );

describe('netCDF classic format specification: a file laid out by hand', () => {
  it('writes one int variable of one dimension exactly as the specification lays it out', () => {
    const bytes = writeNetcdfClassic({
      dimensions: [{ name: 'x', length: 2 }],
      attributes: {},
      variables: [{ name: 'v', type: 'int', dimensions: ['x'], attributes: {}, values: [1, -2] }],
    });
    // prettier-ignore
    const expected = [
      0x43, 0x44, 0x46, 0x02,          // magic 'CDF', version 2 (64-bit offset)
      0, 0, 0, 0,                      // numrecs
      0, 0, 0, 0x0a, 0, 0, 0, 1,       // NC_DIMENSION, 1 dimension
      0, 0, 0, 1, 0x78, 0, 0, 0,       // name "x" padded to 4 bytes
      0, 0, 0, 2,                      // length 2
      0, 0, 0, 0, 0, 0, 0, 0,          // global attributes ABSENT
      0, 0, 0, 0x0b, 0, 0, 0, 1,       // NC_VARIABLE, 1 variable
      0, 0, 0, 1, 0x76, 0, 0, 0,       // name "v"
      0, 0, 0, 1, 0, 0, 0, 0,          // 1 dimension: id 0
      0, 0, 0, 0, 0, 0, 0, 0,          // variable attributes ABSENT
      0, 0, 0, 4,                      // NC_INT
      0, 0, 0, 8,                      // vsize 8 bytes
      0, 0, 0, 0, 0, 0, 0, 84,         // begin: the data start at byte 84 (INT64 in this variant)
      0, 0, 0, 1, 0xff, 0xff, 0xff, 0xfe, // 1, -2
    ];
    expect([...bytes]).toEqual(expected);
  });

  it('refuses a value count that does not match the dimensions, and names outside the allowed pattern', () => {
    expect(() =>
      writeNetcdfClassic({
        dimensions: [{ name: 'x', length: 3 }],
        attributes: {},
        variables: [{ name: 'v', type: 'int', dimensions: ['x'], attributes: {}, values: [1, 2] }],
      }),
    ).toThrow(/2 values/);
    expect(() => writeNetcdfClassic({ dimensions: [{ name: '1x', length: 1 }], attributes: {}, variables: [] })).toThrow(/not allowed/);
  });
});

const GENERIC = writeNetcdfClassic({
  dimensions: [
    { name: 'row', length: 3 },
    { name: 'col', length: 2 },
    { name: 'len', length: 5 },
  ],
  attributes: { title: 'every type', ints: { type: 'int', values: [7, -8] }, dbl: { type: 'double', values: [Math.PI] } },
  variables: [
    { name: 'b', type: 'byte', dimensions: ['row'], attributes: {}, values: [-1, 0, 127] },
    { name: 's', type: 'short', dimensions: ['row'], attributes: { units: 'm' }, values: [-300, 0, 300] },
    {
      name: 'f',
      type: 'float',
      dimensions: ['row', 'col'],
      attributes: { _FillValue: { type: 'float', values: [NC_FILL.float] } },
      values: [0.5, 1.25, null, -2, 3, 4],
    },
    { name: 'd', type: 'double', dimensions: ['row', 'col'], attributes: {}, values: [1e-9, 2.5, 3, 4, 5, 6.125] },
    { name: 'names', type: 'char', dimensions: ['row', 'len'], attributes: {}, values: ['ab', 'cdefg', 'h'] },
  ],
});

describe('read back with netcdfjs (npm)', () => {
  it('gives the same dimensions, attributes and values for every type', () => {
    const r = new NetCDFReader(GENERIC);
    expect(r.version).toBe('64-bit offset format');
    expect(r.dimensions.map((d) => [d.name, d.size])).toEqual([
      ['row', 3],
      ['col', 2],
      ['len', 5],
    ]);
    expect(r.getAttribute('title')).toBe('every type');
    expect(r.globalAttributes.find((a) => a.name === 'ints')!.value).toEqual([7, -8]);
    expect(r.getAttribute('dbl')).toBe(Math.PI);
    // netcdfjs 4.0 reads a byte variable as unsigned one-element arrays over the padded size (4 here): first 3, to signed.
    const bytesRead = (r.getDataVariable('b') as unknown as number[][]).slice(0, 3).map((v) => (v[0]! > 127 ? v[0]! - 256 : v[0]!));
    expect(bytesRead).toEqual([-1, 0, 127]);
    expect(r.getDataVariable('s').slice(0, 3)).toEqual([-300, 0, 300]); // likewise read over the padded size
    expect(r.getDataVariable('f')).toEqual([0.5, 1.25, Math.fround(NC_FILL.float), -2, 3, 4]);
    expect(r.getDataVariable('d')).toEqual([1e-9, 2.5, 3, 4, 5, 6.125]);
    expect(r.getDataVariableAsString('names')).toBe('abcdefgh'); // netcdfjs drops the zero padding of each row
  });
});

/** A small CF station time series: 2 stations × 3 epochs, one missing value. */
const T0 = Date.UTC(2026, 6, 10, 12);
const CF_FILE = writePwvNetcdf({
  title: 'test series',
  stations: [
    { stationId: 'AB1', name: 'a', latitudeDeg: 47.5, longitudeDeg: 11.25, heightM: 600, geoidUndulationM: 47.25, altitudeM: 552.75 },
    { stationId: 'CD22', name: 'c', latitudeDeg: 50, longitudeDeg: 350, heightM: 80.5, geoidUndulationM: 55.5, altitudeM: 25 },
  ],
  timesMs: [T0, T0 + 300_000, T0 + 600_000],
  intervalS: null,
  quantities: [
    { key: 'pwv', values: [12.5, 13.25, null, 20, 21, 22.75] },
    { key: 'ztd', values: [2.3125, 2.3, null, 2.4, 2.41, 2.42] },
  ],
  flags: { values: [4, 3, null, 4, 1, 0], meanings: ['met-missing', 'delay-sigma-large', 'delay-sigma-unknown', 'met-interpolated', 'ok'] },
  globals: { source: 'test' },
});

describe('CF-1.8 timeSeries file (CF Conventions 1.8 §9, Example H.2)', () => {
  it('has the CF attributes and values when read with netcdfjs', () => {
    const r = new NetCDFReader(CF_FILE);
    expect(r.getAttribute('Conventions')).toBe('CF-1.8');
    expect(r.getAttribute('featureType')).toBe('timeSeries');
    const attrs = (name: string) =>
      Object.fromEntries(
        (r.variables.find((v) => v.name === name)!.attributes as unknown as { name: string; value: unknown }[]).map((a) => [
          a.name,
          a.value,
        ]),
      );
    expect(attrs('station_id').cf_role).toBe('timeseries_id');
    expect(attrs('pwv')).toMatchObject({
      standard_name: 'lwe_thickness_of_atmosphere_mass_content_of_water_vapor',
      units: 'mm',
      coordinates: 'lat lon altitude station_id',
    });
    // CF standard name table (from memory): altitude is the height above the geoid; geoid_height_above_reference_ellipsoid is N.
    expect(attrs('altitude')).toMatchObject({ standard_name: 'altitude', units: 'm', positive: 'up' });
    expect(attrs('geoid_undulation')).toMatchObject({ standard_name: 'geoid_height_above_reference_ellipsoid', units: 'm' });
    expect(r.getDataVariable('altitude')).toEqual([552.75, 25]);
    expect(r.getDataVariable('geoid_undulation')).toEqual([47.25, 55.5]);
    expect(attrs('lat')).toMatchObject({ standard_name: 'latitude', units: 'degrees_north' });
    expect(attrs('lon')).toMatchObject({ standard_name: 'longitude', units: 'degrees_east' });
    expect(attrs('height')).toMatchObject({ standard_name: 'height_above_reference_ellipsoid', units: 'm' });
    expect(attrs('time')).toMatchObject({ standard_name: 'time', units: 'seconds since 1970-01-01 00:00:00', calendar: 'standard' });
    expect(attrs('quality_flag').flag_meanings).toBe('met-missing delay-sigma-large delay-sigma-unknown met-interpolated ok');
    expect(r.getDataVariable('lon')).toEqual([11.25, -10]); // 350° east written as −10°
    expect(r.getDataVariable('time')).toEqual([T0 / 1000, T0 / 1000 + 300, T0 / 1000 + 600]);
    expect(r.getDataVariable('pwv')).toEqual([12.5, 13.25, Math.fround(NC_FILL.float), 20, 21, 22.75]);
  });

  it.skipIf(!hasPythonNetcdf)('reads back identically with the netCDF C library (python3-netCDF4) and decodes with xarray', () => {
    const path = join(dir, 'cf.nc');
    writeFileSync(path, CF_FILE);
    const script = `
import json, sys, netCDF4, xarray
ds = netCDF4.Dataset(sys.argv[1])
out = {
  "format": ds.data_model,
  "conventions": ds.Conventions,
  "dims": {k: len(v) for k, v in ds.dimensions.items()},
  "pwv": [[None if v is None else float(v) for v in row] for row in ds["pwv"][:].tolist()],
  "ztd": [[None if v is None else float(v) for v in row] for row in ds["ztd"][:].tolist()],
  "flags": [[None if v is None else int(v) for v in row] for row in ds["quality_flag"][:].tolist()],
  "ids": [str(s) for s in netCDF4.chartostring(ds["station_id"][:])],
}
x = xarray.open_dataset(sys.argv[1])
out["times"] = [str(t)[:19] for t in x["time"].values]
out["cf_role"] = x["station_id"].attrs.get("cf_role")
out["pwv_units"] = x["pwv"].attrs["units"]
print(json.dumps(out))
`;
    const out = JSON.parse(execFileSync(PYTHON!, ['-c', script, path], { encoding: 'utf8' }));
    expect(out.format).toBe('NETCDF3_64BIT_OFFSET');
    expect(out.conventions).toBe('CF-1.8');
    expect(out.dims).toEqual({ station: 2, time: 3, id_strlen: 4 });
    expect(out.pwv).toEqual([
      [12.5, 13.25, null],
      [20, 21, 22.75],
    ]);
    expect(out.ztd[0][0]).toBeCloseTo(2.3125, 6);
    expect(out.ztd[0][2]).toBeNull();
    expect(out.flags).toEqual([
      [4, 3, null],
      [4, 1, 0],
    ]);
    expect(out.ids).toEqual(['AB1', 'CD22']);
    expect(out.times).toEqual(['2026-07-10T12:00:00', '2026-07-10T12:05:00', '2026-07-10T12:10:00']);
    expect(out.cf_role).toBe('timeseries_id');
    expect(out.pwv_units).toBe('mm');
  });
});
