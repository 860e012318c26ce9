// Shared entry checks for lib/. Each throws RangeError for a number out of
// range and TypeError for a wrong shape, with a message that states the rule
// and the value found.

/** Format a number for an error message without noise digits. */
export function show(value: number): string {
  return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
}

/** Throw a TypeError unless `value` is a finite number. */
export function requireFinite(name: string, value: number): void {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new TypeError(`${name} must be a finite number, got ${String(value)}`);
  }
}

/** Throw unless `value` is an integer in [min, max]. */
export function requireInteger(name: string, value: number, min: number, max = Infinity): void {
  requireFinite(name, value);
  if (!Number.isInteger(value)) {
    throw new RangeError(`${name} must be an integer, got ${show(value)}`);
  }
  if (value < min || value > max) {
    const rule = max === Infinity ? `at least ${min}` : `between ${min} and ${max}`;
    throw new RangeError(`${name} must be ${rule}, got ${show(value)}`);
  }
}

/** Throw unless `value` is finite and strictly positive. */
export function requirePositive(name: string, value: number, unit = ""): void {
  requireFinite(name, value);
  if (value <= 0) {
    throw new RangeError(`${name} must be greater than 0${unit}, got ${show(value)}${unit}`);
  }
}

/** Throw unless `value` lies in [min, max] (closed range). */
export function requireInRange(
  name: string,
  value: number,
  min: number,
  max: number,
  unit = "",
): void {
  requireFinite(name, value);
  if (value < min || value > max) {
    throw new RangeError(
      `${name} must be between ${show(min)}${unit} and ${show(max)}${unit}, got ${
        show(value)
      }${unit}`,
    );
  }
}

/** Throw unless `fs` is a valid sample rate in Hz. */
export function requireSampleRate(fs: number): void {
  requirePositive("Sample rate fs", fs, " Hz");
}

/** Throw unless 0 < f < fs/2 (a band edge strictly inside the Nyquist interval). */
export function requireBandEdge(name: string, f: number, fs: number): void {
  requireFinite(name, f);
  if (f <= 0) throw new RangeError(`${name} must be above 0 Hz, got ${show(f)} Hz`);
  if (f >= fs / 2) {
    throw new RangeError(`${name} must be below fs/2 = ${show(fs / 2)} Hz, got ${show(f)} Hz`);
  }
}

/** Throw unless 0 <= f <= fs/2. */
export function requireFrequency(name: string, f: number, fs: number): void {
  requireFinite(name, f);
  if (f < 0 || f > fs / 2) {
    throw new RangeError(
      `${name} must be between 0 Hz and fs/2 = ${show(fs / 2)} Hz, got ${show(f)} Hz`,
    );
  }
}

/**
 * True when every value is finite: x·0 is ±0 for finite x and NaN for ±∞ and
 * NaN, so running sums of x·0 stay 0 exactly when all values are finite. No
 * branch per value, and a loop of its own that only ever sees Float64Arrays:
 * 0.3 ms per 10^6 samples, against 0.7 ms for a generic loop that has only
 * seen Float64Arrays and 8 ms for one that has seen several kinds of array.
 */
function allFinite(values: Float64Array): boolean {
  let a = 0, b = 0, c = 0, d = 0;
  const n = values.length;
  let i = 0;
  for (; i + 3 < n; i += 4) {
    a += values[i]! * 0;
    b += values[i + 1]! * 0;
    c += values[i + 2]! * 0;
    d += values[i + 3]! * 0;
  }
  for (; i < n; i++) a += values[i]! * 0;
  return a + b + c + d === 0;
}

/** Throw a TypeError unless `values` is a non-empty array of finite numbers. */
export function requireSamples(name: string, values: ArrayLike<number>, minLength = 1): void {
  if (values === null || typeof values !== "object" || typeof values.length !== "number") {
    throw new TypeError(`${name} must be an array of numbers, got ${typeof values}`);
  }
  if (values.length < minLength) {
    throw new RangeError(`${name} must hold at least ${minLength} values, got ${values.length}`);
  }
  if (values instanceof Float64Array && allFinite(values)) return;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== "number" || !Number.isFinite(v)) {
      throw new TypeError(`${name}[${i}] must be a finite number, got ${String(v)}`);
    }
  }
}
