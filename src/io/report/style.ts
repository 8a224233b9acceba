/**
 * The report's one style sheet: readable on screen, and in print on A4 or Letter (the page
 * size is left to the printer; the margins and the content are sized for the smaller of the
 * two, 182 mm × 248 mm). Each top-level section starts a page; figures, table rows and
 * boxes are not split; table headers repeat on every page; long names wrap rather than run
 * past the margin. No fonts, images or files from elsewhere.
 */
export const REPORT_CSS = `
@page { margin: 15mm 14mm 16mm 14mm; }
* { box-sizing: border-box; }
html { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
body {
  font-family: "Helvetica Neue", Helvetica, Arial, "Liberation Sans", sans-serif;
  font-size: 10pt; line-height: 1.4; color: #111; background: #fff;
  max-width: 190mm; margin: 0 auto; padding: 8mm 6mm 16mm;
}
@media print { body { max-width: none; margin: 0; padding: 0; } }
h1 { font-size: 19pt; margin: 0 0 1mm; line-height: 1.2; }
h2 { font-size: 14pt; margin: 0 0 3mm; padding-bottom: 1mm; border-bottom: 1pt solid #888; break-after: avoid; page-break-after: avoid; }
h3 { font-size: 11pt; margin: 5mm 0 2mm; break-after: avoid; page-break-after: avoid; }
p { margin: 0 0 2.5mm; }
section.page { margin-top: 14mm; }
section.page + section.page { border-top: 1pt dashed #bbb; padding-top: 8mm; }
@media print {
  section.page { margin-top: 0; break-before: page; page-break-before: always; }
  section.page + section.page { border-top: none; padding-top: 0; }
  section.page:first-of-type { break-before: auto; page-break-before: auto; }
}
.subtitle { color: #444; margin-bottom: 5mm; }
.caution { border: 1.5pt solid #a8520f; background: #fff6ec; padding: 2.5mm 4mm; margin: 3mm 0 4mm; break-inside: avoid; page-break-inside: avoid; }
.caution strong { color: #7a3a08; }
.verdict { border-left: 3pt solid #1f5fa8; padding: 1mm 0 1mm 3mm; margin: 2mm 0 3mm; break-inside: avoid; page-break-inside: avoid; }
.note { color: #444; font-size: 9pt; }
.warning { border-left: 3pt solid #c0282d; padding-left: 3mm; margin: 0 0 2mm; break-inside: avoid; }
.warning code { font-size: 8.5pt; }
table { border-collapse: collapse; width: 100%; margin: 1mm 0 4mm; }
table.data { font-size: 8.5pt; }
table.data.compact { font-size: 7.5pt; }
th, td { text-align: left; vertical-align: top; padding: 0.6mm 1.6mm; border-bottom: 0.5pt solid #ccc; overflow-wrap: anywhere; }
thead th { border-bottom: 1pt solid #666; vertical-align: bottom; }
thead { display: table-header-group; }
tr { break-inside: avoid; page-break-inside: avoid; }
td.num, th.num { text-align: right; white-space: nowrap; font-variant-numeric: tabular-nums; }
tr.picked td { font-weight: bold; background: #eef4fb; }
table.kv th { width: 34%; font-weight: normal; color: #333; }
table.kv { font-size: 9pt; }
.plots { display: flex; flex-wrap: wrap; gap: 3mm 4%; }
.plots figure { width: 48%; }
figure { margin: 0 0 4mm; break-inside: avoid; page-break-inside: avoid; }
figure.wide { width: 100%; }
figure svg { display: block; width: 100%; height: auto; }
figcaption { font-size: 8pt; color: #444; margin-top: 1mm; }
.map { display: flex; gap: 5mm; align-items: flex-start; }
.map img { width: 78mm; height: auto; image-rendering: pixelated; border: 0.5pt solid #333; }
.map .bar { width: 22mm; }
pre.json { font: 7.5pt/1.3 "DejaVu Sans Mono", "Liberation Mono", Menlo, Consolas, monospace; white-space: pre-wrap; overflow-wrap: anywhere; border: 0.5pt solid #ccc; padding: 2mm; margin: 0; }
ul, ol { margin: 0 0 3mm; padding-left: 6mm; }
li { margin-bottom: 1mm; }
.glance td { font-size: 9pt; }
.versions { font-size: 9pt; color: #333; }
`;
