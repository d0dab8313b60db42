import t from 'tap';
import { escapeAttribute, escapeText, toCarriableText } from '../../src/render/escape.ts';
import { summariseSvg } from './parse-with-python.ts';

// The predefined entities of XML 1.0 (W3C, fifth edition, section 4.6) and
// the HTML character references for the same five characters.
t.test('markup characters become references', async (t) => {
  t.equal(escapeText('<script>alert("x")</script>'), '&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;');
  t.equal(escapeText("it's"), 'it&#39;s');
  t.equal(escapeText('A&B'), 'A&amp;B');
  // An existing reference is data, not markup: it is escaped again, never passed through.
  t.equal(escapeText('&amp;'), '&amp;amp;');
  t.equal(escapeText(null), '');
});

// XML 1.0 production [2] Char excludes C0 controls other than tab, LF, CR,
// surrogates and U+FFFE/U+FFFF; HTML (WHATWG, "control-character-in-input-stream")
// also objects to C1 controls.
t.test('characters XML 1.0 cannot carry are replaced, the rest kept', async (t) => {
  t.equal(toCarriableText('a\u0000b\u0001c\u000Bd\u001Fe'), 'a\uFFFDb\uFFFDc\uFFFDd\uFFFDe');
  t.equal(toCarriableText('x\u0085y\u007Fz'), 'x\uFFFDy\uFFFDz');
  t.equal(toCarriableText('\uFFFE\uFFFF'), '\uFFFD\uFFFD');
  t.equal(toCarriableText('lone \uD800 high, lone \uDC00 low'), 'lone \uFFFD high, lone \uFFFD low');
  t.equal(toCarriableText('kiln 😀 ok'), 'kiln 😀 ok', 'a valid surrogate pair stays');
  t.equal(toCarriableText('tab\tline\ncr\r'), 'tab\tline\ncr\r', 'tab, LF and CR are legal XML characters');
});

t.test('attribute values keep tab, newline and carriage return through an XML parser', async (t) => {
  t.equal(escapeAttribute('a\tb\nc\rd'), 'a&#9;b&#10;c&#13;d');
  // Without references an XML parser normalises these to spaces (XML 1.0 section 3.3.3).
});

t.test('a strict XML parser reads back exactly what was escaped', async (t) => {
  const hostile = ['<script>alert(1)</script>', '"><img src=x onerror=alert(1)>', "a & b ' c", 'ctl\u0001\u0008\u001Bend', 'tab\there\nnew', ']]>', '\uD83D', 'ü — Δ 😀'];
  for (const value of hostile) {
    const doc = `<svg xmlns="http://www.w3.org/2000/svg"><title>${escapeText(value)}</title><g class="probe" data-value="${escapeAttribute(value)}"><text>${escapeText(value)}</text></g></svg>`;
    const parsed = summariseSvg(doc);
    t.ok(parsed.wellFormed, `well-formed for ${JSON.stringify(value)} ${parsed.error ?? ''}`);
    const expected = toCarriableText(value);
    t.equal(parsed.title, expected, 'title text');
    t.equal(parsed.marked?.[0].data.value, expected, 'attribute value');
    t.equal(parsed.texts?.[0], expected, 'element text');
    t.notOk(parsed.tags?.includes('script') || parsed.tags?.includes('img'), 'no element smuggled in');
  }
});

t.test('the parser check itself rejects what is not XML', async (t) => {
  t.notOk(summariseSvg('<svg><title>a < b</title></svg>').wellFormed);
  t.notOk(summariseSvg('<svg><title>\u0001</title></svg>').wellFormed);
});
