/**
 * The design-review report in headless Chromium (playwright-core, as test/browser/harness.ts
 * drives it; no page build or server: the report is opened as a file://). It must load
 * nothing but itself and log no error, draw every plot and the error-map image, state each
 * study's recommendation, fit the printed page's width, and print to A4 and to Letter within
 * a stated number of pages: at least one page per section (each section starts a page) and
 * at most 16 (A4) or 18 (Letter) pages for this small report. Pages are counted by the
 * PDF's "/Type /Page" objects.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildReport, type ReportInput } from '../../src/io/report.ts';
import { studyVerdict } from '../../src/io/report/study-data.ts';
import { reportInput } from '../fixtures/report-input.ts';
import { ARTIFACTS, CHROMIUM, CHROMIUM_ARGS } from './harness.ts';

/** Most pages allowed, by paper size, for the test's report (sections, 3 probes, 4 studies). */
const MOST_PAGES = { A4: 16, Letter: 18 } as const;
/** Width of the printed text on A4, the narrower paper: 210 mm less the report's 14 mm margins, at 96 px per inch. */
const A4_TEXT_WIDTH_PX = Math.floor(((210 - 28) / 25.4) * 96);

let input: ReportInput;
let browser: Browser;
let page: Page;
let fileUrl: string;
const requests: string[] = [];
const errors: string[] = [];

/** Pages of a PDF: its page objects, "/Type /Page" (not "/Pages", the tree's nodes). */
const pdfPages = (pdf: Buffer) => (pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-zA-Z])/g) ?? []).length;

beforeAll(async () => {
  input = await reportInput();
  const path = join(ARTIFACTS, 'report-test.html');
  mkdirSync(ARTIFACTS, { recursive: true });
  writeFileSync(path, buildReport(input));
  fileUrl = pathToFileURL(path).href;
  browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  const context = await browser.newContext({ viewport: { width: 900, height: 1200 } });
  page = await context.newPage();
  page.on('request', (r) => { requests.push(r.url()); });
  page.on('console', (m) => { if (m.type() === 'error' || m.type() === 'warning') errors.push(m.text()); });
  page.on('pageerror', (e) => errors.push(`page error: ${e.message}`));
  // anything but the report itself is refused (and recorded above)
  await context.route('**/*', (route) => (route.request().url() === fileUrl ? route.continue() : route.abort()));
  await page.goto(fileUrl, { waitUntil: 'load' });
}, 180_000);

afterAll(async () => { await browser?.close(); });

describe('report in Chromium', () => {
  it('requests nothing but itself and logs no error', () => {
    expect(requests.filter((u) => !u.startsWith('data:'))).toEqual([fileUrl]);
    expect(errors).toEqual([]);
  });

  it('draws every plot: each has curves or points inside its frame', async () => {
    const plots = await page.$$eval('figure > svg', (svgs) => svgs.map((svg) => {
      const marks = svg.querySelectorAll('g[clip-path] path, g[clip-path] circle');
      const box = (svg.querySelector('g[clip-path]') as SVGGraphicsElement | null)?.getBBox();
      return { title: svg.getAttribute('aria-label'), marks: marks.length, width: box?.width ?? 0, height: box?.height ?? 0 };
    }));
    const expected = 2 * input.results.probes.length + 2 * input.results.lines.length + 1 + 1 + 2;
    expect(plots.length).toBe(expected);
    for (const p of plots) {
      expect(p.marks, p.title ?? '').toBeGreaterThan(0);
      expect(p.width * p.height, p.title ?? '').toBeGreaterThan(0);
    }
    const bar = await page.$$eval('.map .bar svg rect', (r) => r.length);
    expect(bar).toBeGreaterThan(10); // the colour bar of the error map
  });

  it('loads the error-map image', async () => {
    const img = await page.$eval('.map img', (i) => {
      const el = i as HTMLImageElement;
      return { complete: el.complete, w: el.naturalWidth, h: el.naturalHeight, shown: el.getBoundingClientRect().width };
    });
    expect(img.complete).toBe(true);
    expect(img.w).toBeGreaterThan(0);
    expect(img.h).toBeGreaterThan(0);
    expect(Math.max(img.w, img.h)).toBeLessThanOrEqual(200);
    expect(img.shown).toBeGreaterThan(100);
  });

  it('shows each study\'s recommendation and names with markup as text', async () => {
    const text = await page.evaluate(() => document.body.innerText);
    for (const s of input.studies) expect(text).toContain(studyVerdict(s));
    expect(text).toContain('<img src=x onerror=alert(1)>');
    expect(await page.$$eval('img', (i) => i.length)).toBe(1); // the error map only: no name became an element
    expect(await page.$$eval('script', (s) => s.length)).toBe(0);
  });

  it('fits the printed page: nothing wider than A4\'s text width', async () => {
    await page.setViewportSize({ width: A4_TEXT_WIDTH_PX, height: 1000 });
    await page.emulateMedia({ media: 'print' });
    const widest = await page.evaluate(() => {
      let right = document.documentElement.scrollWidth;
      for (const el of document.querySelectorAll('table, svg, img, pre, figure, p, li')) right = Math.max(right, el.getBoundingClientRect().right);
      return right;
    });
    expect(widest).toBeLessThanOrEqual(A4_TEXT_WIDTH_PX + 1);
    await page.emulateMedia({ media: 'screen' });
  });

  for (const format of ['A4', 'Letter'] as const) {
    it(`prints to ${format} in 11 to ${MOST_PAGES[format]} pages`, async () => {
      const pdf = await page.pdf({ format });
      writeFileSync(join(ARTIFACTS, `report-test-${format}.pdf`), pdf);
      const pages = pdfPages(pdf);
      console.log(`report: ${pages} pages on ${format}`);
      const sections = await page.$$eval('section.page', (s) => s.length);
      expect(sections).toBe(11);
      expect(pages).toBeGreaterThanOrEqual(sections); // each section starts a page
      expect(pages).toBeLessThanOrEqual(MOST_PAGES[format]);
    });
  }
});
