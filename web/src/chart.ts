/**
 * Station charts with uPlot (canvas): PWV with its ±1σ band and the flagged epochs marked, and the
 * met used (pressure left axis, temperature right axis). Data go in as typed columns, so a
 * station-year at 5-min sampling (105 120 points) draws without per-point objects.
 */
import uPlot from 'uplot';

/**
 * A y column: a Float64Array when every value is present (no boxed number per point), an array with
 * nulls (gaps) otherwise.
 */
export type Column = Float64Array | (number | null)[];

export interface PwvColumns {
  /** seconds since 1970 */
  t: Float64Array;
  pwv: Column;
  lower: Column;
  upper: Column;
  flagged: Column;
  pressure: Column;
  temperature: Column;
  /** PWV of the soundings at their epochs (soundings.ts), null elsewhere; absent = no sounding series. */
  sounding?: Column;
}

const LINE = '#23395b';
const BAND = 'rgba(35, 57, 91, 0.18)';
const FLAG = '#b5179e';
const PRESSURE = '#1b6e5a';
const TEMPERATURE = '#8a4b08';
/** Soundings: vermillion of the Okabe–Ito colour-blind-safe set. */
export const SOUNDING = '#d55e00';

/** Time axis labels in UTC, 24 h: times of day for spans up to 3 days, dates beyond. */
function utcTicks(_u: uPlot, splits: number[]): string[] {
  const span = splits.length > 1 ? splits[splits.length - 1]! - splits[0]! : 0;
  return splits.map((s) => {
    const iso = new Date(s * 1000).toISOString();
    return span <= 3 * 86_400 ? `${iso.slice(5, 10)} ${iso.slice(11, 16)}` : iso.slice(0, 10);
  });
}
const timeAxis: uPlot.Axis = { values: utcTicks, space: 80, label: 'UTC' };
/** Cursor and legend times in UTC too. */
const tzDate = (ts: number) => uPlot.tzDate(new Date(ts * 1000), 'Etc/UTC');

function width(el: HTMLElement): number {
  return Math.max(320, Math.min(1100, el.clientWidth || 900));
}

export class StationCharts {
  private pwv: uPlot | null = null;
  private met: uPlot | null = null;

  constructor(
    private readonly pwvBox: HTMLElement,
    private readonly metBox: HTMLElement,
  ) {}

  draw(c: PwvColumns): void {
    this.pwv?.destroy();
    this.met?.destroy();
    const sync = uPlot.sync('station');
    const cursor = { sync: { key: sync.key } };
    const pwvOpts: uPlot.Options = {
      width: width(this.pwvBox),
      height: 280,
      title: 'PWV [mm] with ±1σ band',
      cursor,
      scales: { x: { time: true } },
      series: [
        { label: 'time (UTC)' },
        { label: 'PWV mm', stroke: LINE, width: 1.5, points: { show: false } },
        { label: '−1σ', stroke: 'transparent', points: { show: false } },
        { label: '+1σ', stroke: 'transparent', points: { show: false } },
        { label: 'flagged', stroke: FLAG, width: 0, paths: () => null, points: { show: true, size: 7, stroke: FLAG, fill: FLAG } },
      ],
      bands: [{ series: [3, 2], fill: BAND }],
      tzDate,
      axes: [timeAxis, { label: 'mm' }],
    };
    const pwvData: Column[] = [c.t, c.pwv, c.lower, c.upper, c.flagged];
    if (c.sounding) {
      pwvOpts.series.push({
        label: 'sounding PWV mm',
        stroke: SOUNDING,
        width: 0,
        paths: () => null,
        points: { show: true, size: 11, stroke: '#ffffff', fill: SOUNDING, width: 1.5 },
      });
      pwvData.push(c.sounding);
    }
    this.pwv = new uPlot(pwvOpts, pwvData as unknown as uPlot.AlignedData, this.pwvBox);
    const metOpts: uPlot.Options = {
      width: width(this.metBox),
      height: 200,
      title: 'Met used: pressure [hPa] and temperature [°C] at the antenna',
      cursor,
      scales: { x: { time: true }, hpa: {}, c: {} },
      series: [
        { label: 'time (UTC)' },
        { label: 'pressure hPa', stroke: PRESSURE, scale: 'hpa', points: { show: false } },
        { label: 'temperature °C', stroke: TEMPERATURE, scale: 'c', dash: [6, 3], points: { show: false } },
      ],
      tzDate,
      axes: [timeAxis, { scale: 'hpa', label: 'hPa' }, { scale: 'c', side: 1, label: '°C', grid: { show: false } }],
    };
    this.met = new uPlot(metOpts, [c.t, c.pressure, c.temperature] as unknown as uPlot.AlignedData, this.metBox);
  }

  /** The PWV chart's canvas as PNG (axes, grid and series are all on it). */
  pngBlob(): Promise<Blob | null> {
    const canvas = this.pwv?.ctx.canvas;
    return canvas ? new Promise((resolve) => canvas.toBlob(resolve, 'image/png')) : Promise.resolve(null);
  }
}
