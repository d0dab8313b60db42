// The server draws text without a font engine, so widths are estimated from
// the number of characters. 0.6 em per character is a little wider than the
// average glyph of common sans-serif faces (common practice for server-side
// charts), so an estimate errs towards shortening early rather than
// overlapping; test/browser/report.test.ts measures the drawn text in
// Chromium against the room it was given.
const emPerCharacter = 0.6;

/** Code points, so a cut never splits a surrogate pair. */
function codePoints(text: string): string[] {
  return Array.from(text);
}

export function estimateTextWidth(text: string, fontSize: number): number {
  return codePoints(text).length * emPerCharacter * fontSize;
}

/** How many characters fit the width (at least one). */
function charactersFitting(width: number, fontSize: number): number {
  return Math.max(1, Math.floor(width / (emPerCharacter * fontSize)));
}

/** Shortens text to fit a width, marking the cut with an ellipsis. */
export function truncateToWidth(text: string, width: number, fontSize: number): string {
  const points = codePoints(text);
  const fits = charactersFitting(width, fontSize);
  if (points.length <= fits) return text;
  return `${points.slice(0, Math.max(1, fits - 1)).join('')}…`;
}

/** A word longer than a line, cut into pieces that each fit. */
function hardBreak(word: string, width: number, fontSize: number): string[] {
  const points = codePoints(word);
  const fits = charactersFitting(width, fontSize);
  const pieces: string[] = [];
  for (let i = 0; i < points.length; i += fits) pieces.push(points.slice(i, i + fits).join(''));
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
