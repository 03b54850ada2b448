import { describe, expect, it } from 'vitest';
import { crsFromEpsg, WGS84 } from '../../src/crs/registry.js';
import { transformer } from '../../src/crs/transform.js';
import { geodesicDistance } from '../../src/crs/geodesy.js';
import { oceanwardFromAzimuth } from '../../src/domains/direction.js';
import { sampleBilinear } from '../../src/grid/resample.js';
import type { GridGeometry } from '../../src/grid/geometry.js';
import { resolvePlan } from '../../src/survey/params.js';
import { planSurvey, type PlanInput } from '../../src/survey/plan.js';
import { programmeFigures, twoWayTimeToMoho, lineFigures } from '../../src/survey/programme.js';
import { sampleSection } from '../../src/survey/section.js';
import { segmentHit } from '../../src/boundaries/planar.js';
import { planFromResult } from '../../src/survey/run.js';
import { runDemo } from '../helpers/demo-run.js';
import { toUV } from '../../fixtures/demo-margin.js';

type P = [number, number];
const crs = crsFromEpsg(32631);

/** Whether a two-point line meets a polyline (end points included). */
function crosses(line: P[], path: P[]): boolean {
  for (let q = 0; q + 1 < path.length; q++) if (segmentHit(line[0], line[line.length - 1], path[q], path[q + 1]) !== null) return true;
  return false;
}

/** A synthetic transition zone with a known curved midline: limits at x = 500 km ± 10 km + 30 km·sin(y/60 km). */
function zone(amplitude = 30_000, wavelength = 60_000): PlanInput {
  const taper: P[] = [];
  const oceanic: P[] = [];
  const necking: P[] = [];
  const coupling: P[] = [];
  for (let y = 4_900_000; y <= 5_300_000; y += 500) {
    const c = 500_000 + amplitude * Math.sin((y - 4_900_000) / wavelength);
    taper.push([c - 10_000, y]);
    oceanic.push([c + 10_000, y]);
    necking.push([c - 60_000, y]);
    coupling.push([c - 35_000, y]);
  }
  return {
    crs, oceanward: oceanwardFromAzimuth(90), extent: { xmin: 380_000, ymin: 4_900_000, xmax: 620_000, ymax: 5_300_000 }, cellSize: 500,
    taper: [taper], oceanic: [oceanic], necking: [necking], coupling: [coupling], existing: [], picks: [], licence: null,
  };
}

const dirOf = (c: P[]) => Math.atan2(c[1][1] - c[0][1], c[1][0] - c[0][0]);

