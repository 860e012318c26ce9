// Loads test/reference/verify.json (made by test/reference/make_verify.py with Debian SciPy 1.10.1).
import type { FilterDesign, Section } from "../../../lib/mod.ts";

export interface BandSummary {
  from: number;
  to: number;
  maxDb: number;
  maxAt: number;
  minDb: number;
  minAt: number;
}

export interface VerifyCase {
  name: string;
  source: string;
  design: FilterDesign;
  passband: BandSummary;
  stopband: BandSummary;
  groupDelay?: { from: number; to: number; max: number; min: number };
  poleRadius?: number;
  settlingSamples2pct?: number;
  impulseL1?: number;
  impulseL2?: number;
  sha256?: string;
}

export interface VerifyFixture {
  scipy: string;
  fs: number;
  cases: VerifyCase[];
  resonator: { denominator: number[]; l1: number; l2: number; linf: number };
}

export const fixture: VerifyFixture = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/verify.json", import.meta.url)),
);

export function referenceCase(name: string): VerifyCase {
  const c = fixture.cases.find((x) => x.name === name);
  if (c === undefined) throw new Error(`no fixture case ${name}`);
  return c;
}

export function sectionsOf(c: VerifyCase): Section[] {
  if (c.design.kind !== "sections") throw new Error(`${c.name} is not sections`);
  return [...c.design.sections];
}
