/**
 * Morphological dilation of a class mask by the 3 × 3 square (8-neighbours): a cell is set when it
 * or any of its 8 neighbours has a code the table marks (`table[code] !== 0`). Separable: the
 * horizontal 1 × 3 pass, then the vertical 3 × 1 pass over its rows; three plain passes instead of
 * nine writes per marked cell. Cells off the grid count as unmarked.
 */
export function dilate8(codes: Uint8Array, table: Uint8Array, nx: number, ny: number): Uint8Array {
  const n = nx * ny;
  const across = new Uint8Array(n);
  for (let j = 0; j < ny; j++) {
    const row = j * nx;
    let left = 0;
    let here = table[codes[row]] !== 0 ? 1 : 0;
    for (let i = 0; i < nx; i++) {
      const right = i + 1 < nx && table[codes[row + i + 1]] !== 0 ? 1 : 0;
      across[row + i] = left | here | right;
      left = here;
      here = right;
    }
  }
  const out = new Uint8Array(n);
  for (let k = 0; k < n; k++) out[k] = across[k] | (k >= nx ? across[k - nx] : 0) | (k + nx < n ? across[k + nx] : 0);
  return out;
}
