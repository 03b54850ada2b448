/**
 * Connected components (4-connectivity) of a mask: labels 1..n in the raster order of each
 * component's first cell, 0 = not in the mask. Run-based two-pass labelling: each row's runs of mask
 * cells get a provisional label, joined (union–find) with the runs of the row above that share a
 * column; then each run's final label is written with one fill. Per cell only the mask is read and
 * the label written by fill, so large smooth masks (margin domains) cost about one pass over memory.
 */
export interface Components {
  readonly labels: Int32Array;
  readonly count: number;
  /** Cells per component (index = label). */
  readonly sizes: Int32Array;
}

export function components(mask: Uint8Array, nx: number, ny: number): Components {
  const labels = new Int32Array(nx * ny);
  // every run in raster order: [start, end) as cell indices and its provisional label
  let runA = new Int32Array(1024);
  let runB = new Int32Array(1024);
  let runL = new Int32Array(1024);
  let runs = 0;
  let parent = new Int32Array(1024);
  let next = 1;
  const find = (a: number): number => {
    let r = a;
    while (parent[r] !== r) r = parent[r];
    while (parent[a] !== r) {
      const up = parent[a];
      parent[a] = r;
      a = up;
    }
    return r;
  };
  // 1. runs per row, each joined with the overlapping runs of the row above
  let prevFirst = 0; // the row above's runs are runs prevFirst … rowFirst − 1
  for (let j = 0; j < ny; j++) {
    const row = j * nx;
    const rowFirst = runs;
    let p = prevFirst; // the first run above that may still overlap
    for (let i = 0; i < nx; ) {
      if (!mask[row + i]) {
        i++;
        continue;
      }
      const a = i;
      while (i < nx && mask[row + i]) i++;
      const b = i; // columns [a, b)
      if (runs === runA.length) {
        runA = grow(runA);
        runB = grow(runB);
        runL = grow(runL);
      }
      let label = 0;
      // runs above sharing a column: start before b and end after a (columns of the row above)
      while (p < rowFirst && runB[p] - (row - nx) <= a) p++;
      for (let q = p; q < rowFirst && runA[q] - (row - nx) < b; q++) {
        const r = find(runL[q]);
        if (!label) label = r;
        else if (r !== label) {
          if (r < label) {
            parent[label] = r;
            label = r;
          } else parent[r] = label;
        }
      }
      if (!label) {
        if (next === parent.length) parent = grow(parent);
        parent[next] = next;
        label = next++;
      }
      runA[runs] = row + a;
      runB[runs] = row + b;
      runL[runs++] = label;
    }
    prevFirst = rowFirst;
  }
  // 2. final labels in raster order of first cells (runs are in raster order), and sizes
  const final = new Int32Array(next);
  const sizes: number[] = [0];
  let count = 0;
  for (let q = 0; q < runs; q++) {
    const r = find(runL[q]);
    let f = final[r];
    if (!f) {
      f = final[r] = ++count;
      sizes.push(0);
    }
    labels.fill(f, runA[q], runB[q]);
    sizes[f] += runB[q] - runA[q];
  }
  return { labels, count, sizes: Int32Array.from(sizes) };
}

function grow(a: Int32Array<ArrayBuffer>): Int32Array<ArrayBuffer> {
  const out = new Int32Array(a.length * 2);
  out.set(a);
  return out;
}
