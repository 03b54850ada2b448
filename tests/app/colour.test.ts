// Display colours: the viridis ramp comes from a maintained library and matches matplotlib's table.
import { describe, expect, it } from 'vitest';
import { viridis } from '../../src/app/colour.js';
import { DOMAIN_STYLES } from '../../src/domains/styles.js';

describe('viridis', () => {
  it('matches matplotlib _viridis_data at its ends and middle (van der Walt & Smith 2015; rounded to 8 bits, from memory)', () => {
    expect(viridis(0)).toEqual([68, 1, 84]);
    expect(viridis(0.5)).toEqual([33, 145, 140]);
    expect(viridis(1)).toEqual([253, 231, 37]);
    expect(viridis(-1)).toEqual(viridis(0));
    expect(viridis(2)).toEqual(viridis(1));
  });
});

describe('domain colours', () => {
  it('one distinct colour per class, Moho-not-imaged included', () => {
    expect(DOMAIN_STYLES.map((d) => d.code)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(new Set(DOMAIN_STYLES.map((d) => d.colour.join())).size).toBe(6);
  });
});
