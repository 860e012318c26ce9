// The section-cascade inner loops (private), shared by filtering and zero-phase filtering.
//
// Sections are run sample-major in groups of four (then two, then one): the
// four recursions of a group are independent dependency chains for the CPU,
// so they overlap instead of each waiting on its own multiply–add latency.
// Returns x − x summed over the input (NaN exactly when an input sample was
// not finite), so callers can validate typed-array input without a separate pass.
import type { Section } from "../types.ts";

export function runSections(
  sections: readonly Section[],
  y: Float64Array,
  memory: Float64Array,
): number {
  const k = sections.length;
  let check = 0;
  let j = 0;
  let first = true;
  while (j < k) {
    const left = k - j;
    let c: number;
    if (left >= 4) {
      c = run4(sections, j, y, memory, first);
      j += 4;
    } else if (left >= 2) {
      c = run2(sections, j, y, memory, first);
      j += 2;
    } else {
      c = run1(sections[j]!, j, y, memory, first);
      j += 1;
    }
    if (first) check = c;
    first = false;
  }
  return check;
}

function run1(s: Section, j: number, y: Float64Array, m: Float64Array, first: boolean): number {
  const { b0, b1, b2, a1, a2 } = s;
  let s1 = m[2 * j]!;
  let s2 = m[2 * j + 1]!;
  let check = 0;
  const n = y.length;
  for (let i = 0; i < n; i++) {
    const x = y[i]!;
    if (first) check += x - x;
    const out = b0 * x + s1;
    s1 = b1 * x - a1 * out + s2;
    s2 = b2 * x - a2 * out;
    y[i] = out;
  }
  m[2 * j] = s1;
  m[2 * j + 1] = s2;
  return check;
}

function run2(
  sections: readonly Section[],
  j: number,
  y: Float64Array,
  m: Float64Array,
  first: boolean,
): number {
  const p = sections[j]!;
  const q = sections[j + 1]!;
  const [pb0, pb1, pb2, pa1, pa2] = [p.b0, p.b1, p.b2, p.a1, p.a2];
  const [qb0, qb1, qb2, qa1, qa2] = [q.b0, q.b1, q.b2, q.a1, q.a2];
  let p1 = m[2 * j]!;
  let p2 = m[2 * j + 1]!;
  let q1 = m[2 * j + 2]!;
  let q2 = m[2 * j + 3]!;
  let check = 0;
  const n = y.length;
  for (let i = 0; i < n; i++) {
    const x = y[i]!;
    if (first) check += x - x;
    const u = pb0 * x + p1;
    p1 = pb1 * x - pa1 * u + p2;
    p2 = pb2 * x - pa2 * u;
    const v = qb0 * u + q1;
    q1 = qb1 * u - qa1 * v + q2;
    q2 = qb2 * u - qa2 * v;
    y[i] = v;
  }
  m[2 * j] = p1;
  m[2 * j + 1] = p2;
  m[2 * j + 2] = q1;
  m[2 * j + 3] = q2;
  return check;
}

function run4(
  sections: readonly Section[],
  j: number,
  y: Float64Array,
  m: Float64Array,
  first: boolean,
): number {
  const a = sections[j]!;
  const b = sections[j + 1]!;
  const c = sections[j + 2]!;
  const d = sections[j + 3]!;
  const [ab0, ab1, ab2, aa1, aa2] = [a.b0, a.b1, a.b2, a.a1, a.a2];
  const [bb0, bb1, bb2, ba1, ba2] = [b.b0, b.b1, b.b2, b.a1, b.a2];
  const [cb0, cb1, cb2, ca1, ca2] = [c.b0, c.b1, c.b2, c.a1, c.a2];
  const [db0, db1, db2, da1, da2] = [d.b0, d.b1, d.b2, d.a1, d.a2];
  let a1 = m[2 * j]!;
  let a2 = m[2 * j + 1]!;
  let b1 = m[2 * j + 2]!;
  let b2 = m[2 * j + 3]!;
  let c1 = m[2 * j + 4]!;
  let c2 = m[2 * j + 5]!;
  let d1 = m[2 * j + 6]!;
  let d2 = m[2 * j + 7]!;
  let check = 0;
  const n = y.length;
  for (let i = 0; i < n; i++) {
    const x = y[i]!;
    if (first) check += x - x;
    const u = ab0 * x + a1;
    a1 = ab1 * x - aa1 * u + a2;
    a2 = ab2 * x - aa2 * u;
    const v = bb0 * u + b1;
    b1 = bb1 * u - ba1 * v + b2;
    b2 = bb2 * u - ba2 * v;
    const w = cb0 * v + c1;
    c1 = cb1 * v - ca1 * w + c2;
    c2 = cb2 * v - ca2 * w;
    const z = db0 * w + d1;
    d1 = db1 * w - da1 * z + d2;
    d2 = db2 * w - da2 * z;
    y[i] = z;
  }
  m[2 * j] = a1;
  m[2 * j + 1] = a2;
  m[2 * j + 2] = b1;
  m[2 * j + 3] = b2;
  m[2 * j + 4] = c1;
  m[2 * j + 5] = c2;
  m[2 * j + 6] = d1;
  m[2 * j + 7] = d2;
  return check;
}
