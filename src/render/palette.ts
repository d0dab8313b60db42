// Our own restrained palette, taken from the plant the service was built
// around: unglazed paper, kiln-soot ink, fired-clay red for differences and a
// cool slate for weights. Each pair that must be told apart differs in
// lightness as well as hue, and every meaning is also written as text, so a
// grey printout loses nothing.
export const palette = {
  paper: '#fcfbf8',
  ink: '#26231f',
  mutedInk: '#5f5a52',
  rule: '#bdb6aa',
  faintRule: '#e4dfd6',
  /** Δ bars: fired clay (grey ≈ 40% lightness). */
  deltaBar: '#8a4f33',
  /** Weight bars: kiln slate (grey ≈ 35% lightness), drawn in a separate panel. */
  weightBar: '#3f5866',
  /** Band zones, lighter to darker as support falls away. */
  zoneWeaker: '#f0ece5',
  zoneNegligible: '#e2ddd3',
  /** Table header and strip backgrounds in the report. */
  wash: '#f3f0ea',
} as const;

/** One font stack for chart and report: widely installed faces, then the generic family. */
export const fontStack = 'DejaVu Sans, Liberation Sans, Arial, sans-serif';
