// Prints a Markdown table of log relative errors (LRE) of fitLeastSquares on the
// 11 NIST StRD linear least squares datasets, beside the textbook double
// Householder QR (raw design, no equilibration, no refinement) computed in the
// same run. Usage: npx tsx scripts/lre-table.ts

import { fitLeastSquares } from '../src/core/fit/index.ts';
import { fitPlainHouseholder } from '../src/core/fit/plain-householder.ts';
import { STRD_FILES, loadStrd, strdDesign, lre } from '../test/reference/nist/strd.ts';

const minOf = (xs: number[]) => Math.min(...xs);
const f1 = (x: number) => x.toFixed(1);

const rows: string[] = [];
let lowest = { value: Infinity, where: '' };
const note = (value: number, where: string) => {
  if (value < lowest.value) lowest = { value, where };
};

for (const file of STRD_FILES) {
  const ds = loadStrd(file);
  const { design, y } = strdDesign(ds);
  const cert = ds.certified;
  const fit = fitLeastSquares(design, y);
  const plain = fitPlainHouseholder(design, y);
  // A null SE (sigma exactly 0) stands for 0, the certified value of exact fits.
  const estL = cert.parameters.map((p, j) => lre(fit.coefficients[j], p.estimate));
  const sdL = cert.parameters.map((p, j) => lre(fit.standardErrors[j] ?? (fit.sigma === 0 ? 0 : null), p.standardDeviation));
  const rsd = lre(fit.sigma, cert.residualStandardDeviation);
  const r2 = lre(1 - fit.rss / fit.tss, cert.rSquared);
  const rss = lre(fit.rss, cert.anova.residual.sumOfSquares);
  estL.forEach((v, j) => note(v, `${ds.name} ${cert.parameters[j].name} estimate`));
  sdL.forEach((v, j) => note(v, `${ds.name} ${cert.parameters[j].name} SD`));
  note(rsd, `${ds.name} residual SD`);
  note(r2, `${ds.name} R²`);
  note(rss, `${ds.name} RSS`);
  const pEst = minOf(cert.parameters.map((p, j) => lre(plain.coefficients[j], p.estimate)));
  const pSd = minOf(cert.parameters.map((p, j) => lre(plain.standardErrors[j], p.standardDeviation)));
  const pRsd = lre(plain.sigma, cert.residualStandardDeviation);
  const pR2 = lre(1 - plain.rss / plain.tss, cert.rSquared);
  rows.push(
    `| ${ds.name} | ${ds.observations} | ${cert.parameters.length} | ${f1(minOf(estL))} | ${f1(minOf(sdL))} | ${f1(rsd)} | ${f1(r2)} | ${f1(rss)} ` +
      `| ${f1(pEst)} | ${f1(pSd)} | ${f1(pRsd)} | ${f1(pR2)} | ${fit.refinement.steps} |`,
  );
}

console.log('| dataset | n | p | estimates | SDs | residual SD | R² | RSS | plain QR estimates | plain QR SDs | plain QR residual SD | plain QR R² | refinement steps |');
console.log('| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |');
for (const r of rows) console.log(r);
console.log('');
console.log(`Lowest LRE of fitLeastSquares: ${f1(lowest.value)} (${lowest.where}).`);
