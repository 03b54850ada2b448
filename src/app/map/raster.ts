/**
 * The raster layer: the shown grid coloured into 64-cell tiles (BitmapLayers over deck.gl). The
 * colouring is cached per (layer, content): an opacity change, a redraw, or a run that leaves the
 * shown grid's values as they were (a line parameter change with crustal thickness shown) reuses the
 * same images and only changes layer props; `colourings` counts the tiles actually coloured (a
 * browser test reads it).
 */

import { BitmapLayer } from '@deck.gl/layers';
import { colourBlock, displayRange, type RampSpec } from '../colour.js';
import type { DisplayResult } from '../messages.js';
import { tilesFor, type Tile } from '../tiles.js';

/** The ends of the colour ramp for a grid: its display range, with natural ends for some grids. */
export function rampFor(name: string, v: Float32Array): RampSpec {
  let r = displayRange(v);
  if (name === 'crustal-thickness' || name === 'airy-thickness') r = { min: 0, max: Math.max(r.max, 1) };
  if (name === 'beta-crust' || name === 'beta-subsidence') r = { min: 1, max: Math.min(Math.max(r.max, 2), 10) };
  if (name === 'gamma' || name.startsWith('p-')) r = { min: 0, max: 1 };
  if (name === 'positional-uncertainty') r = { min: 0, max: Math.max(r.max, 1) };
  return r;
}

/** Two 32-bit FNV-1a hashes (different offsets) over the samples' bytes and the length, memoised per array. */
const contentKeys = new WeakMap<object, string>();
function contentKey(values: Float32Array | Uint8Array): string {
  const hit = contentKeys.get(values);
  if (hit) return hit;
  const words = values.byteLength % 4 === 0 && values.byteOffset % 4 === 0 ? new Uint32Array(values.buffer, values.byteOffset, values.byteLength / 4) : Uint32Array.from(values);
  let a = 0x811c9dc5;
  let b = 0x01000193 ^ 0x5bd1e995;
  for (let k = 0; k < words.length; k++) {
    const w = words[k];
    a = Math.imul(a ^ w, 0x01000193);
    b = Math.imul(b ^ (w >>> 16) ^ (w << 16), 0x01000193);
  }
  const key = `${values.length}:${(a >>> 0).toString(36)}:${(b >>> 0).toString(36)}`;
  contentKeys.set(values, key);
  return key;
}

export class RasterLayer {
  colourings = 0;
  private tiles: Tile[] = [];
  private tileKey = '';
  private imageKey = '';
  private images: ImageData[] = [];
  private ramp: RampSpec | null = null;

  /** The ramp of the grid last coloured (null for domains). */
  get currentRamp(): RampSpec | null {
    return this.ramp;
  }

  layers(r: DisplayResult | null, layer: string, opacity: number): BitmapLayer[] {
    if (!r) return [];
    const g = r.geometry;
    const isDomains = layer === 'domains';
    const values = isDomains ? r.domains : r.grids[layer];
    if (!values) return [];
    const gk = `${g.nx}x${g.ny}@${g.x0},${g.y0},${g.dx},${g.dy}:${g.crs.proj4}`;
    if (gk !== this.tileKey) {
      this.tiles = tilesFor({ ...g, crs: g.crs });
      this.tileKey = gk;
      this.imageKey = '';
    }
    const key = `${layer}:${contentKey(values)}`;
    if (key !== this.imageKey) {
      this.ramp = isDomains ? null : rampFor(layer, values as Float32Array);
      const spec = isDomains ? { kind: 'domains' as const } : { kind: 'ramp' as const, ramp: this.ramp! };
      this.images = this.tiles.map((t) => new ImageData(colourBlock(values, g.nx, t.i0, t.j0, t.w, t.h, spec) as Uint8ClampedArray<ArrayBuffer>, t.w, t.h));
      this.colourings += this.tiles.length;
      this.imageKey = key;
    }
    return this.tiles.map(
      (t, k) =>
        new BitmapLayer({
          id: `raster-${k}`,
          beforeId: 'domain-outlines',
          image: this.images[k],
          bounds: t.bounds,
          opacity,
          textureParameters: { minFilter: 'nearest', magFilter: 'nearest' },
          updateTriggers: { image: key },
          pickable: false,
        } as never),
    );
  }
}