describe('proposed lines on a synthetic curved zone', () => {
  const inp = zone();
  const params = resolvePlan({ spacingKm: 15, overhangLandwardKm: 12, overhangOceanwardKm: 8, smoothingKm: 20, turnAngleDeg: 15 });
  const plan = planSurvey(inp, params);
  const dips = plan.lines.filter((l) => l.kind === 'dip');

  it('splits the curved midline into several segments', () => {
    expect(plan.segments.length).toBeGreaterThan(2);
    expect(dips.length).toBeGreaterThan(10);
  });

  it('dip lines of a segment are parallel and within 5° of perpendicular to its mean strike', () => {
    for (const seg of plan.segments) {
      const mine = dips.filter((l) => l.segment === seg.index);
      if (!mine.length) continue;
      const c = seg.coords;
      const strike = Math.atan2(c[c.length - 1][1] - c[0][1], c[c.length - 1][0] - c[0][0]);
      for (const l of mine) {
        let d = Math.abs(dirOf(l.coords) - strike) % Math.PI;
        if (d > Math.PI / 2) d = Math.PI - d;
        expect(Math.abs(d - Math.PI / 2)).toBeLessThan((5 * Math.PI) / 180);
        expect(Math.abs(Math.sin(dirOf(l.coords) - dirOf(mine[0].coords)))).toBeLessThan(1e-9);
      }
    }
  });

  it('neighbouring dip lines are spaced within 2% of the request', () => {
    for (const seg of plan.segments) {
      const c = seg.coords;
      const u = [c[c.length - 1][0] - c[0][0], c[c.length - 1][1] - c[0][1]];
      const along = (l: { coords: P[] }) => l.coords[0][0] * u[0] + l.coords[0][1] * u[1];
      const mine = dips.filter((l) => l.segment === seg.index).sort((a, b) => along(a) - along(b));
      for (let k = 1; k < mine.length; k++) {
        const a = mine[k - 1].coords;
        const b = mine[k].coords;
        // perpendicular distance from b's start to line a
        const [ax, ay] = a[0];
        const [bx, by] = a[1];
        const len = Math.hypot(bx - ax, by - ay);
        const dist = Math.abs((bx - ax) * (ay - b[0][1]) - (ax - b[0][0]) * (by - ay)) / len;
        expect(Math.abs(dist / 15_000 - 1)).toBeLessThan(0.02);
      }
    }
  });

  it('every dip line reaches the requested overhang beyond both limits', () => {
    const hitAlong = (c: P[], line: P[]) => {
      for (let q = 0; q < line.length - 1; q++) {
        const t = segmentHit(c[0], c[1], line[q], line[q + 1]);
        if (t !== null) return t * Math.hypot(c[1][0] - c[0][0], c[1][1] - c[0][1]);
      }
      return null;
    };
    for (const l of dips) {
      const total = Math.hypot(l.coords[1][0] - l.coords[0][0], l.coords[1][1] - l.coords[0][1]);
      const tTaper = hitAlong(l.coords, inp.taper[0]);
      const tOcean = hitAlong(l.coords, inp.oceanic[0]);
      expect(tTaper).not.toBeNull();
      expect(tOcean).not.toBeNull();
      expect(tTaper!).toBeGreaterThanOrEqual(12_000 - 1);
      expect(total - tOcean!).toBeGreaterThanOrEqual(8_000 - 1);
    }
  });

  it('lengths are geodesic: a straight UTM line matches the WGS84 geodesic between its ends (Karney 2013) to 0.1 m', () => {
    const t = transformer(crs, WGS84);
    for (const l of plan.lines) {
      // dip lines are straight; tie lines are polylines through their tie points: the sum of their legs
      let legs = 0;
      for (let k = 0; k + 1 < l.coords.length; k++) {
        const [a, b] = [t.forward(l.coords[k]), t.forward(l.coords[k + 1])];
        legs += geodesicDistance(a[0], a[1], b[0], b[1]);
      }
      expect(Math.abs(l.lengthKm * 1000 - legs)).toBeLessThan(0.1 * (l.coords.length - 1));
    }
  });

  it('drops a proposal that runs along an existing line (2 km, 10°)', () => {
    const target = dips[Math.floor(dips.length / 2)];
    const shifted: P[] = target.coords.map(([x, y]) => [x + 300, y + 1200]);
    const again = planSurvey({ ...inp, existing: [{ name: 'OLD-7', coords: shifted }] }, params);
    expect(again.dropped.map((d) => d.reason)).toEqual(expect.arrayContaining([expect.stringMatching(/existing line OLD-7/)]));
    expect(again.lines.filter((l) => l.kind === 'dip').length).toBe(dips.length - 1);
  });
});

