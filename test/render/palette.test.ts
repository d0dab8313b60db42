import t from 'tap';
import { palette } from '../../src/render/palette.ts';

// Relative luminance and contrast ratio as defined by WCAG 2.1 (W3C), section
// "Definitions": sRGB channels linearised with the 0.03928 threshold, weights
// 0.2126 / 0.7152 / 0.0722, ratio (L1 + 0.05) / (L2 + 0.05). Luminance is
// also what survives a grey printout, so these checks cover both.
function luminance(hex: string): number {
  const channels = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const [r, g, b] = channels.map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

t.test('WCAG luminance reference points', async (t) => {
  t.equal(contrast('#000000', '#ffffff'), 21, 'black on white is 21:1 by definition');
  t.equal(contrast('#777777', '#777777'), 1);
});

t.test('text meets 4.5:1 (WCAG 2.1 SC 1.4.3) on every background it is drawn on', async (t) => {
  for (const background of [palette.paper, palette.wash, palette.zoneWeaker, palette.zoneNegligible]) {
    t.ok(contrast(palette.ink, background) >= 4.5, `ink on ${background}: ${contrast(palette.ink, background).toFixed(2)}`);
    t.ok(contrast(palette.mutedInk, background) >= 4.5, `muted ink on ${background}: ${contrast(palette.mutedInk, background).toFixed(2)}`);
  }
});

t.test('bars stand out at 3:1 (WCAG 2.1 SC 1.4.11) against paper and the band zones', async (t) => {
  for (const bar of [palette.deltaBar, palette.weightBar]) {
    for (const background of [palette.paper, palette.zoneWeaker, palette.zoneNegligible]) {
      t.ok(contrast(bar, background) >= 3, `${bar} on ${background}: ${contrast(bar, background).toFixed(2)}`);
    }
  }
});

t.test('band zones get darker as support falls, so the order shows in grey', async (t) => {
  t.ok(luminance(palette.paper) > luminance(palette.zoneWeaker));
  t.ok(luminance(palette.zoneWeaker) > luminance(palette.zoneNegligible));
});
