// Evidence: picks calibrate the proxy threshold locally; the line passes through them.
import { describe, expect, it } from 'vitest';
import { crsFromEpsg } from '../../src/crs/registry.js';
import type { GridGeometry } from '../../src/grid/geometry.js';
import { makeGrid } from '../../src/grid/grid.js';
import { pointSegmentDistance } from '../../src/boundaries/planar.js';
import { runPipeline } from '../../src/pipeline.js';
import type { VectorSet } from '../../src/io/geojson-read.js';

// A synthetic margin (not the demo): continent west, ocean east, crust thinning linearly from 30 km at
// x = 0 to 0 at x = 60 km along a gently curved taper, zero-crust gap, then 7 km oceanic crust.
const crs = crsFromEpsg(32631);
const geom: GridGeometry = { nx: 200, ny: 120, x0: 400_250, y0: 5_059_750, dx: 500, dy: -500, registration: 'area', crs };
const taperAt = (y: number) => 440_000 + 6000 * Math.sin((y - 5_000_000) / 20_000);
function margin(): { basement: Float32Array; moho: Float32Array } {
  const n = geom.nx * geom.ny;
  const basement = new Float32Array(n);
  const moho = new Float32Array(n);
  for (let j = 0; j < geom.ny; j++) {
    const y = geom.y0 + j * geom.dy;
    for (let i = 0; i < geom.nx; i++) {
      const x = geom.x0 + i * geom.dx;
      const u = (x - taperAt(y)) / 1000; // km from where the crust reaches 2 km
      const tc = u < 0 ? Math.min(30, 2 - u * 0.5) : u < 4 ? 2 - 0.5 * u : u < 20 ? 0 : 7;
      basement[j * geom.nx + i] = 3000 + 40 * u;
      moho[j * geom.nx + i] = basement[j * geom.nx + i] + tc * 1000;
    }
  }
  return { basement, moho };
}

function pickSet(points: { x: number; y: number; kind: string; line: string }[]): VectorSet {
  return {
    file: 'picks.geojson',
    crs,
    warnings: [],
    features: points.map((p, index) => ({ kind: 'point', parts: [[[p.x, p.y]]], properties: { kind: p.kind, line: p.line }, index })),
  };
}

function run(picks: VectorSet | null) {
  const m = margin();
  return runPipeline(
    {
      basement: { name: 'basement', grid: makeGrid(geom, m.basement) },
      moho: { name: 'moho', grid: makeGrid(geom, m.moho) },
      picks: picks ? { name: 'picks.geojson', set: picks } : null,
    },
    { params: { oceanwardAzimuth: 90 } },
  );
}

const taperLines = (r: ReturnType<typeof run>) => r.boundaries.pieces.filter((p) => p.kind === 'crustal-taper-limit').map((p) => p.coords[0]);
const dist = (x: number, y: number, lines: [number, number][][]) => {
  let d = Infinity;
  for (const l of lines) for (let k = 0; k < l.length - 1; k++) d = Math.min(d, pointSegmentDistance(x, y, l[k][0], l[k][1], l[k + 1][0], l[k + 1][1]));
  return d;
};

describe('evidence: picks calibrate the crustal taper limit', () => {
  it('without picks the line is the proxy isoline (tc = 2 km) to rounding', () => {
    const lines = taperLines(run(null));
    expect(lines.length).toBeGreaterThan(0);
    let total = 0;
    for (const l of lines) {
      for (const [x, y] of l) expect(Math.abs(x - taperAt(y))).toBeLessThan(60); // linear-edge interpolation of a smooth curve
      for (let k = 1; k < l.length; k++) total += Math.hypot(l[k][0] - l[k - 1][0], l[k][1] - l[k - 1][1]);
    }
    expect(total).toBeGreaterThan(60_000); // the whole 60 km of the grid's height, and then some for the wiggle
  });

  it('with picks the line passes within half a cell of each pick and follows the proxy shape between them', () => {
    // Two interpreters' picks 3 km landward and 2 km oceanward of the proxy line, on two dip lines.
    const ya = 5_040_000;
    const yb = 5_010_000;
    const picks = [
      { x: taperAt(ya) - 3000, y: ya, kind: 'continental-limit', line: 'A' },
      { x: taperAt(yb) + 1500, y: yb, kind: 'continental-limit', line: 'B' },
    ];
    const r = run(pickSet(picks));
    const lines = taperLines(r);
    for (const p of picks) expect(dist(p.x, p.y, lines)).toBeLessThanOrEqual(250);
    // Between the picks the offset from the proxy line changes smoothly from −3 km to +1.5 km:
    // the calibrated line keeps the proxy's along-strike wiggle rather than cutting straight across.
    const offsets: number[] = [];
    for (const l of lines) for (const [x, y] of l) if (y < ya && y > yb) offsets.push(x - taperAt(y));
    expect(offsets.length).toBeGreaterThan(20);
    expect(Math.min(...offsets)).toBeGreaterThan(-3300);
    expect(Math.max(...offsets)).toBeLessThan(1800);
    // pieces near the picks say so; the rest are proxy
    const ev = r.boundaries.pieces.filter((p) => p.kind === 'crustal-taper-limit').map((p) => p.properties.evidence);
    expect(ev).toContain('picks');
    expect(ev).toContain('proxy');
    expect(r.calibration.taper?.points.map((q) => Math.round(q.thickness))).toEqual(expect.arrayContaining([3500]));
  });

  it('a pick where there is no crustal thickness is reported, not used', () => {
    const r = run(pickSet([{ x: 100, y: 100, kind: 'continental-limit', line: 'far' }]));
    expect(r.warnings.join()).toMatch(/continental-limit pick on far .* not used/);
  });
});
