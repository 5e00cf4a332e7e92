import FFT from "fft.js";

/** The part of fft.js this project uses, typed. */
interface RealFft {
  readonly size: number;
  realTransform(out: Float64Array, data: Float64Array): void;
  completeSpectrum(out: Float64Array): void;
}

const FftConstructor = FFT as unknown as new (size: number) => RealFft;

/** Building an instance precomputes its twiddle table (≈0.2 s at 2^20): keep one per size. */
const instances = new Map<number, RealFft>();

export function isPowerOfTwo(size: number): boolean {
  return Number.isInteger(size) && size >= 4 && (size & (size - 1)) === 0;
}

export function largestPowerOfTwoAtMost(value: number): number {
  let size = 4;
  while (size * 2 <= value) size *= 2;
  return size;
}

function instanceFor(size: number): RealFft {
  if (!isPowerOfTwo(size)) throw new RangeError(`FFT size must be a power of two ≥ 4, got ${size}`);
  let fft = instances.get(size);
  if (!fft) {
    fft = new FftConstructor(size);
    instances.set(size, fft);
  }
  return fft;
}

/**
 * Forward DFT of a real signal, X_k = Σ x_n e^{−j2πkn/N} (numpy's sign convention), for
 * k = 0..N/2, interleaved [re0, im0, re1, im1, …]. `out` (length 2N) is scratch the caller may reuse.
 */
export function realSpectrum(samples: Float64Array, out?: Float64Array): Float64Array {
  const size = samples.length;
  const fft = instanceFor(size);
  const buffer = out && out.length >= 2 * size ? out : new Float64Array(2 * size);
  fft.realTransform(buffer, samples);
  return buffer.subarray(0, size + 2);
}
