/** Coordinate transforms between CRSs, through proj4; converters are cached per pair. */

import proj4 from 'proj4';
import type { Crs } from './registry.js';

export type XY = [number, number];

export interface Transformer {
  forward(p: XY): XY;
  inverse(p: XY): XY;
  readonly identity: boolean;
}

const cache = new Map<string, Transformer>();

export function transformer(from: Crs, to: Crs): Transformer {
  const key = `${from.proj4}\u0000${to.proj4}`;
  const hit = cache.get(key);
  if (hit) return hit;
  let t: Transformer;
  if (from.proj4 === to.proj4) {
    t = { forward: (p) => [p[0], p[1]], inverse: (p) => [p[0], p[1]], identity: true };
  } else {
    let conv: proj4.Converter;
    try {
      conv = proj4(from.proj4, to.proj4);
    } catch (err) {
      throw new Error(`cannot build a transform from ${from.name} to ${to.name}: ${(err as Error).message}`);
    }
    t = {
      forward: (p) => conv.forward([p[0], p[1]]) as XY,
      inverse: (p) => conv.inverse([p[0], p[1]]) as XY,
      identity: false,
    };
  }
  cache.set(key, t);
  return t;
}

