/**
 * The network map: land outline (Natural Earth via world-atlas, drawn with d3-geo) and the stations
 * as circles, all in one SVG; no tiles, nothing from outside the service.
 */
import { geoNaturalEarth1, geoPath, type GeoProjection } from 'd3-geo';
import { feature } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
import type { NetworkStation } from './api.js';
import { colourOf, type ColourScale } from './palette.js';

const SVG_NS = 'http://www.w3.org/2000/svg';
const WIDTH = 720;
const HEIGHT = 460;
const PAD_DEG = 2;

export interface StationMap {
  /** Colours every station by its value (null: no value that hour). */
  colour(values: Map<string, number | null>, scale: ColourScale): void;
  select(stationId: string | null): void;
}

let landPromise: Promise<Topology> | null = null;
/** Fetches the land outline once; main.ts calls it at load so it arrives while the stations are asked for. */
export function loadLand(): Promise<Topology> {
  landPromise ??= fetch('assets/land-50m.json').then((r) => r.json() as Promise<Topology>);
  return landPromise;
}

function el<K extends keyof SVGElementTagNameMap>(name: K, attrs: Record<string, string | number>): SVGElementTagNameMap[K] {
  const e = document.createElementNS(SVG_NS, name);
  for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, String(v));
  return e;
}

function projectionFor(stations: NetworkStation[]): GeoProjection {
  const points: [number, number][] = stations.map((s) => [s.longitude_deg > 180 ? s.longitude_deg - 360 : s.longitude_deg, s.latitude_deg]);
  if (points.length === 0) points.push([-170, -60], [170, 75]);
  const lons = points.map((p) => p[0]);
  const lats = points.map((p) => p[1]);
  const west = Math.max(-180, Math.min(...lons) - PAD_DEG);
  const south = Math.max(-85, Math.min(...lats) - PAD_DEG);
  const east = Math.min(180, Math.max(...lons) + PAD_DEG);
  const north = Math.min(85, Math.max(...lats) + PAD_DEG);
  return geoNaturalEarth1().fitExtent(
    [
      [10, 10],
      [WIDTH - 10, HEIGHT - 10],
    ],
    { type: 'MultiPoint', coordinates: [...points, [west, south], [east, north], [west, north], [east, south]] },
  );
}

export async function drawMap(svg: SVGSVGElement, stations: NetworkStation[], onPick: (stationId: string) => void): Promise<StationMap> {
  svg.setAttribute('viewBox', `0 0 ${WIDTH} ${HEIGHT}`);
  svg.replaceChildren();
  const projection = projectionFor(stations).clipExtent([
    [0, 0],
    [WIDTH, HEIGHT],
  ]);
  svg.append(el('rect', { x: 0, y: 0, width: WIDTH, height: HEIGHT, class: 'sea' }));
  const topology = await loadLand();
  const land = feature(topology, topology.objects.land as GeometryCollection);
  svg.append(el('path', { d: geoPath(projection)(land) ?? '', class: 'land' }));
  const group = el('g', { class: 'stations' });
  const circles = new Map<string, SVGCircleElement>();
  for (const s of stations) {
    const xy = projection([s.longitude_deg > 180 ? s.longitude_deg - 360 : s.longitude_deg, s.latitude_deg]);
    if (!xy) continue;
    const c = el('circle', { cx: xy[0].toFixed(1), cy: xy[1].toFixed(1), r: 6, class: 'station no-value', 'data-station': s.station_id });
    const title = el('title', {});
    title.textContent = `${s.station_id} ${s.name}`;
    c.append(title);
    circles.set(s.station_id, c);
    group.append(c);
  }
  // One listener for all stations (a thousand listeners cost more than the circles).
  group.addEventListener('click', (e) => {
    const id = (e.target as Element).closest('circle')?.getAttribute('data-station');
    if (id) onPick(id);
  });
  svg.append(group);
  const names = new Map(stations.map((s) => [s.station_id, s.name]));
  return {
    colour(values, scale) {
      for (const [id, c] of circles) {
        const v = values.get(id) ?? null;
        c.setAttribute('fill', v === null ? 'none' : colourOf(v, scale));
        c.setAttribute('class', v === null ? 'station no-value' : 'station');
        c.setAttribute('data-pwv-mm', v === null ? '' : v.toFixed(1));
        c.firstElementChild!.textContent = `${id} ${names.get(id)}: ${v === null ? 'no value' : `${v.toFixed(1)} mm`}`;
      }
    },
    select(stationId) {
      for (const [id, c] of circles) c.classList.toggle('selected', id === stationId);
    },
  };
}

/** Colour bar with ticks every 10 mm (5 mm for narrow scales) and a "no value" key. */
export function drawLegend(svg: SVGSVGElement, scale: ColourScale): void {
  const w = 420;
  const h = 46;
  svg.setAttribute('viewBox', `0 0 ${w} ${h}`);
  svg.replaceChildren();
  const x0 = 10;
  const barW = 300;
  const steps = 60;
  for (let i = 0; i < steps; i++) {
    const v = scale.minMm + ((i + 0.5) / steps) * (scale.maxMm - scale.minMm);
    svg.append(
      el('rect', {
        x: (x0 + (i * barW) / steps).toFixed(2),
        y: 4,
        width: (barW / steps + 0.5).toFixed(2),
        height: 14,
        fill: colourOf(v, scale),
      }),
    );
  }
  const span = scale.maxMm - scale.minMm;
  const step = span > 30 ? 10 : 5;
  for (let v = scale.minMm; v <= scale.maxMm + 1e-9; v += step) {
    const x = x0 + ((v - scale.minMm) / span) * barW;
    svg.append(el('line', { x1: x, x2: x, y1: 18, y2: 23, class: 'tick' }));
    const t = el('text', { x, y: 35, 'text-anchor': 'middle', class: 'tick-label' });
    t.textContent = String(v);
    svg.append(t);
  }
  const unit = el('text', { x: x0 + barW + 8, y: 16, class: 'tick-label' });
  unit.textContent = 'mm PWV';
  svg.append(unit);
  svg.append(el('circle', { cx: x0 + barW + 14, cy: 32, r: 5, class: 'station no-value' }));
  const none = el('text', { x: x0 + barW + 24, y: 36, class: 'tick-label' });
  none.textContent = 'no value';
  svg.append(none);
}
