/** The workspace page: wiring of the network view (map, legend, table) and the station view (charts, flags, coverage). */
import 'uplot/dist/uPlot.min.css';
import './style.css';
import {
  download,
  getJson,
  KeyRefusedError,
  networkUrl,
  readKey,
  saveBlob,
  setReadKey,
  type NetworkAnswer,
  type PwvRecord,
} from './api.js';
import { loadCoverage } from './coverage.js';
import { StationCharts, type Column, type PwvColumns } from './chart.js';
import { FLAG_TEXT, MARKED_FLAGS } from './flags.js';
import { drawLegend, drawMap, loadLand, type StationMap } from './map.js';
import { FIXED_SCALE, fittedScale } from './palette.js';
import { StationTable } from './table.js';
import { loadSoundings, showSoundingStatistics, withSoundings, type StationSoundings } from './soundings.js';

const $ = <T extends HTMLElement>(id: string) => document.getElementById(id) as T;
const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

const state = {
  hourMs: 0,
  stationId: null as string | null,
  spanDays: 1,
  source: '',
  map: null as StationMap | null,
  /** The page has drawn its network view once (start() succeeded). */
  started: false,
  /** What the download buttons fetch: the network hour and the station series on screen. */
  downloads: { networkCsv: '', networkNc: '', stationCsv: '', stationNc: '' },
};

const dayInput = $<HTMLInputElement>('day');
const hourInput = $<HTMLInputElement>('hour');
const hourText = $<HTMLOutputElement>('hour-text');
const scaleSelect = $<HTMLSelectElement>('scale');
const stationSelect = $<HTMLSelectElement>('station-select');
const sourceSelect = $<HTMLSelectElement>('source-select');
const tableStatus = $('table-status');
const stationStatus = $('station-status');
const charts = new StationCharts($('pwv-chart'), $('met-chart'));
const table = new StationTable($<HTMLTableElement>('station-table'), (id) => void pickStation(id));

const isoHour = (ms: number) => new Date(ms).toISOString().slice(0, 19) + 'Z';

function setHour(ms: number): void {
  state.hourMs = Math.floor(ms / HOUR_MS) * HOUR_MS;
  const d = new Date(state.hourMs);
  dayInput.value = d.toISOString().slice(0, 10);
  hourInput.value = String(d.getUTCHours());
  hourText.value = `${d.toISOString().slice(11, 16)}Z`;
}

function hourFromControls(): number {
  return Date.parse(`${dayInput.value}T00:00:00Z`) + Number(hourInput.value) * HOUR_MS;
}

/** One station's value in the network view (map colour and table row). */
interface HourValue {
  pwvMm: number | null;
  sigmaMm: number | null;
  count: number;
  excluded: number;
}

/** Colours the map, draws the legend and fills the table; returns how many stations have a value. */
function showHour(stations: NetworkAnswer['stations'], byStation: Map<string, HourValue>): number {
  const values = new Map<string, number | null>();
  for (const s of stations) values.set(s.station_id, byStation.get(s.station_id)?.pwvMm ?? null);
  const present = [...values.values()].filter((v): v is number => v !== null);
  const scale = scaleSelect.value === 'fit' ? fittedScale(present) : FIXED_SCALE;
  state.map?.colour(values, scale);
  drawLegend($('legend') as unknown as SVGSVGElement, scale);
  table.setRows(
    stations.map((s) => {
      const v = byStation.get(s.station_id);
      return {
        stationId: s.station_id,
        name: s.name,
        latitudeDeg: s.latitude_deg,
        longitudeDeg: s.longitude_deg,
        altitudeM: s.altitude_m,
        pwvMm: v?.pwvMm ?? null,
        sigmaMm: v?.sigmaMm ?? null,
        count: v?.count ?? 0,
        excluded: v?.excluded ?? 0,
      };
    }),
  );
  return present.length;
}

