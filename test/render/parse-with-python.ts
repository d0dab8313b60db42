// Outside parsers for the renderers' output: Python's standard library
// (xml.dom.minidom, a strict XML 1.0 parser built on expat; html.parser, the
// HTML tokenizer of the standard library). Run through child_process so the
// test checks our text against a parser we did not write. python3 3.11.
import { execFileSync } from 'node:child_process';

function runPython(script: string, input: string): unknown {
  const out = execFileSync('python3', ['-c', script], { input, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  return JSON.parse(out);
}

export interface SvgSummary {
  wellFormed: boolean;
  error?: string;
  root?: string;
  rootAttributes?: Record<string, string>;
  /** Text of the root's own <title> and <desc>. */
  title?: string;
  desc?: string;
  firstChild?: string;
  /** Every element's tag name, in document order. */
  tags?: string[];
  /** Elements carrying a class attribute: class, data-* attributes, own <title> text and all text within. */
  marked?: { class: string; data: Record<string, string>; title: string | null; text: string; rects: { y: number; height: number; width: number }[] }[];
  /** All character data of <text> elements, one entry per <text>. */
  texts?: string[];
}

const svgScript = String.raw`
import sys, json, xml.dom.minidom as m
src = sys.stdin.buffer.read()
try:
    doc = m.parseString(src)
except Exception as e:
    print(json.dumps({"wellFormed": False, "error": str(e)})); sys.exit(0)
root = doc.documentElement
def text_of(n):
    if n.nodeType == n.TEXT_NODE: return n.data
    if n.nodeType == n.ELEMENT_NODE and n.tagName == 'title': return ''
    return ''.join(text_of(c) for c in n.childNodes)
def own(n, name):
    for c in n.childNodes:
        if c.nodeType == c.ELEMENT_NODE and c.tagName == name:
            return ''.join(x.data for x in c.childNodes if x.nodeType == x.TEXT_NODE)
    return None
tags, marked, texts = [], [], []
def walk(n):
    for c in n.childNodes:
        if c.nodeType != c.ELEMENT_NODE: continue
        tags.append(c.tagName)
        if c.hasAttribute('class'):
            data = {k[5:]: v for k, v in c.attributes.items() if k.startswith('data-')}
            rects = [{"y": float(r.getAttribute('y') or 0), "height": float(r.getAttribute('height') or 0), "width": float(r.getAttribute('width') or 0)} for r in c.getElementsByTagName('rect')]
            marked.append({"class": c.getAttribute('class'), "data": data, "title": own(c, 'title'), "text": text_of(c), "rects": rects})
        if c.tagName == 'text': texts.append(text_of(c))
        walk(c)
walk(root)
first = next((c.tagName for c in root.childNodes if c.nodeType == c.ELEMENT_NODE), None)
print(json.dumps({"wellFormed": True, "root": root.tagName, "rootAttributes": dict(root.attributes.items()),
  "title": own(root, 'title'), "desc": own(root, 'desc'), "firstChild": first, "tags": tags, "marked": marked, "texts": texts}))
`;

export function summariseSvg(svg: string): SvgSummary {
  return runPython(svgScript, svg) as SvgSummary;
}

export interface HtmlSummary {
  startTags: string[];
  /** Rows (tr) with a data-model attribute: the enclosing table's id or data-ranking, the name, and each cell's text. */
  /** The document's own <title> (the first one; the chart's titles come later). */
  rows: { table: string | null; model: string; cells: string[] }[];
  title: string;
  text: string;
}

const htmlScript = String.raw`
import sys, json
from html.parser import HTMLParser
class P(HTMLParser):
    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.start, self.rows, self.tables, self.row, self.cell = [], [], [], None, None
        self.in_title, self.title, self.text, self.skip, self.title_done = False, '', [], 0, False
    def handle_starttag(self, tag, attrs):
        a = dict(attrs); self.start.append(tag)
        if tag == 'table': self.tables.append(a.get('id') or a.get('data-ranking'))
        if tag == 'tr' and 'data-model' in a: self.row = {"table": self.tables[-1] if self.tables else None, "model": a['data-model'], "cells": []}
        if tag in ('td', 'th') and self.row is not None: self.cell = []
        if tag == 'title': self.in_title = True
        if tag in ('style',): self.skip += 1
    def handle_endtag(self, tag):
        if tag == 'table' and self.tables: self.tables.pop()
        if tag in ('td', 'th') and self.row is not None and self.cell is not None:
            self.row["cells"].append(''.join(self.cell)); self.cell = None
        if tag == 'tr' and self.row is not None: self.rows.append(self.row); self.row = None
        if tag == 'title': self.in_title = False; self.title_done = True
        if tag in ('style',): self.skip -= 1
    def handle_data(self, d):
        if self.cell is not None: self.cell.append(d)
        if self.in_title and not self.title_done: self.title += d
        if not self.skip: self.text.append(d)
p = P(); p.feed(sys.stdin.read()); p.close()
print(json.dumps({"startTags": p.start, "rows": p.rows, "title": p.title, "text": ''.join(p.text)}))
`;

export function summariseHtml(html: string): HtmlSummary {
  return runPython(htmlScript, html) as HtmlSummary;
}
