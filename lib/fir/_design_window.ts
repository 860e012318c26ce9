// Build the symmetric window a design asks for (private to lib/fir).
import { blackmanWindow, hammingWindow, hannWindow, rectangularWindow } from "../window/windows.ts";
import { kaiserWindow } from "../window/kaiser.ts";
import type { DesignWindow } from "./types.ts";

const byName = {
  rectangular: rectangularWindow,
  hann: hannWindow,
  hamming: hammingWindow,
  blackman: blackmanWindow,
} as const;

/** The symmetric window of `length` samples for a design window spec. */
export function designWindow(length: number, window: DesignWindow): Float64Array {
  if (typeof window === "object" && window !== null && window.name === "kaiser") {
    return kaiserWindow(length, window.beta);
  }
  const make = typeof window === "string" ? byName[window as keyof typeof byName] : undefined;
  if (make === undefined) {
    throw new TypeError(
      `Window must be one of ${Object.keys(byName).join(", ")} or { name: "kaiser", beta }, got ${
        JSON.stringify(window)
      }`,
    );
  }
  return make(length);
}
