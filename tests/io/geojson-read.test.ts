// The GeoJSON reader refuses damaged files with a message naming the file and the problem
// (regressions of the cases a mutation run found: TypeErrors escaped before).
import { describe, expect, it } from 'vitest';
import { expectKinds, readGeoJson } from '../../src/io/geojson-read.js';

const fc = (features: unknown) => JSON.stringify({ type: 'FeatureCollection', features });
const line = (coordinates: unknown) => ({ type: 'Feature', properties: { name: 'L1' }, geometry: { type: 'LineString', coordinates } });

describe('GeoJSON reader: damaged input', () => {
  const cases: [string, string, RegExp][] = [
    ['features not a list', JSON.stringify({ type: 'FeatureCollection', features: { a: 1 } }), /lines\.geojson: is a FeatureCollection whose "features" is not a list/],
    ['a null feature', fc([null]), /lines\.geojson: feature 0 is not a GeoJSON object/],
    ['a feature without geometry', fc([{ type: 'Feature', properties: {} }]), /feature 0 has no geometry/],
    ['null coordinates', fc([line(null)]), /feature 0: its LineString has no list of coordinates/],
    ['coordinates not pairs', fc([line([1, 2])]), /feature 0: line position 0 is not a coordinate pair/],
    ['properties a list', fc([{ ...line([[0, 0], [1, 1]]), properties: [1] }]), /feature 0: "properties" is not an object/],
    ['a MultiPolygon of numbers', fc([{ type: 'Feature', properties: {}, geometry: { type: 'MultiPolygon', coordinates: [1, 2] } }]), /the coordinates of its polygon of a MultiPolygon are not a list/],
    ['type not text', JSON.stringify({ type: 7 }), /is not GeoJSON \("type" is not text\)/],
  ];
  for (const [what, text, re] of cases) {
    it(`refuses ${what}`, () => {
      expect(() => readGeoJson(text, 'lines.geojson')).toThrow(re);
    });
  }

  it('a line needs two distinct positions', () => {
    for (const coords of [[[0, 0]], [[0, 0], [0, 0]], []]) {
      const set = readGeoJson(fc([line(coords)]), 'lines.geojson');
      expect(() => expectKinds(set, 'lines'), JSON.stringify(coords)).toThrow(/lines\.geojson: line 0 needs at least two distinct positions/);
    }
  });

  it('a licence polygon must be closed, with four positions and an area', () => {
    const poly = (ring: number[][]) => fc([{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } }]);
    expect(() => expectKinds(readGeoJson(poly([[0, 0], [1, 0], [0, 0]]), 'lic.geojson'), 'licence')).toThrow(/lic\.geojson: polygon 0 has 3 positions/);
    expect(() => expectKinds(readGeoJson(poly([[0, 0], [1, 0], [1, 1], [0, 1]]), 'lic.geojson'), 'licence')).toThrow(/polygon 0 is not closed/);
    expect(() => expectKinds(readGeoJson(poly([[0, 0], [1, 0], [2, 0], [0, 0]]), 'lic.geojson'), 'licence')).toThrow(/polygon 0 has zero area/);
    expect(() => expectKinds(readGeoJson(poly([[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]]), 'lic.geojson'), 'licence')).not.toThrow();
  });
});