/**
 * The network view at the chosen hour, in two steps: first the records at the top of the hour (one
 * per station, cheap: the map is drawn at once), then the hourly means (every record of the hour
 * per station, the values the page is about), which replace them. A newer hour chosen meanwhile
 * wins: an answer for an hour no longer shown is dropped.
 */
async function loadHour(onFirstPaint?: () => void, mapDrawn?: Promise<unknown>): Promise<void> {
  const hourMs = state.hourMs;
  const hourText = `${new Date(hourMs).toISOString().slice(0, 13)}Z`;
  const epoch = isoHour(hourMs);
  tableStatus.textContent = `(${hourText}, loading…)`;
  // The records first, the means only once they are in: the service answers one call at a time per
  // database, and the means (a whole hour of records per station) would hold up the cheap first step.
  const atHour = await getJson<NetworkAnswer>(networkUrl({ epoch }));
  performance.mark('network-at-hour');
  const means = getJson<NetworkAnswer>(networkUrl({ epoch, interval: 'PT1H' }));
  means.catch(() => undefined); // awaited below; no unhandled rejection while the first step runs
  await mapDrawn; // at start the calls run while the map is drawn
  if (state.hourMs !== hourMs) return;
  const records = new Map<string, HourValue>();
  for (const r of atHour.records) {
    const ok = r.pwv_mm !== null && r.quality !== 'delay-sigma-large';
    records.set(r.station_id, {
      pwvMm: ok ? r.pwv_mm : null,
      sigmaMm: ok ? r.pwv_sigma_mm : null,
      count: ok ? 1 : 0,
      excluded: ok ? 0 : 1,
    });
  }
  const first = showHour(atHour.stations, records);
  performance.mark('network-shown');
  $('map-caption').textContent = `${atHour.stations.length} stations coloured by PWV at ${epoch.slice(11, 16)}Z; hourly means loading…`;
  tableStatus.textContent = `(${hourText}, values at the hour, ${first} of ${atHour.stations.length} stations; hourly means loading…)`;
  onFirstPaint?.();

  const answer = await means;
  if (state.hourMs !== hourMs) return;
  const intervals = new Map<string, HourValue>();
  for (const m of answer.intervals) {
    intervals.set(m.station_id, { pwvMm: m.pwv_mm, sigmaMm: m.pwv_sigma_mm, count: m.count, excluded: m.excluded_count });
  }
  const present = showHour(answer.stations, intervals);
  $('map-caption').textContent = `${answer.stations.length} stations coloured by hourly mean PWV (grey ring: no value that hour)`;
  tableStatus.textContent = `(${hourText}: ${present} of ${answer.stations.length} stations with a value)`;
  state.downloads.networkCsv = networkUrl({ epoch, interval: 'PT1H', format: 'csv' });
  state.downloads.networkNc = networkUrl({ epoch, interval: 'PT1H', format: 'netcdf' });
  document.body.dataset.hour = epoch;
}

/** A column filled with NaN for "no value": typed as it is when complete, else with nulls for uPlot's gaps. */
function gapsAsNull(col: Float64Array): Column {
  let i = 0;
  while (i < col.length && !Number.isNaN(col[i])) i++;
  if (i === col.length) return col;
  const out: (number | null)[] = [];
  for (const v of col) out.push(Number.isNaN(v) ? null : v);
  return out;
}

/**
 * The chart columns in one pass over the records: epochs parsed once (also used by coverage()),
 * values in Float64Arrays, so a station-year allocates no object per point.
 */
