/** What a reader found in a grid file, shown to the user and written into the run summary. */

import type { Registration } from '../grid/geometry.js';
import type { Decided, DepthReport } from './detect.js';

export interface GridReadReport extends DepthReport {
  readonly file: string;
  readonly format: 'geotiff' | 'xyz';
  readonly nx: number;
  readonly ny: number;
  readonly dx: number;
  readonly dy: number;
  readonly registration: Decided<Registration>;
  readonly crs: Decided<string>;
  readonly sampleType: string;
}