describe('fanned segments and ties in any programme cut', () => {
  // a sharper bend so that segments fan: limits at x = 500 km ± 10 km + 60 km·sin(y/50 km)
  const inp = zone(60_000, 50_000);
  const plan = planSurvey(inp, resolvePlan({ spacingKm: 12, overhangLandwardKm: 15, overhangOceanwardKm: 15, smoothingKm: 10, turnAngleDeg: 12 }));
  const dips = plan.lines.filter((l) => l.kind === 'dip');
  const ties = plan.lines.filter((l) => l.kind === 'strike');

  it('no two kept dip lines cross inside the zone, and a dropped crossing one is named', () => {
    expect(plan.segments.length).toBeGreaterThan(3);
    const insideZone = (x: number, y: number) => {
      const c = 500_000 + 60_000 * Math.sin((y - 4_900_000) / 50_000);
      return Math.abs(x - c) <= 10_000;
    };
    for (let a = 0; a < dips.length; a++) {
      for (let b = a + 1; b < dips.length; b++) {
        const [p0, p1] = [dips[a].coords[0], dips[a].coords[1]];
        const t = segmentHit(p0, p1, dips[b].coords[0], dips[b].coords[1]);
        if (t === null) continue;
        expect(insideZone(p0[0] + (p1[0] - p0[0]) * t, p0[1] + (p1[1] - p0[1]) * t), `${dips[a].id} × ${dips[b].id}`).toBe(false);
      }
    }
    expect(plan.dropped.some((d) => /crosses D\d+-\d+ .*inside the COT zone/.test(d.reason))).toBe(true);
  });

  it('tie lines are continuous across the segments they tie', () => {
    // every tie piece joins the others of its kind end to end: three continuous lines in all
    const byNote = new Map<string, P[][]>();
    const kindOf = (note: string) => note.replace(/ \(joins.*$/, '');
    for (const t of ties) byNote.set(kindOf(t.note!), [...(byNote.get(kindOf(t.note!)) ?? []), t.coords]);
    expect(byNote.size).toBe(3);
    for (const [note, parts] of byNote) {
      const ends = parts.flatMap((q) => [q[0], q[q.length - 1]]);
      const key = (q: P) => `${q[0].toFixed(3)},${q[1].toFixed(3)}`;
      const count = new Map<string, number>();
      for (const e of ends) count.set(key(e), (count.get(key(e)) ?? 0) + 1);
      const loose = [...count.values()].filter((v) => v === 1).length;
      expect(loose, note).toBe(2); // one line: only its two ends are unmatched
      const segs = new Set(ties.filter((t) => kindOf(t.note!) === note).flatMap((t) => t.ties!).map((id) => dips.find((d) => d.id === id)!.segment));
      expect(segs.size, note).toBeGreaterThan(1);
    }
  });

  it('every dip line is crossed by a tie line in any programme cut at its cumulative line-km', () => {
    for (const d of dips) {
      const cut = plan.lines.filter((l) => l.cumulativeKm <= d.cumulativeKm + 1e-9);
      for (const kept of cut.filter((l) => l.kind === 'dip')) {
        expect(cut.some((t) => t.kind === 'strike' && crosses(kept.coords, t.coords)), `${kept.id} in the cut at ${d.id}`).toBe(true);
      }
    }
  });
});

describe('sections', () => {
  const geom: GridGeometry = { nx: 50, ny: 40, x0: 400_250, y0: 5_019_750, dx: 500, dy: -500, registration: 'area', crs };
  const n = geom.nx * geom.ny;
  const plane = (a: number, b: number, c: number) => Float32Array.from({ length: n }, (_, k) => a + b * (k % geom.nx) + c * Math.floor(k / geom.nx));
  const g = { geometry: geom, seabed: plane(1000, 10, 0), basement: plane(3000, 20, 5), moho: plane(20000, -30, 7), thickness: plane(17000, -50, 2), domains: new Uint8Array(n).fill(3) };

  it('samples at most half a cell apart and equals direct grid interpolation', () => {
    const path: P[] = [[401_000, 5_018_000], [415_000, 5_005_000], [420_000, 5_006_000]];
    const s = sampleSection(g, path);
    expect(s.stepM).toBeLessThanOrEqual(250);
    for (let k = 1; k < s.x.length; k++) expect(Math.hypot(s.x[k] - s.x[k - 1], s.y[k] - s.y[k - 1])).toBeLessThanOrEqual(250 + 1e-6);
    for (let k = 0; k < s.x.length; k += 7) {
      const fi = (s.x[k] - geom.x0) / geom.dx;
      const fj = (s.y[k] - geom.y0) / geom.dy;
      expect(s.basement[k]).toBe(Math.fround(sampleBilinear({ geometry: geom, values: g.basement }, fi, fj)));
      expect(s.moho[k]).toBeCloseTo(20000 - 30 * fi + 7 * fj, 1);
    }
    // chainage is geodesic: the end equals the sum of geodesic legs
    const t = transformer(crs, WGS84);
    let legs = 0;
    for (let k = 0; k < path.length - 1; k++) {
      const a = t.forward(path[k]);
      const b = t.forward(path[k + 1]);
      legs += geodesicDistance(a[0], a[1], b[0], b[1]);
    }
    expect(s.chainageKm[s.x.length - 1] * 1000).toBeCloseTo(legs, 1);
  });

  it('reports where a section crosses a named line', () => {
    const s = sampleSection(g, [[401_000, 5_010_000], [420_000, 5_010_000]], { 'crustal-taper-limit': [[[410_000, 5_000_000], [410_000, 5_020_000]]] });
    expect(s.crossings).toHaveLength(1);
    expect(s.crossings[0].x).toBeCloseTo(410_000, 6);
  });
});

describe('programme figures', () => {
  const p = resolvePlan();
  it('two-way time to the Moho equals a hand computation', () => {
    // water 2000 m at 1500 m/s: 1.333333 s one way; sediment 3000 m with v = 1800 + 0.5 z:
    // ln(1 + 0.5·3000/1800)/0.5 = ln(1.833333)/0.5 = 0.606136/0.5 = 1.212272 s; crust 20 000 m at 6200 m/s: 3.225806 s.
    // two-way: 2 × (1.333333 + 1.212272 + 3.225806) = 2 × 5.771411 = 11.542823 s.
    expect(twoWayTimeToMoho(2000, 3000, 20000, p)).toBeCloseTo(11.542823, 5);
  });
  it('record length is the largest TWT along the line plus the 2 s margin, rounded up to 0.5 s', () => {
    const s = { x: new Float64Array(2), seabed: Float32Array.from([1000, 2000]), basement: Float32Array.from([2000, 5000]), moho: Float32Array.from([30000, 25000]), crossings: [] };
    const f = lineFigures(s as never, p);
    // the second sample: the hand computation above; the first: 2(0.666667 + ln(1.277778)/0.5 + 4.516129) = 11.346
    expect(f.maxTwtS).toBeCloseTo(11.542823, 5);
    expect(f.recordLengthS).toBe(14);
  });
  it('duration and cost follow the stated inputs', () => {
    // 2 lines of 50 and 70 km, run-in/out 3 km each: 126 km at 4.5 kn (8.334 km/h) = 15.1188 h, + 1 change of 2 h
    const f = programmeFigures([50, 70], resolvePlan({ costPerKm: 1000 }));
    expect(f.productiveHours).toBeCloseTo(126 / 8.334 + 2, 6);
    expect(f.totalDays).toBeCloseTo(((126 / 8.334 + 2) * 1.25) / 24, 6);
    expect(f.cost).toBe(120_000);
    expect(programmeFigures([10], p).cost).toBeNull();
  });
});

describe('planning on the invented demo', async () => {
  const r = await runDemo({ picks: true, licence: true, lines: true });
  const sp = planFromResult(r, {});
  it('finds the coverage gaps the existing lines leave, largest first', () => {
    // existing dip lines cross the zone at v ≈ 88, 57 and 12–22 km (model km along strike) and the
    // transition is drawn only north of the transfer zone (v ≈ −15 km): the largest gap lies between
    // VX-108 and VX-105, 35 km apart
    expect(sp.plan.gaps.length).toBeGreaterThanOrEqual(2);
    const lengths = sp.plan.gaps.map((q) => q.lengthKm);
    expect([...lengths].sort((a, b) => b - a)).toEqual(lengths);
    const [, v] = toUV(...sp.plan.gaps[0].at);
    expect(v).toBeGreaterThan(22);
    expect(v).toBeLessThan(57);
    expect(sp.plan.gaps[0].maxDistanceKm).toBeGreaterThan(15);
  });
  it('ranks first a dip line in a coverage gap', () => {
    const first = sp.plan.lines.find((l) => l.kind === 'dip')!;
    // only its tie stubs come before it
    expect(sp.plan.lines.slice(0, first.rank - 1).every((l) => l.kind === 'strike' && l.ties?.includes(first.id))).toBe(true);
    expect(first.controlDistanceKm!).toBeGreaterThan(sp.params.spacingKm / 2);
    // cumulative line-km is the running sum in rank order
    let sum = 0;
    for (const l of sp.plan.lines) {
      sum += l.lengthKm;
      expect(l.cumulativeKm).toBeCloseTo(sum, 9);
    }
  });
  it('every tie line crosses the dip lines it says it ties', () => {
    const ties = sp.plan.lines.filter((l) => l.kind === 'strike');
    expect(ties.filter((s) => s.ties!.length > 0).length).toBeGreaterThan(ties.length / 2);
    for (const s of ties) {
      // a piece that only joins two tied stretches crosses no dip line and says so
      if (!s.ties!.length) expect(s.note).toMatch(/joins/);
      for (const id of s.ties!) expect(crosses(sp.plan.lines.find((l) => l.id === id)!.coords, s.coords), `${s.id} × ${id}`).toBe(true);
    }
  });
});

describe('proposed lines with an uncertainty envelope', () => {
  // a straight zone: taper limit at x = 490 km, oceanic limit at x = 510 km; the envelope is ±2 km
  // around the taper limit in the south (y < 5 100 km) and ±8 km in the north, ±3 km around the
  // oceanic limit everywhere
  const straight = (x: (y: number) => number): P[][] => {
    const l: P[] = [];
    for (let y = 4_900_000; y <= 5_300_000; y += 1000) l.push([x(y), y]);
    return [l];
  };
  const half = (y: number) => (y < 5_100_000 ? 2000 : 8000);
  const inp: PlanInput = {
    ...zone(0),
    // the necking-zone tie point (between these two, less 2 km) lies oceanward of every overhang end
    necking: straight(() => 484_000),
    coupling: straight(() => 486_000),
    envelope: {
      taper: { p90: straight((y) => 490_000 - half(y)), p10: straight((y) => 490_000 + half(y)) },
      oceanic: { p10: straight(() => 507_000), p90: straight(() => 513_000) },
    },
  };
  const params = resolvePlan({ spacingKm: 20, overhangLandwardKm: 10, overhangOceanwardKm: 5 });
  const plan = planSurvey(inp, params);
  const dips = plan.lines.filter((l) => l.kind === 'dip');

  it('each dip line crosses the envelope width of both limits (P90–P10) and reaches the overhangs beyond the P90 limits', () => {
    expect(dips.length).toBeGreaterThan(10);
    for (const d of dips) {
      const y = (d.coords[0][1] + d.coords[1][1]) / 2;
      // 2 × half-width of the taper envelope + 6 km of the oceanic one
      expect(d.envelopeWidthKm).toBeCloseTo((2 * half(y) + 6000) / 1000, 6);
      const xs = d.coords.map((c) => c[0]).sort((a, b) => a - b);
      expect(xs[0]).toBeCloseTo(490_000 - half(y) - 10_000, 3);
      expect(xs[1]).toBeCloseTo(513_000 + 5000, 3);
    }
  });

  it('ranks the lines crossing the wider envelope first and says that it does', () => {
    const first = dips.slice(0, 5);
    for (const d of first) expect((d.coords[0][1] + d.coords[1][1]) / 2).toBeGreaterThanOrEqual(5_100_000);
    expect(plan.rankedBy).toMatch(/^by the P90–P10 envelope width/);
    expect(planSurvey(zone(0), params).rankedBy).toMatch(/^by the zone width/);
    expect(planSurvey(zone(0), params).lines.every((l) => l.envelopeWidthKm === null)).toBe(true);
  });
});
