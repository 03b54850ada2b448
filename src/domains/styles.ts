/**
 * Display colours of the margin domains, shared by the app's map and the colour table written into
 * domains.tif (so a GIS shows the classes as the app does). A categorical set of our own; the codes
 * and names are those of classify.ts.
 */

import { DOMAIN_NAMES } from './classify.js';

export type RGB = [number, number, number];

export interface DomainStyle {
  readonly code: number;
  readonly name: string;
  readonly colour: RGB;
}

const COLOURS: Record<number, RGB> = {
  1: [122, 86, 46],
  2: [196, 145, 62],
  3: [232, 212, 150],
  4: [160, 150, 205],
  5: [52, 110, 170],
  6: [158, 158, 158],
};

const LABELS: Record<number, string> = {
  6: 'Moho not imaged (basement picked, no Moho)',
};

export const DOMAIN_STYLES: DomainStyle[] = [1, 2, 3, 4, 5, 6].map((code) => ({ code, name: LABELS[code] ?? DOMAIN_NAMES[code], colour: COLOURS[code] }));
