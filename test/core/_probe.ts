import { rankModels } from '../../src/core/ranking.ts';
import { verdict } from '../../src/core/verdict.ts';
const s = { direction: 'smaller', weighted: true } as const;
const r = (vals: Record<string, number|null>, dir: 'smaller'|'larger' = 'smaller') => rankModels(Object.entries(vals).map(([name, value]) => ({ name, value })), { direction: dir, weighted: dir === 'smaller' });
const params = { linear: 3, quadratic: 4, 'by-kiln': 6 };
const dis = {
  aic: r({ linear: 10, quadratic: 8, 'by-kiln': 9 }),
  aicc: r({ linear: 10, quadratic: 8, 'by-kiln': 12 }),
  bic: r({ linear: 10, quadratic: 11, 'by-kiln': 14 }),
  hqc: r({ linear: 10, quadratic: 9, 'by-kiln': 12 }),
  adjustedR2: r({ linear: 0.5, quadratic: 0.6, 'by-kiln': 0.7 }, 'larger'),
};
for (const n of [40, 7, 12, null]) console.log(JSON.stringify(verdict(dis, 'aicc', { parameters: params, observations: n }), null, 1).slice(0, 3000));
const ag = { aic: r({ linear: 10, quadratic: 8 }), aicc: r({ linear: null, quadratic: null }), bic: r({ linear: 10, quadratic: 8 }), hqc: r({ linear: 10, quadratic: 8 }), adjustedR2: r({ linear: 0.1, quadratic: 0.2 }, 'larger') };
console.log(verdict(ag, 'aicc', { parameters: params }).summary);
console.log(verdict({ ...ag, aicc: r({ linear: 5, quadratic: 4 }) }, 'aicc', { parameters: params }).summary);
console.log(verdict({ aic: r({ a: 1, b: 1 }) }, 'aic').summary);
console.log(verdict({}, 'aic').summary);
