/**
 * A map image for reports, drawn locally onto one canvas: the map with a labelled graticule around
 * its frame, the CRS, a scale bar, the legend (the same entries as the panel, text/legend.ts, each
 * with its symbol), the caution, and the demo marking when the demo is shown.
 */

import type maplibregl from 'maplibre-gl';
import { viridis } from './colour.js';
import { legendEntries, type LegendInput } from './text/legend.js';

export interface MapImageOptions {
  readonly title: string;
  readonly subtitle: string;
  readonly legend: LegendInput;
  readonly crs: string;
  readonly demo: boolean;
}

const FONT = '"DejaVu Sans", sans-serif';

/** Graticule step (degrees) giving about four to eight lines across a span. */
export function graticuleStep(spanDeg: number): number {
  const steps = [0.1, 0.25, 0.5, 1, 2, 5, 10, 20, 30];
  return steps.find((s) => spanDeg / s <= 8) ?? 30;
}

/** A graticule label: 130°W, 34.5°S, 0° (decimals only where the line has them). */
export const deg = (v: number, pos: string, neg: string) => `${Number(Math.abs(v).toFixed(2))}°${v < 0 ? neg : v > 0 ? pos : ''}`;

export async function renderMapImage(map: maplibregl.Map, opts: MapImageOptions): Promise<Blob> {
  await new Promise<void>((resolve) => {
    map.once('render', () => resolve());
    map.triggerRepaint();
  });
  const src = map.getCanvas();
  const dpr = src.width / map.getContainer().clientWidth;
  const legendW = 340;
  const frame = 44; // room for graticule labels around the map
  const top = 56;
  const W = frame + src.width + frame + legendW;
  const H = Math.max(top + src.height + frame, 640) + 36;
  const c = document.createElement('canvas');
  c.width = W;
  c.height = H;
  const g = c.getContext('2d')!;
  g.fillStyle = '#ffffff';
  g.fillRect(0, 0, W, H);
  const mx = frame;
  const my = top;
  g.drawImage(src, mx, my);
  g.strokeStyle = '#222';
  g.lineWidth = 1;
  g.strokeRect(mx + 0.5, my + 0.5, src.width - 1, src.height - 1);

  g.fillStyle = '#111';
  g.font = `bold 18px ${FONT}`;
  g.fillText(opts.title, mx, 22);
  g.font = `13px ${FONT}`;
  g.fillText(opts.subtitle, mx, 40);
  if (opts.demo) {
    g.fillStyle = '#9a5b00';
    g.font = `bold 13px ${FONT}`;
    const t = 'INVENTED DEMO DATA — NOT A REAL PLACE';
    g.fillText(t, mx + src.width - g.measureText(t).width, 22);
  }

  // graticule ticks and labels on the frame (longitudes below, latitudes left)
  const b = map.getBounds();
  const stepLon = graticuleStep(b.getEast() - b.getWest());
  const stepLat = graticuleStep(b.getNorth() - b.getSouth());
  g.fillStyle = '#111';
  g.font = `11px ${FONT}`;
  for (let lon = Math.ceil(b.getWest() / stepLon) * stepLon; lon <= b.getEast(); lon += stepLon) {
    const p = map.project([lon, b.getSouth()]);
    const x = mx + p.x * dpr;
    g.fillRect(x, my + src.height, 1, 6);
    const t = deg(lon, 'E', 'W');
    g.fillText(t, x - g.measureText(t).width / 2, my + src.height + 18);
  }
  for (let lat = Math.ceil(b.getSouth() / stepLat) * stepLat; lat <= b.getNorth(); lat += stepLat) {
    const p = map.project([b.getWest(), lat]);
    const y = my + p.y * dpr;
    g.fillRect(mx - 6, y, 6, 1);
    const t = deg(lat, 'N', 'S');
    g.save();
    g.translate(mx - 10, y);
    g.rotate(-Math.PI / 2);
    g.fillText(t, -g.measureText(t).width / 2, 0);
    g.restore();
  }
  g.fillText(`Graticule WGS 84 (${stepLon}° × ${stepLat}°). Map: Web Mercator display of ${opts.crs || 'the analysis CRS'}.`, mx, my + src.height + 34);

  // scale bar from the map's resolution at the centre (Web Mercator: m/px = C·cos φ / 2^(z+9) at 512 tiles)
  const lat = map.getCenter().lat;
  const mPerPx = (40075016.686 * Math.cos((lat * Math.PI) / 180)) / Math.pow(2, map.getZoom() + 9) / dpr;
  const nice = [1, 2, 5].flatMap((m) => [1, 10, 100, 1000, 10000, 100000].map((p) => m * p)).filter((v) => v <= 150 * mPerPx).sort((p, q) => p - q).pop() ?? 1;
  const px = nice / mPerPx;
  const y0 = my + src.height - 24;
  g.fillStyle = 'rgba(255,255,255,0.85)';
  g.fillRect(mx + 10, y0 - 16, px + 76, 28);
  g.fillStyle = '#111';
  g.fillRect(mx + 16, y0, px, 4);
  g.font = `12px ${FONT}`;
  g.fillText(nice >= 1000 ? `${nice / 1000} km` : `${nice} m`, mx + 16 + px + 8, y0 + 6);

  drawLegend(g, legendEntries(opts.legend), mx + src.width + frame, top + 4, legendW - 10, H - 50);

  g.font = `11px ${FONT}`;
  g.fillStyle = '#333';
  g.fillText('Interpretation from depth grids and stated parameters (Taperline). Decisions on licences, surveys and drilling rest with qualified professionals and local rules.', mx, H - 12);
  return await new Promise<Blob>((resolve) => c.toBlob((blob) => resolve(blob!), 'image/png'));
}

