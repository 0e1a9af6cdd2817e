/**
 * text/csv requests of the network routes, read into the JSON-equivalent body so that one schema
 * validates both and names the same fields:
 *   - the body: the observation table of POST /v1/zwd-estimates plus a `station` column, i.e. a
 *     header row naming station,epoch,satellite,elevation_deg,azimuth_deg,residual_m[,sigma_m] in
 *     any order, one observation per row, # comments (read by the one CSV reader, csv-table.ts);
 *   - the stations: the query parameter `station`, once per station,
 *     "ID,latitude_deg,longitude_deg,height_m[,apriori_zhd_m[,apriori_zwd_m]]", or for the storing
 *     route (sites from the archive) "ID[,apriori_zhd_m[,apriori_zwd_m]]"; an empty field = absent.
 * Cells and fields that are not numerals stay text for the schema to refuse.
 */

import { FormatError } from '../../formats/format-error.js';
import { readNumber } from '../../formats/number-text.js';
import { readObservationCsv } from '../../formats/observation-csv.js';

/**
 * The single-station observation table with a leading `station` column (readObservationCsv).
 * @returns one record per data row, keyed by the JSON field names
 * @throws FormatError naming `body` (not CSV, empty, a wrong header) or `observations.N[.column]`
 * @throws RecordLimitError past MAX_OBSERVATIONS rows
 */
export function readNetworkObservationCsv(text: string): Record<string, string | number>[] {
  return readObservationCsv(text, { leadingColumns: ['station'] });
}

const numberOrText = (text: string) => readNumber(text.trim()) ?? text;

/**
 * The `station` query parameters → `stations` entries of the JSON body.
 * @param withSite "ID,lat,lon,h[,zhd[,zwd]]" (true) or "ID[,zhd[,zwd]]" (false)
 * @throws FormatError naming `query.station.N` for a wrong number of fields
 */
export function stationsFromQuery(param: string | string[] | undefined, withSite: boolean): Record<string, unknown>[] {
  const list = param === undefined ? [] : Array.isArray(param) ? param : [param];
  const form = withSite ? 'ID,latitude_deg,longitude_deg,height_m[,apriori_zhd_m[,apriori_zwd_m]]' : 'ID[,apriori_zhd_m[,apriori_zwd_m]]';
  if (list.length === 0) {
    throw new FormatError('query.station', `required with a text/csv body: one station=${form} per station`);
  }
  return list.map((text, n) => {
    const fields = text.split(',');
    const siteFields = withSite ? 3 : 0;
    if (fields.length < 1 + siteFields || fields.length > 3 + siteFields) {
      throw new FormatError(`query.station.${n}`, `"${text.slice(0, 40)}" has ${fields.length} fields; the form is ${form}`);
    }
    const [id, ...rest] = fields;
    const site = withSite
      ? { site: { latitude_deg: numberOrText(rest[0]!), longitude_deg: numberOrText(rest[1]!), height_m: numberOrText(rest[2]!) } }
      : {};
    const [zhd, zwd] = rest.slice(siteFields);
    const apriori = Object.fromEntries(
      [
        ['zhd_m', zhd],
        ['zwd_m', zwd],
      ]
        .filter(([, v]) => v !== undefined && v.trim() !== '')
        .map(([k, v]) => [k, numberOrText(v!)]),
    );
    return { id: id!.trim(), ...site, ...(Object.keys(apriori).length ? { apriori } : {}) };
  });
}
