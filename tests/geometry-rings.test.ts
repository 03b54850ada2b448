// Ring repair checked against the OGC Simple Features rules for polygon rings (OGC 06-103r4 §6.1.11).
import { describe, expect, it } from 'vitest';
import { signedArea, simpleRings, type Position } from '../src/geometry/rings.js';

const sq = (x: number, y: number, s = 1): Position[] => [[x, y], [x + s, y], [x + s, y + s], [x, y + s], [x, y]];

describe('simpleRings', () => {
  it('keeps a simple ring as it is', () => {
    expect(simpleRings(sq(0, 0))).toEqual([sq(0, 0)]);
  });
  it('drops repeated positions and spikes', () => {
    const r: Position[] = [[0, 0], [1, 0], [1, 0], [2, 0], [2, 1], [3, 1], [2, 1], [2, 2], [0, 2], [0, 0]];
    const out = simpleRings(r);
    expect(out).toHaveLength(1);
    expect(out[0]).toEqual([[0, 0], [1, 0], [2, 0], [2, 1], [2, 2], [0, 2], [0, 0]]);
  });
  it('splits two lobes touching at a point into two rings of the same orientation', () => {
    // figure of eight through (1, 1)
    const r: Position[] = [[0, 0], [1, 0], [1, 1], [2, 1], [2, 2], [1, 2], [1, 1], [0, 1], [0, 0]];
    const out = simpleRings(r);
    expect(out).toHaveLength(2);
    expect(out.map((l) => Math.sign(signedArea(l)))).toEqual([1, 1]);
    expect(out.reduce((s, l) => s + signedArea(l), 0)).toBe(signedArea(r));
  });
  it('splits a pinched pocket into a shell and an oppositely oriented hole touching it', () => {
    // a 3 × 3 square whose boundary dips in to enclose a pocket touching at (1, 1)
    const r: Position[] = [[0, 0], [3, 0], [3, 3], [0, 3], [0, 1], [1, 1], [1, 2], [2, 2], [2, 1], [1, 1], [0, 1], [0, 0]];
    const out = simpleRings(r);
    const signs = out.map((l) => Math.sign(signedArea(l))).sort();
    expect(signs).toEqual([-1, 1]);
  });
  it('a ring of five identical positions (a 1 × 1 grid traced through its sample) is dropped', () => {
    expect(simpleRings([[5, 5], [5, 5], [5, 5], [5, 5], [5, 5]])).toEqual([]);
  });
  it('an out-and-back line has no area and is dropped', () => {
    expect(simpleRings([[0, 0], [1, 0], [2, 0], [1, 0], [0, 0]])).toEqual([]);
  });
});
