/**
 * A cross-section drawn at true scale (vertical exaggeration 1 unless the user picks another, always
 * labelled): water, sediment, crust and mantle filled, domains along the top, picks and boundary
 * crossings marked. SVG, so it exports as an image without any server.
 */

import { DOMAIN_STYLES } from './colour.js';
import type { SectionData } from './messages.js';

const NS = 'http://www.w3.org/2000/svg';
const FILL = { water: '#bcd7ea', sediment: '#f1df9c', crust: '#c9a48a', mantle: '#9fb59a' };
const KIND_COLOUR: Record<string, string> = {
  'crustal-taper-limit': '#D55E00',
  'oceanic-limit': '#0072B2',
  'oldest-onlapped-crust': '#0072B2',
  'necking-line': '#000000',
  'coupling-line': '#CC79A7',
};

function el<K extends keyof SVGElementTagNameMap>(tag: K, attrs: Record<string, string | number>, text?: string): SVGElementTagNameMap[K] {
  const e = document.createElementNS(NS, tag);
  for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, String(v));
  if (text !== undefined) e.textContent = text;
  return e;
}

export function renderSection(s: SectionData, widthPx: number, ve: number): SVGSVGElement {
  const n = s.chainageKm.length;
  let maxDepth = 0;
  for (let k = 0; k < n; k++) if (Number.isFinite(s.moho[k])) maxDepth = Math.max(maxDepth, s.moho[k]);
  if (!maxDepth) for (let k = 0; k < n; k++) if (Number.isFinite(s.basement[k])) maxDepth = Math.max(maxDepth, s.basement[k]);
  const bottom = Math.ceil((maxDepth + 5000) / 5000) * 5000;
  const left = 56;
  const top = 46;
  const plotW = widthPx - left - 16;
  const pxPerKm = plotW / Math.max(s.lengthKm, 1e-6);
  const pxPerKmV = pxPerKm * ve;
  const plotH = (bottom / 1000) * pxPerKmV;
  const H = top + plotH + 40;
  const svg = el('svg', { xmlns: NS, width: widthPx, height: H, viewBox: `0 0 ${widthPx} ${H}`, 'font-family': 'DejaVu Sans, sans-serif', 'font-size': 11, class: 'section-svg' });
  svg.append(el('rect', { x: 0, y: 0, width: widthPx, height: H, fill: '#ffffff' }));
  const X = (km: number) => left + km * pxPerKm;
  const Y = (m: number) => top + (m / 1000) * pxPerKmV;

  // Filled layers between two depth curves, in runs where both are defined.
  const band = (upper: (k: number) => number, lower: (k: number) => number, fill: string, name: string) => {
    let k = 0;
    while (k < n) {
      while (k < n && !(Number.isFinite(upper(k)) && Number.isFinite(lower(k)))) k++;
      const start = k;
      while (k < n && Number.isFinite(upper(k)) && Number.isFinite(lower(k))) k++;
      if (k - start < 2) continue;
      const pts: string[] = [];
      for (let q = start; q < k; q++) pts.push(`${X(s.chainageKm[q]).toFixed(1)},${Y(upper(q)).toFixed(1)}`);
      for (let q = k - 1; q >= start; q--) pts.push(`${X(s.chainageKm[q]).toFixed(1)},${Y(lower(q)).toFixed(1)}`);
      svg.append(el('polygon', { points: pts.join(' '), fill, 'data-layer': name }));
    }
  };
  const zero = () => 0;
  const sb = (k: number) => Math.max(0, s.seabed[k]);
  band(zero, sb, FILL.water, 'water');
  band(sb, (k) => s.basement[k], FILL.sediment, 'sediment');
  band((k) => s.basement[k], (k) => s.moho[k], FILL.crust, 'crust');
  band((k) => s.moho[k], () => bottom, FILL.mantle, 'mantle');

  // Domains along the top.
  const dom = new Map(DOMAIN_STYLES.map((d) => [d.code, d.colour]));
  for (let k = 0; k < n - 1; k++) {
    const c = dom.get(s.domain[k]);
    if (!c) continue;
    svg.append(el('rect', { x: X(s.chainageKm[k]), y: top - 14, width: Math.max(0.5, X(s.chainageKm[k + 1]) - X(s.chainageKm[k])) + 0.3, height: 10, fill: `rgb(${c.join(',')})`, 'data-layer': 'domain' }));
  }
  // Boundary crossings and picks.
  s.crossings.forEach((c, k) => {
    const x = X(c.chainageKm);
    const colour = KIND_COLOUR[c.kind] ?? '#333';
    svg.append(el('line', { x1: x, x2: x, y1: top - 16, y2: top + plotH, stroke: colour, 'stroke-width': 1.5, 'stroke-dasharray': '5 3', 'data-crossing': c.kind }));
    // labels inside the plot, in three staggered rows so neighbours do not overlap
    const y = top + 14 + (k % 3) * 13;
    const anchor = x > left + plotW - 120 ? 'end' : 'start';
    const label = el('text', { x: anchor === 'end' ? x - 4 : x + 4, y, fill: colour, 'font-size': 10, 'text-anchor': anchor, 'paint-order': 'stroke', stroke: '#ffffff', 'stroke-width': 3 }, c.kind.replace(/-/g, ' '));
    svg.append(label);
  });
  for (const p of s.picks) {
    const x = X(p.chainageKm);
    const k = s.chainageKm.findIndex((v) => v >= p.chainageKm);
    const y = Y(Number.isFinite(s.basement[k]) ? s.basement[k] : 0);
    svg.append(el('path', { d: `M ${x} ${y - 9} l 5 9 l -10 0 z`, fill: '#ffffff', stroke: '#000', 'stroke-width': 1.2, 'data-pick': p.kind }));
  }
  // Axes: depth every 5 km, chainage ticks.
  for (let d = 0; d <= bottom; d += 5000) {
    svg.append(el('line', { x1: left - 4, x2: left, y1: Y(d), y2: Y(d), stroke: '#333' }));
    svg.append(el('text', { x: left - 6, y: Y(d) + 4, 'text-anchor': 'end' }, `${d / 1000}`));
  }
  const stepKm = [1, 2, 5, 10, 20, 50, 100].find((v) => v * pxPerKm >= 60) ?? 100;
  for (let c = 0; c <= s.lengthKm + 1e-9; c += stepKm) {
    svg.append(el('line', { x1: X(c), x2: X(c), y1: top + plotH, y2: top + plotH + 4, stroke: '#333' }));
    svg.append(el('text', { x: X(c), y: top + plotH + 16, 'text-anchor': 'middle' }, `${c}`));
  }
  svg.append(el('rect', { x: left, y: top, width: plotW, height: plotH, fill: 'none', stroke: '#333' }));
  svg.append(el('text', { x: left + plotW, y: top + plotH + 32, 'text-anchor': 'end' }, 'chainage (km, geodesic)'));
  svg.append(el('text', { x: 12, y: top + plotH / 2, transform: `rotate(-90 12 ${top + plotH / 2})`, 'text-anchor': 'middle' }, 'depth (km)'));
  svg.append(el('text', { x: left, y: 14, 'font-weight': 'bold', 'font-size': 12 }, s.title));
  svg.append(el('text', { x: left + plotW, y: 14, 'text-anchor': 'end', 'font-size': 12, 'data-ve': ve }, ve === 1 ? 'vertical exaggeration 1 : 1 (true scale)' : `vertical exaggeration ${ve} : 1`));
  return svg;
}

export async function svgToPng(svg: SVGSVGElement): Promise<Blob> {
  const text = new XMLSerializer().serializeToString(svg);
  const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    await new Promise<void>((resolve, reject) => ((img.onload = () => resolve()), (img.onerror = () => reject(new Error('section image could not be drawn'))), (img.src = url)));
    const c = document.createElement('canvas');
    c.width = img.width;
    c.height = img.height;
    c.getContext('2d')!.drawImage(img, 0, 0);
    return await new Promise<Blob>((resolve) => c.toBlob((b) => resolve(b!), 'image/png'));
  } finally {
    URL.revokeObjectURL(url);
  }
}
