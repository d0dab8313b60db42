// A small, strict way of writing SVG elements: attribute values and text are
// always escaped here, coordinates are always printed with one decimal, so no
// drawing code can forget either.
import { escapeAttribute, escapeText } from './escape.ts';

export type AttributeValue = string | number | null | undefined;

/** A coordinate or length with at most one decimal ("12", "12.5"), never "-0". */
export function px(value: number): string {
  const text = (Math.round(value * 10) / 10).toFixed(1).replace(/\.0$/, '');
  return text === '-0' ? '0' : text;
}

function attributes(attrs: Record<string, AttributeValue>): string {
  let out = '';
  for (const [name, value] of Object.entries(attrs)) {
    if (value === null || value === undefined) continue;
    out += ` ${name}="${typeof value === 'number' ? px(value) : escapeAttribute(value)}"`;
  }
  return out;
}

/** An element with already-built child markup. */
export function element(name: string, attrs: Record<string, AttributeValue>, children: string[] | string = []): string {
  const inner = Array.isArray(children) ? children.join('') : children;
  return inner === '' ? `<${name}${attributes(attrs)}/>` : `<${name}${attributes(attrs)}>${inner}</${name}>`;
}

/** An element whose only content is text, escaped. */
export function textElement(name: string, attrs: Record<string, AttributeValue>, text: string): string {
  return `<${name}${attributes(attrs)}>${escapeText(text)}</${name}>`;
}