function columns(records: PwvRecord[]): PwvColumns {
  const n = records.length;
  const t = new Float64Array(n);
  const pwv = new Float64Array(n);
  const lower = new Float64Array(n);
  const upper = new Float64Array(n);
  const pressure = new Float64Array(n);
  const temperature = new Float64Array(n);
  const flagged: (number | null)[] = new Array<number | null>(n).fill(null);
  for (let i = 0; i < n; i++) {
    const r = records[i]!;
    t[i] = Date.parse(r.epoch) / 1000;
    const v = r.pwv_mm ?? NaN;
    const s = r.pwv_sigma_mm ?? NaN;
    pwv[i] = v;
    lower[i] = v - s;
    upper[i] = v + s;
    if (r.pwv_mm !== null && MARKED_FLAGS.includes(r.quality)) flagged[i] = r.pwv_mm;
    pressure[i] = r.pressure_hpa ?? NaN;
    temperature[i] = r.temperature_c ?? NaN;
  }
  return {
    t,
    pwv: gapsAsNull(pwv),
    lower: gapsAsNull(lower),
    upper: gapsAsNull(upper),
    flagged,
    pressure: gapsAsNull(pressure),
    temperature: gapsAsNull(temperature),
  };
}

function definitionList(dl: HTMLElement, items: [string, string][]): void {
  dl.replaceChildren();
  for (const [term, text] of items) {
    const dt = document.createElement('dt');
    dt.textContent = term;
    const dd = document.createElement('dd');
    dd.textContent = text;
    dl.append(dt, dd);
  }
}

/** First/last epoch, sources and the gaps longer than three typical spacings (and 15 min). */
function coverage(records: PwvRecord[], tSec: Float64Array): [string, string][] {
  if (records.length === 0) return [['records', 'none in this span']];
  const t = tSec.map((s) => s * 1000);
  const steps = t
    .subarray(1)
    .map((x, i) => x - t[i]!)
    .filter((d) => d > 0)
    .sort();
  const typical = steps.length ? steps[Math.floor(steps.length / 2)]! : 0;
  const limit = Math.max(3 * typical, 15 * 60_000);
  const gaps: [number, number][] = [];
  for (let i = 1; i < t.length; i++) if (t[i]! - t[i - 1]! > limit) gaps.push([t[i - 1]!, t[i]!]);
  const sources = new Map<string, number>();
  for (const r of records) sources.set(r.source, (sources.get(r.source) ?? 0) + 1);
  const fmt = (ms: number) => `${new Date(ms).toISOString().slice(0, 16)}Z`;
  const longest = [...gaps].sort((a, b) => b[1] - b[0] - (a[1] - a[0])).slice(0, 6);
  return [
    ['first epoch', fmt(t[0]!)],
    ['last epoch', fmt(t[t.length - 1]!)],
    ['records', `${records.length} (typical spacing ${typical / 1000} s)`],
    ['sources', [...sources].map(([s, n]) => `${s} (${n})`).join(', ')],
    ['gaps', gaps.length === 0 ? 'none' : `${gaps.length}; longest: ${longest.map(([a, b]) => `${fmt(a)} → ${fmt(b)}`).join('; ')}`],
  ];
}

