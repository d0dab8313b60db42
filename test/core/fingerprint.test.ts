// The dataset fingerprint's text encoding. Reference bytes from Python 3.11:
// s.encode('utf-8', 'surrogatepass'), which writes a lone surrogate as the
// three bytes of its code point — the WTF-8 form — and well-formed text as
// plain UTF-8 (RFC 3629).
import t from 'tap';
import { datasetFingerprint, textBytes } from '../../src/core/fingerprint.ts';

t.test('text is UTF-8 when well formed and WTF-8 for a lone surrogate', async (t) => {
  // 'a' + chr(0xD800) + 'b' + chr(0x1F525) + chr(0xDC00) in Python 3.11 -> 61eda08062f09f94a5edb080
  t.equal(textBytes('a\uD800b\uD83D\uDD25\uDC00').toString('hex'), '61eda08062f09f94a5edb080');
  t.equal(textBytes('\uFFFD').toString('hex'), 'efbfbd');
  t.equal(textBytes('kiln west °C').toString('hex'), Buffer.from('kiln west °C', 'utf8').toString('hex'));
});

t.test('"\\uD800" and "\\uFFFD" no longer fingerprint alike, in values or in names', async (t) => {
  const fp = (level: string, name = 'kiln') => datasetFingerprint({
    columns: { y: [1, 2, 3], [name]: ['east', level, 'east'] }, response: 'y', weights: null, used: [name], rows: [0, 1, 2],
  });
  t.not(fp('\uD800'), fp('\uFFFD'));
  t.not(fp('west', 'k\uDC00'), fp('west', 'k\uFFFD'));
});