/** The legend entries, each with its symbol, wrapped to the column width. */
function drawLegend(g: CanvasRenderingContext2D, entries: ReturnType<typeof legendEntries>, x: number, y: number, width: number, bottom: number): void {
  const line = (text: string, dx: number, font: string) => {
    g.font = font;
    const words = text.split(' ');
    let row = '';
    for (const w of words) {
      if (g.measureText(`${row} ${w}`).width > width - dx && row) {
        g.fillText(row, x + dx, y);
        y += 14;
        row = w;
      } else row = row ? `${row} ${w}` : w;
    }
    g.fillText(row, x + dx, y);
    y += 16;
  };
  g.fillStyle = '#111';
  for (const e of entries) {
    if (y > bottom) break;
    if (e.type === 'title') {
      y += 4;
      line(e.text, 0, `bold 13px ${FONT}`);
    } else if (e.type === 'hint') line(e.text, 0, `11px ${FONT}`);
    else if (e.type === 'ramp') {
      const grad = g.createLinearGradient(x, 0, x + width, 0);
      for (let k = 0; k <= 10; k++) grad.addColorStop(k / 10, `rgb(${viridis(k / 10).join(',')})`);
      g.fillStyle = grad;
      g.fillRect(x, y - 10, width, 12);
      g.fillStyle = '#111';
      g.font = `11px ${FONT}`;
      const [a, m, z] = e.ticks;
      g.fillText(a, x, y + 14);
      g.fillText(m, x + width / 2 - g.measureText(m).width / 2, y + 14);
      g.fillText(z, x + width - g.measureText(z).width, y + 14);
      y += 30;
    } else {
      if (e.type === 'fill') {
        g.fillStyle = e.colour;
        g.globalAlpha = e.outline ? 0.6 : 1;
        g.fillRect(x, y - 10, 26, 12);
        g.globalAlpha = 1;
        if (e.outline) (g.strokeStyle = e.outline), (g.lineWidth = 2), g.strokeRect(x, y - 10, 26, 12);
      } else if (e.type === 'line') {
        if (e.casing) (g.strokeStyle = '#ffffff'), (g.lineWidth = e.width + 2), g.setLineDash([]), g.beginPath(), g.moveTo(x, y - 4), g.lineTo(x + 26, y - 4), g.stroke();
        g.strokeStyle = e.colour;
        g.lineWidth = e.width;
        g.setLineDash(e.dash ? e.dash.map((d) => d * e.width) : []);
        g.beginPath();
        g.moveTo(x, y - 4);
        g.lineTo(x + 26, y - 4);
        g.stroke();
        g.setLineDash([]);
      } else {
        g.fillStyle = e.fill;
        g.strokeStyle = e.stroke;
        g.lineWidth = e.strokeWidth;
        g.beginPath();
        g.arc(x + 13, y - 4, 5, 0, 2 * Math.PI);
        g.fill();
        g.stroke();
      }
      g.fillStyle = '#111';
      line(e.label, 34, `12px ${FONT}`);
    }
  }
}