async function loadStation(): Promise<void> {
  if (state.stationId === null) return;
  const toMs = state.hourMs + HOUR_MS - 1;
  const from = new Date(toMs + 1 - state.spanDays * DAY_MS).toISOString();
  const to = new Date(toMs).toISOString();
  const params: Record<string, string> = { stations: state.stationId, from, to };
  if (state.source) params.source = state.source;
  stationStatus.textContent = `Loading ${state.stationId}…`;
  const [answer, soundings] = await Promise.all([
    getJson<NetworkAnswer>(networkUrl(params)),
    loadSoundings(state.stationId, from, to, state.source).catch((e: unknown) => e as Error),
  ]);
  const records = answer.records;
  const known = new Set([...sourceSelect.options].map((o) => o.value));
  for (const s of answer.stations[0]?.sources ?? []) {
    if (!known.has(s)) sourceSelect.append(new Option(s, s));
  }
  performance.mark('station-data');
  const cols = columns(records);
  performance.mark('station-columns');
  charts.draw(soundings instanceof Error ? cols : withSoundings(cols, soundings.soundings));
  performance.mark('station-charts');
  await new Promise<void>((resolve) => requestAnimationFrame(() => resolve()));
  performance.measure('station-draw', 'station-data');
  const counts = new Map<string, number>();
  for (const r of records) counts.set(r.quality, (counts.get(r.quality) ?? 0) + 1);
  definitionList(
    $('flag-list'),
    Object.keys(FLAG_TEXT).map((f) => [`${f}: ${counts.get(f) ?? 0}`, FLAG_TEXT[f]!] as [string, string]),
  );
  definitionList($('coverage'), coverage(records, cols.t));
  showSoundings(soundings);
  state.downloads.stationCsv = networkUrl({ ...params, format: 'csv' });
  state.downloads.stationNc = networkUrl({ ...params, format: 'netcdf' });
  const place = answer.stations[0];
  const name = place?.name ?? '';
  const heights = place
    ? ` (${place.altitude_m.toFixed(1)} m above sea level; ellipsoidal ${place.height_m.toFixed(1)} m, geoid ${place.geoid_undulation_m.toFixed(1)} m)`
    : '';
  stationStatus.textContent = `${state.stationId} ${name}${heights}: ${records.length} epochs, ${from.slice(0, 16)}Z to ${to.slice(0, 16)}Z`;
  document.body.dataset.station = state.stationId;
}

function showSoundings(soundings: StationSoundings | Error): void {
  if (soundings instanceof Error) definitionList($('sounding-stats'), [['soundings', `not available: ${soundings.message}`]]);
  else showSoundingStatistics($('sounding-stats'), soundings);
}

async function pickStation(id: string): Promise<void> {
  if (state.stationId !== id) {
    state.stationId = id;
    state.source = '';
    sourceSelect.replaceChildren(new Option('preferred (one value per epoch)', ''));
  }
  stationSelect.value = id;
  state.map?.select(id);
  await loadStation();
}

const keyInput = $<HTMLInputElement>('read-key');
const keyStatus = $('key-status');

/** A failure where it happened; a refused key also at the key field, which gets the focus. */
function report(err: unknown, where: HTMLElement): void {
  where.textContent = `Could not load: ${err instanceof Error ? err.message : String(err)}`;
  if (err instanceof KeyRefusedError) {
    keyStatus.textContent = err.message;
    keyStatus.className = 'refused';
    keyInput.focus();
  }
}

/**
 * The stations and each one's latest record: one record per station, cheap (the hourly means of
 * the latest hour would cost a whole hour of records per station, and loadHour fetches them anyway).
 */
const LATEST_URL = networkUrl({ latest: 'true' });
const newestEpochMs = (a: NetworkAnswer) => a.records.reduce((m, x) => Math.max(m, Date.parse(x.epoch)), Number.NEGATIVE_INFINITY);

async function start(): Promise<void> {
  const latest = await getJson<NetworkAnswer>(LATEST_URL);
  performance.mark('network-latest');
  const newest = newestEpochMs(latest);
  setHour(Number.isFinite(newest) ? newest : Date.now());
  stationSelect.replaceChildren(); // start() runs again after a key is entered
  for (const s of latest.stations) stationSelect.append(new Option(`${s.station_id} ${s.name}`, s.station_id));
  let firstPaint = () => {};
  const painted = new Promise<void>((resolve) => (firstPaint = resolve));
  const mapDrawn = drawMap(
    $('map') as unknown as SVGSVGElement,
    latest.stations,
    (id) => void pickStation(id).catch((e) => report(e, stationStatus)),
  ).then((map) => {
    state.map = map;
    performance.mark('network-map');
  });
  const hour = loadHour(firstPaint, mapDrawn);
  await mapDrawn;
  // First paint: the map and table with the values at the hour (bench/workspace.bench.ts reads both marks).
  await Promise.race([painted, hour]);
  await new Promise<void>((resolve) => requestAnimationFrame(() => resolve()));
  performance.mark('network-drawn');
  await hour;
  await new Promise<void>((resolve) => requestAnimationFrame(() => resolve()));
  performance.mark('network-means-drawn');
  state.started = true;
  keyStatus.textContent = readKey() ? 'Key in use for this tab.' : '';
  keyStatus.className = '';
  const coverage = loadCoverage($<HTMLTableElement>('network-coverage'), $('network-coverage-status')).catch((e) =>
    report(e, $('network-coverage-status')),
  );
  if (latest.stations[0]) await pickStation(latest.stations[0].station_id);
  await coverage;
  document.body.dataset.ready = 'true';
}

