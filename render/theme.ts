// tapsheet's one visual theme: colours, type and sizes for figures and report.

/** Colours, named by role. */
export const palette = {
  ink: "#1d2733",
  muted: "#5b6878",
  rule: "#d5dbe2",
  paper: "#ffffff",
  wash: "#f4f6f8",
  /** Series colours in order: deep teal, copper, indigo, olive, plum, slate. */
  series: ["#0b6e78", "#c0622b", "#3f4aa8", "#6b7d1e", "#8e3b73", "#5c6b7a"],
  /** The forbidden region of a requirement mask. */
  mask: "#c23b3b",
  pass: "#1e7a46",
  fail: "#b3261e",
  incomplete: "#8a5a00",
} as const;

/** Typeface stack used in figures and the report. */
export const fontStack = "'DejaVu Sans', 'Liberation Sans', Arial, Helvetica, sans-serif";

/**
 * Figure size in CSS pixels (fits an A4/Letter text column at print size):
 * the outer size of the SVG, title, axes and legend included. `withDifference`
 * is the height of a figure with a difference panel under its plot, so that
 * its main plot keeps about the height of the others.
 */
export const figureSize = { width: 640, height: 300, square: 340, withDifference: 400 } as const;

/** Height of a difference panel and of the gap above it, in CSS pixels. */
export const differencePanel = { height: 72, gap: 14 } as const;

/** Font sizes in figures, in CSS pixels. */
export const figureType = {
  title: 13,
  /** Space between the lines of a wrapped figure title. */
  titleLine: 17,
  axisTitle: 12,
  /** Space between the lines of a wrapped axis title. */
  axisTitleLine: 14,
  label: 11,
  /** Mask labels and worst-case labels inside the plot. */
  note: 10,
} as const;
