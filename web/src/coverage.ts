/**
 * The network's data coverage table (GET /v1/network/coverage): per station and source the first
 * and last stored epoch, the records, the gaps longer than one hour and the longest of them.
 */
import { getJson } from './api.js';

interface Gap {
  from: string;
  to: string;
  length_s: number;
}
interface SeriesCoverage {
  source: string;
  first_epoch: string;
  last_epoch: string;
  record_count: number;
  gap_count: number;
  gap_total_s: number;
  gaps: Gap[];
}
export interface CoverageAnswer {
  gap_min_s: number;
  stations: { station_id: string; name: string; sources: SeriesCoverage[] }[];
  summary: { station_count: number; stations_with_records: number; record_count: number; gap_count: number };
}

const minute = (iso: string) => `${iso.slice(0, 16)}Z`;

/** A duration [s] in the largest whole unit that keeps it readable: 50 min, 3.1 h, 2.5 d. */
export function durationText(seconds: number): string {
  if (seconds < 3600) return `${Math.round(seconds / 60)} min`;
  if (seconds < 86_400) return `${Number((seconds / 3600).toFixed(1))} h`;
  return `${Number((seconds / 86_400).toFixed(1))} d`;
}

function cell(tr: HTMLTableRowElement, text: string, numeric = false, header = false): void {
  const td = document.createElement(header ? 'th' : 'td');
  if (header) td.setAttribute('scope', 'row');
  if (numeric) td.className = 'num';
  td.textContent = text;
  tr.append(td);
}

export async function loadCoverage(table: HTMLTableElement, status: HTMLElement): Promise<void> {
  status.textContent = 'Loading coverage…';
  // One gap listed per series (the longest); every gap counted.
  const answer = await getJson<CoverageAnswer>('v1/network/coverage?max_gaps=1');
  const fragment = document.createDocumentFragment();
  for (const s of answer.stations) {
    const series = s.sources.length ? s.sources : [null];
    for (const c of series) {
      const tr = document.createElement('tr');
      tr.dataset.station = s.station_id;
      cell(tr, s.station_id, false, true);
      if (c === null) {
        cell(tr, '–');
        cell(tr, 'no records');
        cell(tr, '–');
        cell(tr, '0', true);
        cell(tr, '–', true);
        cell(tr, '–');
      } else {
        tr.dataset.source = c.source;
        cell(tr, c.source);
        cell(tr, minute(c.first_epoch));
        cell(tr, minute(c.last_epoch));
        cell(tr, String(c.record_count), true);
        cell(tr, c.gap_count === 0 ? '0' : `${c.gap_count} (${durationText(c.gap_total_s)})`, true);
        const g = c.gaps[0];
        cell(tr, g ? `${durationText(g.length_s)}: ${minute(g.from)} → ${minute(g.to)}` : '–');
      }
      fragment.append(tr);
    }
  }
  table.tBodies[0]!.replaceChildren(fragment);
  const m = answer.summary;
  status.textContent = `${m.stations_with_records} of ${m.station_count} stations hold delays; ${m.record_count} records; ${m.gap_count} gaps longer than ${durationText(answer.gap_min_s)}.`;
}
