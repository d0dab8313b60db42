// Small builders for the report's HTML. Caller-supplied strings pass through
// escapeText / escapeAttribute here and nowhere else; `raw` marks the one
// place where markup we produced ourselves (the chart) is inserted as is.
import { escapeAttribute, escapeText } from './escape.ts';

export type Html = { readonly html: string };

export const raw = (html: string): Html => ({ html });
export const text = (value: unknown): Html => ({ html: escapeText(value) });

type Child = Html | string | null | undefined | false;

function childMarkup(children: Child[]): string {
  return children.map((c) => (c === null || c === undefined || c === false ? '' : typeof c === 'string' ? escapeText(c) : c.html)).join('');
}

/** An element; string children are escaped, Html children are trusted. */
export function tag(name: string, attrs: Record<string, string | number | null | undefined>, ...children: Child[]): Html {
  let open = name;
  for (const [key, value] of Object.entries(attrs)) {
    if (value === null || value === undefined) continue;
    open += ` ${key}="${escapeAttribute(value)}"`;
  }
  return { html: `<${open}>${childMarkup(children)}</${name}>` };
}

export function fragment(...children: Child[]): Html {
  return { html: childMarkup(children) };
}
