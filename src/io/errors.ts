/** An input the user gave cannot be used. The message always names the file and the problem. */
export class InputError extends Error {
  constructor(
    readonly file: string,
    readonly problem: string,
  ) {
    super(`${file}: ${problem}`);
    this.name = 'InputError';
  }
}

/** Largest grid we agree to allocate (cells). 2 × 10⁸ Float32 cells is 800 MB per grid. */
export const MAX_CELLS = 200_000_000;
