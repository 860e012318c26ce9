// Private: the WebAssembly FFT kernel (_kernel.wat, built into
// _kernel_wasm.ts) and the copying in and out of its memory.
//
// The kernel computes exactly what the TypeScript kernel (_radix4.ts) and the
// real-input steps of _engine.ts compute, operation for operation, two lanes
// at a time with 128-bit SIMD; test/lib/fft/kernel_test.ts checks that both
// give the same bits. It is used for transforms of 16 complex points (32 real
// points) and more; smaller transforms, and any runtime without WebAssembly
// SIMD, use the TypeScript kernel. Measured (bench/analysis_bench.ts, groups
// "FFT kernel", Deno 2.9.6 on a shared 2-core x86-64 machine): its stages alone
// take 0.45 of the TypeScript stages' time at 2^15 complex points; realFft of
// 2^16 points 0.75–0.8 of the time, inverseRealFft 0.5–0.6 and FFT overlap-add
// (255 taps) 0.6; below 512 points the two are within the noise (±20 %).
//
// Memory: one instance per process (per worker), its memory laid out as the
// tables of the transform sizes used so far (twiddles and bit reversal, written
// once per size) followed by the work arrays of the call in progress. The
// memory grows as needed and is never returned; overlap-add works through
// long signals in chunks, so what it needs depends on the FFT length only.
import { type FftPlan, fftPlan } from "./_radix4.ts";
import { kernelBase64 } from "./_kernel_wasm.ts";

/** A first pass: from split input at srcRe/srcIm into re/im, with the plan's bit reversal. */
type FirstPass = (
  srcRe: number,
  srcIm: number,
  re: number,
  im: number,
  rev: number,
  groups: number,
) => void;

/** The kernel's exports (see _kernel.wat for what each does). */
interface Exports {
  memory: WebAssembly.Memory;
  firstPass8: FirstPass;
  firstPass4: FirstPass;
  stages(re: number, im: number, size: number, quarter: number, tw: number, below: number): number;
  lastStageTimes(
    re: number,
    im: number,
    quarter: number,
    tw: number,
    hRe: number,
    hIm: number,
  ): void;
  realSplit(re: number, im: number, m: number, tw: number): void;
  realJoin(re: number, im: number, m: number, tw: number): void;
  deinterleave(src: number, re: number, im: number, m: number): void;
  interleaveScaled(re: number, im: number, m: number, scale: number, out: number): void;
  addInto(dst: number, src: number, count: number): void;
}

/** Smallest complex transform the kernel takes (its loops need quarter spans ≥ 2). */
export const kernelMinimumSize = 16;

/** Addresses of one complex size's tables in the kernel's memory. */
interface Tables {
  plan: FftPlan;
  /** Bit reversal, one i32 per group. */
  rev: number;
  /** Radix-4 twiddles, per stage and per pair of k (see _kernel.wat). */
  tw: number;
}

/** Twiddles of the real-input steps for N real points, per pair of k. */
interface RealTables {
  tw: number;
}

/** Tables take at most this many bytes; past it they are dropped and written again as used. */
const tableLimit = 16 << 20;

class Kernel {
  readonly #ex: Exports;
  /** End of the tables: the work arrays of a call start here. */
  #tableTop = 0;
  readonly #tables = new Map<number, Tables>();
  readonly #realTables = new Map<number, RealTables>();
  /** Start of the next work array while a call lays out its arrays. */
  #top = 0;

  constructor(ex: Exports) {
    this.#ex = ex;
  }

  /** Views of the memory, taken after any growth (growth detaches the old ones). */
  #f64(): Float64Array {
    return new Float64Array(this.#ex.memory.buffer);
  }

