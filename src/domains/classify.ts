/**
 * Per-cell margin domains (codes and default rules in DESIGN.md "Margin domains").
 *
 * Crust type is an interpretation: the thickness proxy decides sides by connectivity.
 *  - continental side: 4-connected cells with tc ≥ taper threshold that reach the landward edge;
 *  - oceanic side: 4-connected cells with tc ≥ the oceanic-limit threshold that reach the oceanward edge;
 *  - landward/oceanward edges: the rim cells of the data (on the grid's edge or beside no data) in
 *    the outer tenth of the range of positions projected on the oceanward direction;
 *  - isolated thick components (tc ≥ taper threshold) that neither reach the landward edge nor hold
 *    or touch oceanic-side crust: continental blocks when at least max(minBlockArea, minBlockCells
 *    cells) — labelled; smaller ones are treated like thin cells (enclosure decides, below);
 *  - thin cells enclosed by one side join it (flagged); thin cells between the sides are transition;
 *  - basement but no Moho: "Moho not imaged", its own class (6), never no data and never part of
 *    another domain; it takes no part in connectivity or enclosure;
 *  - oceanic side first (crust ≥ the oceanic-limit threshold connected to the oceanward edge), then
 *    the continental side (crust ≥ the taper threshold connected to the landward edge without passing
 *    through the oceanic side);
 *  - continental-side crust thinner than the oceanic-limit threshold is checked along the oceanward
 *    direction: oceanward of a thin gap it is not continental; with thick continental crust landward
 *    and oceanic-side crust oceanward and no gap either way (thin continental crust meeting thin
 *    first oceanic crust) thickness cannot place the transition: transition, flagged "unresolved";
 *  - an oceanic-side component that reaches the landward edge too: cells thinner than the typical
 *    oceanic maximum in it become transition, flagged "unresolved".
 * Crust-type polygons (evidence) force their cells before connectivity is computed.
 */

import { colToX, rowToY, type GridGeometry } from '../grid/geometry.js';
import { components } from './components.js';
import type { Oceanward } from './direction.js';

export const DOMAIN_NAMES = [
  'no data',
  'proximal continental',
  'necking',
  'hyperextended continental',
  'transition (exhumed mantle or unresolved)',
  'oceanic',
  'Moho not imaged',
] as const;

export type DomainCode = 0 | 1 | 2 | 3 | 4 | 5 | 6;

export const DOMAIN_MOHO_GAP = 6;
/** Continental domains (proximal, necking, hyperextended). */
export const isContinentalDomain = (d: number) => d >= 1 && d <= 3;

/** Forced crust type per cell from evidence polygons. */
export const FORCE_NONE = 0;
export const FORCE_CONTINENTAL = 1;
export const FORCE_TRANSITION = 2;
export const FORCE_OCEANIC = 3;

export interface ClassifyInput {
  readonly geometry: GridGeometry;
  /** Crustal thickness (m), NaN where the Moho is not imaged or there is no data. */
  readonly thickness: Float32Array;
  /** 1 where the cell has data (basement, and seabed if a seabed grid was given). */
  readonly valid: Uint8Array;
  /** Taper threshold per cell (calibrated to picks) or one value. */
  readonly taperLevel: Float32Array | number;
  /** Oceanic-limit threshold per cell or one value. */
  readonly oceanLevel: Float32Array | number;
  readonly oceanward: Oceanward;
  readonly tc0: number;
  readonly neckingFraction: number;
  readonly couplingThickness: number;
  readonly oceanicMin: number;
  readonly oceanicMax: number;
  /** km²; isolated thick components smaller than this are not mapped as blocks. */
  readonly minBlockArea: number;
  /** Cells; isolated thick components with fewer cells are not mapped as blocks. */
  readonly minBlockCells: number;
  /** Area of one cell in km² (planar in the analysis CRS; block sizes only). */
  readonly cellAreaKm2: number;
  readonly force?: Uint8Array;
}

/** Bit flags per cell. */
export const FLAG_MOHO_NOT_IMAGED = 1;
export const FLAG_ATYPICAL_OCEANIC = 2;
export const FLAG_UNRESOLVED = 4;
export const FLAG_BLOCK = 8;
export const FLAG_ENCLOSED_THIN = 16;
export const FLAG_FORCED = 32;

export interface Classified {
  readonly domains: Uint8Array;
  readonly flags: Uint8Array;
  /** Isolated continental blocks kept (label, cells, planar km², centre in map coordinates). */
  readonly blocks: { label: number; cells: number; areaKm2: number; x: number; y: number }[];
  /** The smallest block mapped (km²): max(minBlockArea, minBlockCells × cell area). */
  readonly minBlockKm2: number;
  readonly counts: Record<string, number>;
  /** Cells where oceanic-range crust runs unbroken to the landward edge (the sides join), and cells left unresolved along the oceanward direction. */
  readonly joined: number;
  readonly unresolved: number;
  readonly warnings: string[];
}

