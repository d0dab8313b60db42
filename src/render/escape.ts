// Every string a caller supplied (model names, labels, terms, cautions) goes
// through here before it reaches SVG or HTML. One routine serves both: the
// five characters that matter in XML text and attribute values are the same
// ones that matter in HTML, and numeric references for the quotes are valid in
// both (HTML has no &apos; in older parsers).

/**
 * Characters that may not appear in an XML 1.0 document at all
 * (W3C XML 1.0, fifth edition, production [2] Char), plus the C1 controls
 * and DEL, which XML only discourages but HTML treats as parse errors.
 * Lone surrogates are matched separately below. Each is replaced by U+FFFD so
 * the reader still sees that something was there.
 */
const forbiddenControls = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\uFFFE\uFFFF]/g;
const loneSurrogates = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

/** Replaces characters that cannot be carried by XML 1.0 or clean HTML with U+FFFD. */
export function toCarriableText(value: string): string {
  return value.replace(forbiddenControls, '\uFFFD').replace(loneSurrogates, '\uFFFD');
}

const references: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/** Escapes for element content: safe in SVG/XML and HTML text. */
export function escapeText(value: unknown): string {
  return toCarriableText(String(value ?? '')).replace(/[&<>"']/g, (c) => references[c]);
}

/**
 * Escapes for a double-quoted attribute value. Tab, line feed and carriage
 * return are written as references because an XML parser would otherwise
 * normalise them to spaces and the attribute would no longer equal the name.
 */
export function escapeAttribute(value: unknown): string {
  return escapeText(value).replace(/[\t\n\r]/g, (c) => `&#${c.charCodeAt(0)};`);
}