  /** Make the memory at least `bytes` long. */
  #reserve(bytes: number): void {
    const have = this.#ex.memory.buffer.byteLength;
    if (bytes > have) this.#ex.memory.grow(Math.ceil((bytes - have) / 65536));
  }

  /** Room for a table of `bytes`, 16-byte aligned, after the others. */
  #tableSpace(bytes: number): number {
    if (this.#tableTop + bytes > tableLimit) {
      this.#tables.clear();
      this.#realTables.clear();
      this.#tableTop = 0;
    }
    const at = this.#tableTop;
    this.#tableTop = at + Math.ceil(bytes / 16) * 16;
    this.#reserve(this.#tableTop);
    return at;
  }

  /** The tables of the M-point complex transform, written on first use. */
  tables(size: number): Tables {
    const cached = this.#tables.get(size);
    if (cached !== undefined) return cached;
    const plan = fftPlan(size);
    const rev = this.#tableSpace(4 * plan.reversal.length);
    new Int32Array(this.#ex.memory.buffer, rev, plan.reversal.length).set(plan.reversal);
    const src = plan.twiddles;
    const tw = this.#tableSpace(8 * src.length);
    const out = new Float64Array(this.#ex.memory.buffer, tw, src.length);
    // From six values per k (w1r w1i w2r w2i w3r w3i) to twelve per pair of k.
    for (let o = 0, t = 0; t < src.length; t += 12) {
      for (let c = 0; c < 6; c++) {
        out[o++] = src[t + c]!;
        out[o++] = src[t + 6 + c]!;
      }
    }
    const tables = { plan, rev, tw };
    this.#tables.set(size, tables);
    return tables;
  }

  /** The real-input twiddles for N = 2M real points, written on first use. */
  realTables(n: number): RealTables {
    const cached = this.#realTables.get(n);
    if (cached !== undefined) return cached;
    const h = n / 4;
    const tw = this.#tableSpace(8 * 2 * h);
    const out = new Float64Array(this.#ex.memory.buffer, tw, 2 * h);
    // Pairs (k, k + 1) for k = 1, 3, …, h − 1, the same values as realPlan in _engine.ts.
    for (let k = 1, o = 0; k < h; k += 2, o += 4) {
      out[o] = Math.cos((2 * Math.PI * k) / n);
      out[o + 1] = Math.cos((2 * Math.PI * (k + 1)) / n);
      out[o + 2] = Math.sin((2 * Math.PI * k) / n);
      out[o + 3] = Math.sin((2 * Math.PI * (k + 1)) / n);
    }
    const tables = { tw };
    this.#realTables.set(n, tables);
    return tables;
  }

  /** Start laying out a call's work arrays; the tables must all be in place. */
  #beginWork(): void {
    this.#top = this.#tableTop;
  }

  /**
   * A work array of `values` f64. Each starts 512 bytes further on, modulo
   * 4 KiB, than the one before (see newSplits in _engine.ts: arrays read
   * together must not agree in their low 12 address bits).
   */
  #work(values: number): number {
    const at = this.#top;
    const end = at + 8 * values;
    this.#top = Math.ceil(end / 4096) * 4096 + ((at % 4096) + 512) % 4096;
    return at;
  }

  /** First pass and radix-4 stages up to quarter spans below `below`; returns the twiddle address reached. */
  #transform(
    t: Tables,
    srcRe: number,
    srcIm: number,
    re: number,
    im: number,
    below: number,
  ): number {
    const ex = this.#ex;
    const { size, firstLevels, reversal } = t.plan;
    if (firstLevels === 3) ex.firstPass8(srcRe, srcIm, re, im, t.rev, reversal.length);
    else ex.firstPass4(srcRe, srcIm, re, im, t.rev, reversal.length);
    return ex.stages(re, im, size, 1 << firstLevels, t.tw, below);
  }

  /** transformSplit of _radix4.ts: the forward DFT of inRe/inIm into re/im. */
  forwardSplit(
    inRe: Float64Array,
    inIm: Float64Array,
    re: Float64Array,
    im: Float64Array,
  ): void {
    const n = inRe.length;
    const t = this.tables(n);
    this.#beginWork();
    const a = this.#work(n), b = this.#work(n), c = this.#work(n), d = this.#work(n);
    this.#reserve(this.#top);
    const f = this.#f64();
    f.set(inRe, a / 8);
    f.set(inIm, b / 8);
    this.#transform(t, a, b, c, d, n);
    re.set(f.subarray(c / 8, c / 8 + n));
    im.set(f.subarray(d / 8, d / 8 + n));
  }

  /**
   * realHalf of _engine.ts for N = 2M ≥ 2·{@link kernelMinimumSize} real
   * points (a power of two): the M + 1 bins in new arrays that share one
   * buffer. One copy out of the memory (slice) allocates without first
   * zeroing, which made the call about 15 % faster than copying into zeroed
   * arrays at N = 2^16.
   */
  realForward(input: Float64Array, n: number): { re: Float64Array; im: Float64Array } {
    const m = n / 2;
    const t = this.tables(m);
    const r = this.realTables(n);
    this.#beginWork();
    const src = this.#work(n), zr = this.#work(m), zi = this.#work(m);
    const a = this.#work(m + 1), b = this.#work(m + 1);
    this.#reserve(this.#top);
    const f = this.#f64();
    f.set(input, src / 8);
    this.#ex.deinterleave(src, zr, zi, m);
    this.#transform(t, zr, zi, a, b, m);
    this.#ex.realSplit(a, b, m, r.tw);
    const both = f.slice(a / 8, b / 8 + m + 1);
    return { re: both.subarray(0, m + 1), im: both.subarray((b - a) / 8) };
  }

  /** inverseRealHalf of _engine.ts for N = 2M ≥ 32 real points (a power of two). */
  realInverse(re: Float64Array, im: Float64Array, n: number): Float64Array {
    const m = n / 2;
    const t = this.tables(m);
    const r = this.realTables(n);
    this.#beginWork();
    const a = this.#work(m + 1), b = this.#work(m + 1);
    const c = this.#work(m), d = this.#work(m), out = this.#work(n);
    this.#reserve(this.#top);
    const f = this.#f64();
    f.set(re, a / 8);
    f.set(im, b / 8);
    const ex = this.#ex;
    ex.realJoin(a, b, m, r.tw);
    // Inverse by exchanging real and imaginary parts on the way in and out:
    // z = (c) + j·(d) after a transform that reads Z as (b) + j·(a).
    this.#transform(t, b, a, d, c, m);
    ex.interleaveScaled(c, d, m, 1 / m, out);
    return f.slice(out / 8, out / 8 + n);
  }

  /**
   * The block loop of applyFirOverlapAdd (lib/fir/overlap_add.ts) with FFT
   * length M, the same arithmetic: y[n] = Σ h[k]·x[n−k] for n < x.length.
   */
  overlapAdd(taps: ArrayLike<number>, x: Float64Array, m: number): Float64Array {
    const n = taps.length;
    const length = x.length;
    const block = m - n + 1;
    const t = this.tables(m);
    // Output chunks of whole block pairs, about 32 Ki values.
    const pairs = Math.max(1, Math.floor(32768 / (2 * block)));
    const chunk = 2 * block * pairs;
    this.#beginWork();
    const hRe = this.#work(m), hIm = this.#work(m);
    const inRe = this.#work(m), inIm = this.#work(m);
    const pRe = this.#work(m), pIm = this.#work(m);
    const rRe = this.#work(m), rIm = this.#work(m);
    const out = this.#work(chunk + m);
    this.#reserve(this.#top);
    const ex = this.#ex;
    const f = this.#f64();
    // Filter spectrum, scaled by 1/M so the inverse needs no extra pass.
    f.fill(0, inRe / 8, inRe / 8 + m);
    f.fill(0, inIm / 8, inIm / 8 + m);
    for (let k = 0; k < n; k++) f[inRe / 8 + k] = taps[k]! / m;
    this.#transform(t, inRe, inIm, hRe, hIm, m);
    // The taps were in inRe; those at `block` and beyond (more taps than M/2)
    // are not overwritten by the blocks below.
    f.fill(0, inRe / 8 + block, inRe / 8 + m);
    f.fill(0, out / 8, out / 8 + chunk + m);
    const y = new Float64Array(length);
    for (let base = 0; base < length; base += chunk) {
      const count = Math.min(chunk, length - base);
      for (let s = 0; s < count; s += 2 * block) {
        const start = base + s, second = start + block;
        const count0 = Math.min(block, length - start);
        const count1 = Math.max(0, Math.min(block, length - second));
        // Block 0 as real parts, block 1 as imaginary parts; values from `block` on stay 0.
        f.set(x.subarray(start, start + count0), inRe / 8);
        if (count0 < block) f.fill(0, inRe / 8 + count0, inRe / 8 + block);
        f.set(x.subarray(second, second + count1), inIm / 8);
        if (count1 < block) f.fill(0, inIm / 8 + count1, inIm / 8 + block);
        const w = this.#transform(t, inRe, inIm, pRe, pIm, m / 4);
        ex.lastStageTimes(pRe, pIm, m / 4, w, hRe, hIm);
        this.#transform(t, pIm, pRe, rIm, rRe, m);
        ex.addInto(out + 8 * s, rRe, Math.min(m, count0 + n - 1));
        if (count1 > 0) ex.addInto(out + 8 * (s + block), rIm, Math.min(m, count1 + n - 1));
      }
      y.set(f.subarray(out / 8, out / 8 + count), base);
      // The tails past the chunk carry over to the next one.
      f.copyWithin(out / 8, out / 8 + chunk, out / 8 + chunk + m);
      f.fill(0, out / 8 + m, out / 8 + chunk + m);
    }
    return y;
  }
}

let instance: Kernel | null | undefined;
let enabled = true;

function decode(base64: string): Uint8Array<ArrayBuffer> {
  const text = atob(base64);
  const bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
  return bytes;
}

/**
 * The kernel, compiled on first use; undefined where WebAssembly with SIMD is
 * not available (or after {@link setKernelEnabled}(false)).
 */
export function wasmKernel(): Kernel | undefined {
  if (!enabled) return undefined;
  if (instance === undefined) {
    instance = null;
    try {
      const bytes = decode(kernelBase64);
      if (typeof WebAssembly === "object" && WebAssembly.validate(bytes)) {
        const module = new WebAssembly.Module(bytes);
        instance = new Kernel(new WebAssembly.Instance(module).exports as unknown as Exports);
      }
    } catch {
      instance = null;
    }
  }
  return instance ?? undefined;
}

/**
 * Turn the kernel off (false) or back on (true) for this process; for tests
 * and benchmarks that compare it with the TypeScript kernel.
 */
export function setKernelEnabled(on: boolean): void {
  enabled = on;
}

export type { Kernel };
