/**
 * Connected components (4-connectivity) of a mask: labels 1..n in the raster order of each
 * component's first cell, 0 = not in the mask. Two raster passes with union–find (provisional labels
 * from the left and upper neighbours, merged; then final labels): sequential memory access, one
 * label grid, no stack.
 */
export interface Components {
  readonly labels: Int32Array;
  readonly count: number;
  /** Cells per component (index = label). */
  readonly sizes: Int32Array;
}

export function components(mask: Uint8Array, nx: number, ny: number): Components {
  const n = nx * ny;
  const labels = new Int32Array(n);
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
  // 1. provisional labels; the smaller root wins a merge (so each root is its set's first label)
  for (let j = 0; j < ny; j++) {
    const row = j * nx;
    for (let i = 0; i < nx; i++) {
      const k = row + i;
      if (!mask[k]) continue;
      const left = i > 0 ? labels[k - 1] : 0;
      const up = j > 0 ? labels[k - nx] : 0;
      if (!left && !up) {
        if (next === parent.length) {
          const grown = new Int32Array(parent.length * 2);
          grown.set(parent);
          parent = grown;
        }
        parent[next] = next;
        labels[k] = next++;
      } else if (left && up && left !== up) {
        const a = find(left);
        const b = find(up);
        if (a < b) parent[b] = a;
        else if (b < a) parent[a] = b;
        labels[k] = a < b ? a : b;
      } else labels[k] = left || up;
    }
  }
  // 2. final labels in raster order of first cells, and sizes
  const final = new Int32Array(next);
  const sizes: number[] = [0];
  let count = 0;
  for (let k = 0; k < n; k++) {
    const p = labels[k];
    if (!p) continue;
    const r = find(p);
    let f = final[r];
    if (!f) {
      f = final[r] = ++count;
      sizes.push(0);
    }
    labels[k] = f;
    sizes[f]++;
  }
  return { labels, count, sizes: Int32Array.from(sizes) };
}