export function classify(inp: ClassifyInput): Classified {
  const g = inp.geometry;
  const { nx, ny } = g;
  const n = nx * ny;
  const tc = inp.thickness;
  const force = inp.force;
  const valid = inp.valid;
  // the two thresholds as a per-cell field or one value (read in the hot loops below without a call)
  const taperF = typeof inp.taperLevel === 'number' ? null : inp.taperLevel;
  const taperC = typeof inp.taperLevel === 'number' ? inp.taperLevel : 0;
  const oceanF = typeof inp.oceanLevel === 'number' ? null : inp.oceanLevel;
  const oceanC = typeof inp.oceanLevel === 'number' ? inp.oceanLevel : 0;
  const warnings: string[] = [];

  // Edge seeds by position along the oceanward direction.
  const xc = colToX(g, (nx - 1) / 2);
  const yc = rowToY(g, (ny - 1) / 2);
  const proj = (i: number, j: number) => (colToX(g, i) - xc) * inp.oceanward.ex + (rowToY(g, j) - yc) * inp.oceanward.ey;
  // the rim of the data: cells with data on the grid's edge or beside a no-data cell (a grid whose
  // corners are empty, e.g. reprojected, still has seeds)
  // (one pass with the thick masks: crust at or above each threshold, with forced cells applied)
  const boundary: number[] = [];
  const mc = new Uint8Array(n);
  const mo = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    if (!valid[k]) continue;
    const i = k % nx;
    if (i === 0 || i === nx - 1 || k < nx || k >= n - nx || !valid[k - 1] || !valid[k + 1] || !valid[k - nx] || !valid[k + nx]) boundary.push(k);
    const f = force ? force[k] : FORCE_NONE;
    const t = tc[k];
    if (f === FORCE_CONTINENTAL) mc[k] = t === t ? 1 : 0;
    else if (f === FORCE_OCEANIC) mo[k] = t === t ? 1 : 0;
    else if (f === FORCE_NONE && t === t) {
      if (t >= (taperF ? taperF[k] : taperC)) mc[k] = 1;
      if (t >= (oceanF ? oceanF[k] : oceanC)) mo[k] = 1;
    }
  }
  let dmin = Infinity;
  let dmax = -Infinity;
  for (const k of boundary) {
    const d = proj(k % nx, Math.floor(k / nx));
    dmin = Math.min(dmin, d);
    dmax = Math.max(dmax, d);
  }
  const band = 0.1 * (dmax - dmin);
  const landSeed = new Uint8Array(n);
  const oceanSeed = new Uint8Array(n);
  for (const k of boundary) {
    const d = proj(k % nx, Math.floor(k / nx));
    if (d <= dmin + band) landSeed[k] = 1;
    if (d >= dmax - band) oceanSeed[k] = 1;
  }

  // Oceanic side first: crust at or above the oceanic-limit threshold connected to the oceanward edge.
  const co = components(mo, nx, ny);
  const oceanComp = new Uint8Array(co.count + 1);
  // (seeds lie on the rim only: the loops over seeds run over the rim cells)
  for (const k of boundary) if (oceanSeed[k] && co.labels[k]) oceanComp[co.labels[k]] = 1;
  const coLabels = co.labels;
  // a cell on the oceanic side: in a component of the oceanic mask that reaches the oceanward edge;
  // the continental mask without it (continental side: crust at or above the taper threshold
  // connected to the landward edge without passing through oceanic-side crust)
  const onOcean = new Uint8Array(n);
  const mcx = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const l = coLabels[k];
    if (l > 0 && oceanComp[l] === 1) onOcean[k] = 1;
    else if (mc[k]) mcx[k] = 1;
  }
  // An oceanic component that also reaches the landward edge: nothing parts continent from ocean.
  const landO = new Uint8Array(co.count + 1);
  for (const k of boundary) if (landSeed[k] && onOcean[k]) landO[coLabels[k]] = 1;
  const cc = components(mcx, nx, ny);
  const contComp = new Uint8Array(cc.count + 1);
  for (const k of boundary) if (landSeed[k] && cc.labels[k]) contComp[cc.labels[k]] = 1;
  // A thick component touching oceanic-side crust or the oceanward edge belongs with the ocean (its
  // cells between the two thresholds are thin relative to oceanic crust), never a block.
  const oceanLinked = new Uint8Array(cc.count + 1);
  for (let k = 0; k < n; k++) {
    const lc = cc.labels[k];
    if (!lc) continue;
    const i = k % nx;
    if (oceanSeed[k] || (i > 0 && onOcean[k - 1]) || (i < nx - 1 && onOcean[k + 1]) || (k >= nx && onOcean[k - nx]) || (k < n - nx && onOcean[k + nx])) oceanLinked[lc] = 1;
  }

  const domains = new Uint8Array(n);
  const flags = new Uint8Array(n);
  const SIDE_C = 1;
  const SIDE_O = 2;
  const side = new Uint8Array(n);
  // what a ray along the oceanward direction (below) meets at each cell, decided with the cell's side:
  // no data or no Moho stops it unanswered (0); a thin gap, oceanic-side crust or thick continental
  // crust answer it; anything else it passes through. And the cells the rays start from.
  const HIT_NONE = 0;
  const HIT_THICK = 1;
  const HIT_GAP = 2;
  const HIT_OCEAN = 3;
  const PASS = 255;
  const meets = new Uint8Array(n);
  const rayFrom: number[] = [];
  let merged = 0;
  // isolated thick components that may be blocks, in the order first met
  const candidate = new Uint8Array(cc.count + 1);
  const candidates: number[] = [];
  for (let k = 0; k < n; k++) {
    if (!valid[k]) continue;
    const lc = cc.labels[k];
    const f = force ? force[k] : FORCE_NONE;
    if (f !== FORCE_NONE) flags[k] |= FLAG_FORCED;
    if (f === FORCE_CONTINENTAL && mc[k]) side[k] = SIDE_C;
    else if (f === FORCE_OCEANIC && mo[k]) side[k] = SIDE_O;
    else if (onOcean[k] && landO[coLabels[k]]) {
      // oceanic-range crust runs unbroken to the landward edge: only crust thicker than any oceanic
      // crust is continental; the rest cannot be told apart
      merged++;
      if (tc[k] >= inp.oceanicMax) side[k] = SIDE_C;
      else flags[k] |= FLAG_UNRESOLVED;
    } else if (onOcean[k]) side[k] = SIDE_O;
    else if (lc > 0 && contComp[lc] === 1) side[k] = SIDE_C;
    else if (lc > 0 && !oceanLinked[lc] && !candidate[lc]) {
      candidate[lc] = 1;
      candidates.push(lc);
    }
    const t = tc[k];
    const sk = side[k];
    const ocean = oceanF ? oceanF[k] : oceanC;
    meets[k] = t !== t ? HIT_NONE : t < (taperF ? taperF[k] : taperC) ? HIT_GAP : sk === SIDE_O ? HIT_OCEAN : sk === SIDE_C && t >= ocean ? HIT_THICK : PASS;
    // continental-side crust thinner than the oceanic-limit threshold, not forced
    if (sk === SIDE_C && f === FORCE_NONE && t < ocean) rayFrom.push(k);
  }
  if (merged) {
    warnings.push(
      `thickness cannot resolve the transition in ${merged} cells: oceanic-range crust runs unbroken to the landward edge; ` +
        'cells thinner than the typical oceanic maximum there are marked unresolved. Add picks or crust-type polygons.',
    );
  }

  // Crust between the two thresholds that the continental flood reached is looked at along the
  // oceanward direction (it can be linked to the land along strike, through a segment without a gap):
  //  - landward of it a thin gap (thinner than the taper threshold) before thick continental crust:
  //    it lies oceanward of the gap (thin first oceanic crust) — not continental;
  //  - thick continental crust landward and oceanic-side crust oceanward with no gap either way:
  //    thin continental crust meets thin oceanic crust, and thickness cannot place the transition —
  //    unresolved;
  //  - otherwise (a gap oceanward of it): hyperextended continental crust, as flooded.
  let unresolved = 0;
  {
    // oceanward direction in index space (rows run with dy), and two directions 25° either side used
    // where the first ray leaves the grid before it finds anything (near the grid's edges)
    const ex = inp.oceanward.ex / g.dx;
    const ey = inp.oceanward.ey / g.dy;
    const a0 = Math.atan2(ey, ex);
    const dirs = [0, 25, -25].map((d) => [Math.cos(a0 + (d * Math.PI) / 180), Math.sin(a0 + (d * Math.PI) / 180)]);
    const maxSteps = nx + ny;
    const ray = (i0: number, j0: number, di: number, dj: number): number => {
      for (let s = 1; s < maxSteps; s++) {
        const i = Math.round(i0 + di * s);
        const j = Math.round(j0 + dj * s);
        if (i < 0 || j < 0 || i >= nx || j >= ny) return HIT_NONE;
        const m = meets[j * nx + i];
        if (m !== PASS) return m;
      }
      return HIT_NONE;
    };
    const march = (i0: number, j0: number, sign: 1 | -1): number => {
      for (const [di, dj] of dirs) {
        const hit = ray(i0, j0, sign * di, sign * dj);
        if (hit !== HIT_NONE) return hit;
      }
      return HIT_NONE;
    };
    const reassigned: number[] = [];
    for (const k of rayFrom) {
      const i = k % nx;
      const j = (k - i) / nx;
      const land = march(i, j, -1);
      if (land === HIT_GAP) reassigned.push(k);
      else if (land === HIT_THICK && march(i, j, 1) === HIT_OCEAN) {
        reassigned.push(k);
        flags[k] |= FLAG_UNRESOLVED;
        unresolved++;
      }
    }
    for (const k of reassigned) side[k] = 0;
  }
  if (unresolved) {
    warnings.push(
      `thickness cannot resolve the transition in ${unresolved} cells: thin continental-side crust meets oceanic-range crust with no thinner gap; ` +
        'those cells (between the taper and oceanic-crust thresholds) are marked unresolved and the taper and oceanic limits stop there. Crust-type polygons (from the seismic) can place it.',
    );
  }

  // Isolated thick components: continental blocks when large enough.
  const blocks: Classified['blocks'] = [];
  const keepBlock = new Uint8Array(cc.count + 1);
  const minBlockKm2 = Math.max(inp.minBlockArea, inp.minBlockCells * inp.cellAreaKm2);
  for (const label of candidates) {
    const cells = cc.sizes[label];
    const areaKm2 = cells * inp.cellAreaKm2;
    if (areaKm2 >= minBlockKm2 && cells >= inp.minBlockCells) {
      keepBlock[label] = 1;
      blocks.push({ label, cells, areaKm2, x: 0, y: 0 });
    }
  }
  if (blocks.length) {
    const sumI = new Float64Array(cc.count + 1);
    const sumJ = new Float64Array(cc.count + 1);
    for (let k = 0; k < n; k++) {
      const l = cc.labels[k];
      if (keepBlock[l] === 1) (sumI[l] += k % nx), (sumJ[l] += Math.floor(k / nx));
    }
    for (const b of blocks) {
      b.x = colToX(g, sumI[b.label] / b.cells);
      b.y = rowToY(g, sumJ[b.label] / b.cells);
    }
  }
  // Blocks join the continental side; the rest (thin, small blocks, unresolved): enclosure decides.
  // Moho gaps take no part.
  const rest = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    if (!valid[k] || side[k]) continue;
    const lc = cc.labels[k];
    if (lc > 0 && keepBlock[lc] === 1 && !(flags[k] & FLAG_UNRESOLVED)) {
      side[k] = SIDE_C;
      flags[k] |= FLAG_BLOCK;
    } else if (tc[k] === tc[k]) rest[k] = 1;
  }
  const cr = components(rest, nx, ny);
  const touches = new Uint8Array(cr.count + 1); // bit 1: continental side, bit 2: oceanic side
  for (let k = 0; k < n; k++) {
    const l = cr.labels[k];
    if (!l) continue;
    const i = k % nx;
    if (i > 0) touches[l] |= side[k - 1];
    if (i < nx - 1) touches[l] |= side[k + 1];
    if (k >= nx) touches[l] |= side[k - nx];
    if (k < n - nx) touches[l] |= side[k + nx];
  }

  const neck = inp.neckingFraction * inp.tc0;
  const counts: Record<string, number> = {};
  const tally = new Float64Array(256);
  for (let k = 0; k < n; k++) {
    let d: DomainCode = 0;
    if (valid[k]) {
      const t = tc[k];
      const f = force ? force[k] : FORCE_NONE;
      if (t !== t) {
        flags[k] |= FLAG_MOHO_NOT_IMAGED;
        d = 6;
      } else if (side[k] === SIDE_C) d = t >= neck ? 1 : t >= inp.couplingThickness ? 2 : 3;
      else if (side[k] === SIDE_O) d = 5;
      else if (f === FORCE_TRANSITION || flags[k] & FLAG_UNRESOLVED) d = 4;
      else {
        const touch = touches[cr.labels[k]];
        if (touch === SIDE_O) {
          d = 5;
          flags[k] |= FLAG_ENCLOSED_THIN;
        } else if (touch === SIDE_C) {
          d = 3;
          flags[k] |= FLAG_ENCLOSED_THIN;
        } else d = 4;
      }
      if (d === 5 && (t < inp.oceanicMin || t > inp.oceanicMax)) flags[k] |= FLAG_ATYPICAL_OCEANIC;
    }
    domains[k] = d;
    tally[d]++;
  }
  // integer keys: listed in ascending order, only the codes met
  for (let d = 0; d < tally.length; d++) if (tally[d]) counts[d] = tally[d];
  if (!contComp.some((v) => v === 1)) warnings.push('no continental crust reaches the landward edge: no continental side found (check the oceanward direction)');
  if (!oceanComp.some((v) => v === 1)) warnings.push('no crust above the oceanic-limit threshold reaches the oceanward edge: no oceanic side found');
  return { domains, flags, blocks, minBlockKm2, counts, joined: merged, unresolved, warnings };
}
