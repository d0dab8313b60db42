// The report's only stylesheet, inlined so the page needs nothing from
// elsewhere. Screen: a single readable column on unglazed paper. Print:
// black on white, no backgrounds the printer would waste toner on, table
// headers repeated on every page and rows never split across pages.
import { fontStack, palette } from './palette.ts';

export const reportStyle = `
:root { color-scheme: light; }
* { box-sizing: border-box; }
body { margin: 0; background: ${palette.paper}; color: ${palette.ink}; font: 15px/1.5 ${fontStack}; }
main { max-width: 68rem; margin: 0 auto; padding: 1.5rem 1.25rem 3rem; }
h1 { font-size: 1.45rem; margin: 0 0 .35rem; line-height: 1.25; overflow-wrap: break-word; }
h2 { font-size: 1.1rem; margin: 2rem 0 .6rem; padding-bottom: .2rem; border-bottom: 2px solid ${palette.ink}; }
h3 { font-size: .98rem; margin: 1.3rem 0 .4rem; overflow-wrap: break-word; }
p { margin: .4rem 0; }
.job { font-size: 1.05rem; margin: .2rem 0 .3rem; }
.summary, .note { color: ${palette.mutedInk}; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: .15rem 1rem; margin: .4rem 0; }
dl.facts dt { color: ${palette.mutedInk}; }
dl.facts dd { margin: 0; overflow-wrap: anywhere; }
code, .hash { font-family: DejaVu Sans Mono, Liberation Mono, monospace; font-size: .86em; overflow-wrap: anywhere; }
.table-wrap { overflow-x: auto; }
table { border-collapse: collapse; width: 100%; margin: .3rem 0 .8rem; font-variant-numeric: tabular-nums; }
caption { text-align: left; font-weight: bold; padding: .2rem 0; }
th, td { padding: .28rem .55rem; border-bottom: 1px solid ${palette.faintRule}; text-align: right; vertical-align: top; }
th { background: ${palette.wash}; border-bottom: 1px solid ${palette.rule}; font-weight: bold; }
th:first-child, td:first-child, td.name, th.name, td.words, th.words { text-align: left; }
/* Names break only where the page put a <wbr> (after + _ / . , ; : ×) or after a hyphen or space;
   break-word splits a part only when that part alone is wider than the column. */
td.name { overflow-wrap: break-word; min-width: 14rem; max-width: 22rem; }
td.support { min-width: 9rem; }
td.flagged { font-weight: bold; }
tr.leader td { font-weight: bold; }
.chart svg { display: block; max-width: 100%; height: auto; }
ul.cautions { padding-left: 1.2rem; }
ul.cautions li { margin: .3rem 0; }
.standing { border-left: 4px solid ${palette.ink}; padding: .4rem .8rem; background: ${palette.wash}; }
.integrity { margin: 0 0 .8rem; padding: .45rem .8rem; }
.integrity.ok { border-left: 4px solid ${palette.weightBar}; background: ${palette.wash}; color: ${palette.ink}; font-size: .92rem; }
.integrity.failed { border: 3px solid ${palette.ink}; background: ${palette.zoneNegligible}; color: ${palette.ink}; font-size: 1.05rem; }
.note.emphasis { color: ${palette.ink}; font-weight: bold; }
.facts-inline { color: ${palette.mutedInk}; font-size: .9em; }
ul.tree { margin: .2rem 0; padding-left: 1.1rem; }
footer { margin-top: 2.5rem; color: ${palette.mutedInk}; font-size: .85rem; }
@media print {
  @page { margin: 15mm 14mm; }
  body { background: #fff; color: #000; font-size: 10.5pt; }
  main { max-width: none; padding: 0; }
  h2 { break-after: avoid; page-break-after: avoid; }
  h3 { break-after: avoid; page-break-after: avoid; }
  th { background: none; border-bottom: 1.5px solid #000; }
  td { border-bottom: .5px solid #999; }
  thead { display: table-header-group; }
  tr, .chart, .standing, dl.facts { break-inside: avoid; page-break-inside: avoid; }
  .table-wrap { overflow: visible; }
  /* Paper cannot scroll: narrower cells so the widest table (models) fits the text width. */
  table { font-size: 7.5pt; }
  th, td { padding: .15rem .2rem; }
  td.name { min-width: 6rem; }
  td.support { min-width: 5rem; }
  .standing { background: none; border-left-color: #000; }
  .integrity.ok { background: none; border-left-color: #000; }
  .integrity.failed { background: none; border-color: #000; }
  .summary, .note, dl.facts dt, footer, .facts-inline { color: #333; }
}
`;