const refresh = () => {
  void loadHour()
    .then(() => loadStation())
    .catch((e) => report(e, tableStatus));
};
const step = (hours: number) => {
  setHour(state.hourMs + hours * HOUR_MS);
  refresh();
};
hourInput.addEventListener('input', () => {
  setHour(hourFromControls());
  refresh();
});
dayInput.addEventListener('change', () => {
  if (dayInput.value) {
    setHour(hourFromControls());
    refresh();
  }
});
$('hour-prev').addEventListener('click', () => step(-1));
$('hour-next').addEventListener('click', () => step(1));
$('hour-latest').addEventListener('click', () => {
  void getJson<NetworkAnswer>(LATEST_URL).then((a) => {
    const newest = newestEpochMs(a);
    if (Number.isFinite(newest)) step((newest - state.hourMs) / HOUR_MS);
  });
});
scaleSelect.addEventListener('change', () => void loadHour().catch((e) => report(e, tableStatus)));
stationSelect.addEventListener('change', () => void pickStation(stationSelect.value).catch((e) => report(e, stationStatus)));
sourceSelect.addEventListener('change', () => {
  state.source = sourceSelect.value;
  void loadStation().catch((e) => report(e, stationStatus));
});
for (const b of document.querySelectorAll<HTMLButtonElement>('.spans button')) {
  b.addEventListener('click', () => {
    state.spanDays = Number(b.dataset.days);
    for (const o of document.querySelectorAll<HTMLButtonElement>('.spans button')) o.setAttribute('aria-pressed', String(o === b));
    void loadStation().catch((e) => report(e, stationStatus));
  });
}
$('chart-png').addEventListener('click', () => {
  void charts.pngBlob().then((blob) => {
    if (blob) saveBlob(blob, `pwv-${state.stationId ?? 'station'}-${isoHour(state.hourMs).slice(0, 13)}.png`);
  });
});
const downloadButtons: [string, keyof typeof state.downloads, HTMLElement][] = [
  ['network-csv', 'networkCsv', tableStatus],
  ['network-nc', 'networkNc', tableStatus],
  ['station-csv', 'stationCsv', stationStatus],
  ['station-nc', 'stationNc', stationStatus],
];
for (const [id, which, where] of downloadButtons) {
  $(id).addEventListener('click', () => {
    const url = state.downloads[which];
    if (url) void download(url, `${id}.${url.includes('netcdf') ? 'nc' : 'csv'}`).catch((e) => report(e, where));
  });
}
$('key-form').addEventListener('submit', (e) => {
  e.preventDefault();
  setReadKey(keyInput.value.trim());
  keyInput.value = '';
  keyStatus.className = '';
  keyStatus.textContent = readKey() ? 'Key kept for this tab; loading…' : 'No key in use.';
  if (state.started) refresh();
  else start().catch((err) => report(err, tableStatus));
});
$('key-forget').addEventListener('click', () => {
  setReadKey('');
  keyStatus.className = '';
  keyStatus.textContent = 'Key forgotten.';
});
$('time-controls').addEventListener('submit', (e) => e.preventDefault());
$('station-controls').addEventListener('submit', (e) => e.preventDefault());

keyStatus.textContent = readKey() ? 'Key in use for this tab.' : '';
void loadLand().catch(() => undefined); // drawMap reports a failure; here only started early
start().catch((e) => report(e, tableStatus));
