#!/usr/bin/env node
// Makes docs/report-first-page.png, the README's picture of the design-review report: the
// report of examples/demo.json with the three studies run on it, its first A4 page rendered
// in headless Chromium at a small width. Remake it whenever the report's cover changes.
//
// Usage: node scripts/report-thumbnail.mjs [--studies DIR] [--width PX]
//   --studies DIR  where the demo's study folders are, or are made (default
//                  test-artifacts/demo-studies): DIR/absorber, DIR/resolution, DIR/convergence.
//                  A missing folder is made by running its study (tens of seconds each):
//                    gridgauge absorber-study examples/demo.json --out DIR/absorber
//                    gridgauge resolution-study examples/demo.json --size 12 --budget 5 --dims 3 --volume 0.2,0.2,0.1 --out DIR/resolution
//                    gridgauge convergence-study examples/demo.json --out DIR/convergence
//   --width PX     width of the picture (default 480; the page is A4, 210 × 297 mm)
// Prints the report's build line, its page count on A4 and Letter, and the picture's size.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, statSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';

const ROOT = resolve(import.meta.dirname ?? new URL('.', import.meta.url).pathname, '..');
const args = process.argv.slice(2);
const option = (name, fallback) => { const k = args.indexOf(`--${name}`); return k >= 0 ? args[k + 1] : fallback; };
const studies = resolve(ROOT, option('studies', 'test-artifacts/demo-studies'));
const width = Number(option('width', '480'));
const picture = join(ROOT, 'docs', 'report-first-page.png');
const report = join(ROOT, 'test-artifacts', 'demo-report', 'report.html');
const say = (line) => process.stderr.write(`${line}\n`);

function gridgauge(...argv) {
  const r = spawnSync(process.execPath, [join(ROOT, 'bin', 'gridgauge.js'), ...argv], { cwd: ROOT, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] });
  if (r.status !== 0) throw new Error(`gridgauge ${argv.join(' ')} exited ${r.status}`);
  return r.stdout;
}

const STUDY_ARGS = {
  absorber: ['absorber-study'],
  resolution: ['resolution-study', '--size', '12', '--budget', '5', '--dims', '3', '--volume', '0.2,0.2,0.1'],
  convergence: ['convergence-study'],
};
for (const [name, verb] of Object.entries(STUDY_ARGS)) {
  const dir = join(studies, name);
  if (existsSync(join(dir, `${name}.json`))) continue;
  say(`running the ${name} study on the demo into ${dir}`);
  gridgauge(...verb, 'examples/demo.json', '--out', dir);
}

mkdirSync(join(ROOT, 'test-artifacts', 'demo-report'), { recursive: true });
say(gridgauge('report', 'examples/demo.json', '--out', report, ...Object.keys(STUDY_ARGS).flatMap((name) => ['--with', join(studies, name)])).trim());

const A4 = { width: 210, height: 297, margin: { top: 15, right: 14, bottom: 16, left: 14 } }; // mm, as the report's @page
const pxPerMm = 96 / 25.4;
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
try {
  const page = await browser.newPage({
    viewport: { width: Math.round(A4.width * pxPerMm), height: Math.round(A4.height * pxPerMm) },
    deviceScaleFactor: width / (A4.width * pxPerMm),
  });
  await page.goto(pathToFileURL(report).href, { waitUntil: 'load' });
  for (const format of ['A4', 'Letter']) {
    const pdf = await page.pdf({ format });
    say(`report: ${(pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-zA-Z])/g) ?? []).length} pages on ${format}`);
  }
  // the printed first page on screen: print styles, the page's margins as padding, and
  // only the first section (every other section starts a new printed page)
  await page.emulateMedia({ media: 'print' });
  const m = A4.margin;
  await page.addStyleTag({ content: `body { padding: ${m.top}mm ${m.right}mm ${m.bottom}mm ${m.left}mm !important; } section.page ~ section.page { display: none !important; } body::after { content: ""; position: fixed; inset: 0; border: 1px solid #999; }` });
  const png = await page.screenshot({ clip: { x: 0, y: 0, width: A4.width * pxPerMm, height: A4.height * pxPerMm } });
  writeFileSync(picture, png);
} finally {
  await browser.close();
}
say(`wrote ${picture} (${(statSync(picture).size / 1024).toFixed(0)} KiB)`);
