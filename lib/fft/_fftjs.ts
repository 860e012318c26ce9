// Typed face of the fft.js package (it ships no type declarations).
// @ts-types="./_fftjs.d.ts"
import FFTModule from "fft.js";

/** The part of fft.js that lib/ uses; `size` must be a power of two >= 2. */
export interface FftKernel {
  readonly size: number;
  createComplexArray(): number[];
  realTransform(
    output: ArrayLike<number> & { [i: number]: number },
    input: ArrayLike<number>,
  ): void;
  completeSpectrum(spectrum: ArrayLike<number> & { [i: number]: number }): void;
  transform(output: ArrayLike<number> & { [i: number]: number }, input: ArrayLike<number>): void;
  inverseTransform(
    output: ArrayLike<number> & { [i: number]: number },
    input: ArrayLike<number>,
  ): void;
}

const FFT = FFTModule as unknown as new (size: number) => FftKernel;
const kernels = new Map<number, FftKernel>();

/** A cached fft.js kernel of the given power-of-two size. */
export function kernel(size: number): FftKernel {
  let k = kernels.get(size);
  if (k === undefined) {
    k = new FFT(size);
    kernels.set(size, k);
  }
  return k;
}
