/**
 * Connected components (4-connectivity) of a mask, by an iterative flood fill with an explicit
 * Int32Array stack: labels 1..n, 0 = not in the mask. No recursion, no per-cell objects.
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
  const stack = new Int32Array(n);
  const sizes: number[] = [0];
  let count = 0;
  for (let start = 0; start < n; start++) {
    if (!mask[start] || labels[start]) continue;
    count++;
    let size = 0;
    let top = 0;
    stack[top++] = start;
    labels[start] = count;
    while (top > 0) {
      const k = stack[--top];
      size++;
      const i = k % nx;
      if (i > 0 && mask[k - 1] && !labels[k - 1]) (labels[k - 1] = count), (stack[top++] = k - 1);
      if (i < nx - 1 && mask[k + 1] && !labels[k + 1]) (labels[k + 1] = count), (stack[top++] = k + 1);
      if (k >= nx && mask[k - nx] && !labels[k - nx]) (labels[k - nx] = count), (stack[top++] = k - nx);
      if (k < n - nx && mask[k + nx] && !labels[k + nx]) (labels[k + nx] = count), (stack[top++] = k + nx);
    }
    sizes.push(size);
  }
  return { labels, count, sizes: Int32Array.from(sizes) };
}
