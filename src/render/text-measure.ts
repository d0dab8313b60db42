// The server draws text without a font engine, so widths are estimated per
// character from the advance widths of DejaVu Sans, the first face of the font
// stack (palette.ts) and the widest of it, grouped into a few classes and
// rounded up (values from memory of the font's metrics, not a measured table;
// test/browser/report.test.ts measures the drawn names in Chromium against
// the room they were given). Narrower faces only make the text shorter, so
// the estimate errs towards shortening early rather than overlapping.

/** Advance width in em of each class of character. */
function emWidth(c: string): number {
  if (/[iljI!'|.,:;()[\]{} \u00a0·]/.test(c)) return 0.4;
  if (/[ftr"]/.test(c)) return 0.45;
  if (/[mwMW@%…]/.test(c)) return 1.0;
  if (/[+<>=~×±÷^*]/.test(c)) return 0.85;
  if (/[A-Z&#$]/.test(c)) return 0.78;
  if (/[0-9]/.test(c)) return 0.64;
  if (/[a-z_?/\\-]/.test(c)) return 0.62;
  // Anything else (accented, Greek, CJK, symbols): as wide as a capital, or wider for wide scripts.
  return /[\u1100-\u115f\u2e80-\ua4cf\uac00-\ud7a3\uf900-\ufaff\ufe30-\ufe4f\uff00-\uff60\uffe0-\uffe6]/u.test(c) ? 1.0 : 0.8;
}

/** Code points, so a cut never splits a surrogate pair. */
function codePoints(text: string): string[] {
  return Array.from(text);
}

export function estimateTextWidth(text: string, fontSize: number): number {
  let em = 0;
  for (const c of codePoints(text)) em += emWidth(c);
  return em * fontSize;
}

/** How many of the leading characters fit the width (at least one). */
function charactersFitting(points: readonly string[], width: number, fontSize: number): number {
  let used = 0;
  for (let i = 0; i < points.length; i++) {
    used += emWidth(points[i]) * fontSize;
    if (used > width) return Math.max(1, i);
  }
  return points.length;
}

/** Shortens text to fit a width, marking the cut with an ellipsis. */
export function truncateToWidth(text: string, width: number, fontSize: number): string {
  if (estimateTextWidth(text, fontSize) <= width) return text;
  const points = codePoints(text);
  const fits = charactersFitting(points, width - emWidth('…') * fontSize, fontSize);
  return `${points.slice(0, fits).join('')}…`;
}

/** A word longer than a line, cut into pieces that each fit. */
function hardBreak(word: string, width: number, fontSize: number): string[] {
  const pieces: string[] = [];
  let rest = codePoints(word);
  while (rest.length > 0) {
    const fits = charactersFitting(rest, width, fontSize);
    pieces.push(rest.slice(0, fits).join(''));
    rest = rest.slice(fits);
  }
  return pieces;
}

/**
 * Breaks text into lines at spaces so each line fits the width; a word longer
 * than a whole line is cut where it must, so no line runs past the edge.
 */
export function wrapToWidth(text: string, width: number, fontSize: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    const pieces = estimateTextWidth(word, fontSize) > width ? hardBreak(word, width, fontSize) : [word];
    for (const piece of pieces) {
      const candidate = line === '' ? piece : `${line} ${piece}`;
      if (line !== '' && estimateTextWidth(candidate, fontSize) > width) {
        lines.push(line);
        line = piece;
      } else {
        line = candidate;
      }
    }
  }
  if (line !== '') lines.push(line);
  return lines;
}
