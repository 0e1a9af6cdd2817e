import { tableFromArrays, tableToIPC, type Table } from 'apache-arrow';

/**
 * A slant-delays request of n directions as an Arrow IPC stream: the directions as float64 columns (their values
 * depend on n, so that requests of different sizes differ), `rest` (the rest of the request) in the metadata "request".
 */
export function slantArrowRequest(n: number, rest: object): Buffer {
  const table = tableFromArrays({
    elevation_deg: Float64Array.from({ length: n }, (_, i) => 5 + ((i * 13 + n) % 85)),
    azimuth_deg: Float64Array.from({ length: n }, (_, i) => (i * 29 + n) % 360),
  }) as Table;
  table.schema.metadata.set('request', JSON.stringify(rest));
  return Buffer.from(tableToIPC(table, 'stream'));
}
