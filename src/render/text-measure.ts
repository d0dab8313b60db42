// The server draws text without a font engine, so widths are estimated from
// the number of characters. 0.6 em per character is a little wider than the
// average glyph of common sans-serif faces (common practice for server-side
// charts), so an estimate errs towards truncating early rather than overlapping.
const emPerCharacter = 0.6;

/** Code points, so a truncation never splits a surrogate pair. */
function codePoints(text: string): string[] {
  return Array.from(text);
}

export function estimateTextWidth(text: string, fontSize: number): number {
  return codePoints(text).length * emPerCharacter * fontSize;
}

/** Shortens text to fit a width, marking the cut with an ellipsis. */
export function truncateToWidth(text: string, width: number, fontSize: number): string {
  const points = codePoints(text);
  const fits = Math.max(1, Math.floor(width / (emPerCharacter * fontSize)));
  if (points.length <= fits) return text;
  return `${points.slice(0, Math.max(1, fits - 1)).join('')}…`;
}

/** Breaks text into lines at spaces so each line fits the width (a long word keeps its own line). */
export function wrapToWidth(text: string, width: number, fontSize: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    const candidate = line === '' ? word : `${line} ${word}`;
    if (line !== '' && estimateTextWidth(candidate, fontSize) > width) {
      lines.push(line);
      line = word;
    } else {
      line = candidate;
    }
  }
  if (line !== '') lines.push(line);
  return lines;
}
