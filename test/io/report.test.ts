/**
 * The design-review report (src/io/report.ts) built from a real small run and from study
 * files made by the studies' own code (test/fixtures/report-input.ts): every section, the
 * job paragraph and the caution, each study's recommendation, the 3D projection's sentence,
 * names full of markup shown as text, nothing that runs or loads from elsewhere, the error
 * map as a real PNG of at most 200 pixels a side, and the same text for the same input.
 */
import { inflateSync } from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildReport, type ReportInput } from '../../src/io/report.ts';
import { fittedRange, mapPng, scaleColour, shrinkWorst } from '../../src/io/report/error-map-image.ts';
import { notation } from '../../src/io/report/html.ts';
import { PROJECTION_SENTENCE } from '../../src/io/report/resolution-section.ts';
import { scenarioSection } from '../../src/io/report/scenario-section.ts';
import { isStudyJson, studyKind, studyVerdict } from '../../src/io/report/study-data.ts';
import { CAUTION, JOB_PARAGRAPHS } from '../../src/io/report/texts.ts';
import { escapeXml } from '../../src/io/svg-plot.ts';
import { FORMULA_PROBE, HOSTILE_CANDIDATE, HOSTILE_LINE, HOSTILE_PROBE, reportInput, reportScenario, runFor } from '../fixtures/report-input.ts';
import { makeScenario } from '../fixtures/scenarios.ts';
import type { Scenario } from '../../src/scenario/types.ts';

let input: ReportInput;
let report: string;

beforeAll(async () => {
  input = await reportInput();
  report = buildReport(input);
}, 120_000);

/** The report's text with every tag removed and the entities read back (what a reader sees, roughly). */
const visible = (html: string) => html.replace(/<style>[\s\S]*?<\/style>/, '').replace(/<[^>]*>/g, ' ')
  .replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&amp;/g, '&');

describe('report contents', () => {
  it('has every section, in order, each starting a page', () => {
    const ids = [...report.matchAll(/<h2 id="([^"]+)"/g)].map((m) => m[1]);
    expect(ids).toEqual(['scenario', 'derived', 'comparison', 'plots', 'study-0', 'study-1', 'study-2', 'study-3', 'conventions', 'appendix']);
    expect(report.match(/<section class="page">/g)?.length).toBe(ids.length + 1); // the cover too
    for (const title of ['Scenario', 'Derived quantities and warnings', 'FDTD against the exact field', 'Plots', 'Absorber study', 'Resolution study',
      'Convergence study', 'Study: staircase', 'Conventions and cautions', 'Appendix: the scenario as JSON']) {
      expect(report).toContain(`>${title}</h2>`);
    }
  });

  it('says what gridgauge checks and cautions, on the cover and again at the close', () => {
    for (const p of JOB_PARAGRAPHS) expect(report).toContain(escapeXml(p));
    expect(report.split(escapeXml(CAUTION)).length - 1).toBe(2);
    expect(visible(report)).toContain('not evidence for RF-exposure or EMC compliance');
  });

  it('states each study\'s recommendation, on the cover and in its section', () => {
    for (const s of input.studies) {
      const verdict = escapeXml(studyVerdict(s));
      expect(report.split(verdict).length - 1, s.file).toBe(2);
    }
    expect(visible(report)).toMatch(/Recommended: \d+ cells, m 3/); // absorber
    expect(visible(report)).toMatch(/Recommended: \d+ cells per wavelength \(dx = /); // resolution
    expect(visible(report)).toMatch(/Recommended: level \d|No grid level is recommended/); // convergence
  });

  it('gives the 3D projection with its sentence', () => {
    expect(report).toContain(PROJECTION_SENTENCE);
    expect(visible(report)).toMatch(/Cells\s+\d+ × \d+ × \d+ = /);
    expect(visible(report)).toContain('estimate: half this machine');
  });

  it('gives the scenario, derived quantities and the comparison per probe', () => {
    const text = visible(report);
    for (const what of ['81 × 81 nodes', 'CPML, 8 cells', 'modulated Gaussian, f0 6 GHz', '6 GHz, 8 GHz', 'Time step dt', 'Stability margin',
      'Cells per wavelength at f0', 'Engine memory', 'relErrMax', 'phase error', 'Error map |FDTD/exact − 1|']) {
      expect(text).toContain(what);
    }
    const rows = [...report.matchAll(/<tr>.*?<\/tr>/g)].map((m) => visible(m[0]));
    expect(rows.filter((r) => r.includes('6 GHz') && r.includes('°')).length).toBeGreaterThanOrEqual(3); // one per reached probe
    expect(report).toContain(escapeXml(`"name": ${JSON.stringify(HOSTILE_PROBE)}`)); // the appendix holds the JSON, escaped
  });

  it('draws the plots: two per probe, two per line, one per study chart, and the error map', () => {
    const svgs = report.match(/<svg[\s>]/g)?.length ?? 0;
    const perProbe = 2 * input.results.probes.length;
    const perLine = 2 * input.results.lines.length;
    const studyCharts = 1 + 1 + 2; // absorber, resolution, convergence (phase and magnitude)
    expect(svgs).toBe(perProbe + perLine + studyCharts + 1); // + the error map's colour bar
    expect(report).not.toContain('>no data<');
  });
});

describe('report in TEz', () => {
  it('names Hz, the magnetic current and the TEz grid wherever TMz names Ez', async () => {
    const run = await runFor(reportScenario({ polarization: 'TEz' }), false);
    const tez = visible(buildReport({ ...input, ...run, studies: [] }));
    for (const what of ['|Hz/M| error', 'Probe', '2D TEz grid: Hz at node (i, j)', 'Hz(ω) = −(ωε0εr(ω)/4)·M(ω)']) expect(tez).toContain(what);
    expect(tez).not.toContain('|Ez/I|');
    expect(tez).not.toContain('2D TMz grid');
    expect(visible(report)).toContain('2D TMz grid'); // the TMz report keeps its own wording
  });
});

describe('safety', () => {
  it('shows names with markup as text', () => {
    expect(report).not.toContain('<img src=x');
    expect(report).not.toMatch(/<script/i);
    expect(report).not.toMatch(/<b onmouseover/i);
    expect(report).toContain(escapeXml(HOSTILE_PROBE));
    expect(report).toContain(escapeXml(HOSTILE_LINE));
    expect(report).toContain(escapeXml(HOSTILE_CANDIDATE));
    expect(report).toContain(escapeXml('small <test>.json'));
    expect(visible(report)).toContain(FORMULA_PROBE);
  });

  it('loads nothing from elsewhere and runs nothing', () => {
    expect(report).not.toMatch(/<(script|link|iframe|object|embed|base|meta http-equiv)\b/i);
    expect(report).not.toMatch(/@import|url\((?!#)/i);
    // no event-handler attribute on any element (attribute values, escaped text, set aside)
    for (const tag of report.match(/<[a-zA-Z][^>]*>/g) ?? []) expect(tag.replace(/"[^"]*"/g, '""')).not.toMatch(/\son[a-z]+\s*=/i);
    const refs = [...report.matchAll(/\s(?:src|href|xlink:href|action|poster)\s*=\s*"([^"]*)"/gi)].map((m) => m[1]);
    for (const r of refs) expect(r).toMatch(/^(#|data:image\/png;base64,)/);
    // http:// appears only as text: inside the formula-like probe name (whole, cut short in a plot title, or as JSON)
    const before = report.split(/https?:\/\//).slice(0, -1);
    expect(before.length).toBeGreaterThan(0);
    for (const b of before) expect(b.endsWith('HYPERLINK(&quot;') || b.endsWith('HYPERLINK(\\&quot;')).toBe(true);
  });

  it('gives the same text for the same input', () => {
    expect(buildReport(input)).toBe(report);
  });
});

describe('error map image', () => {
  it('is a PNG of at most 200 pixels a side, shrunk by the worst value of each block', () => {
    const uri = report.match(/src="data:image\/png;base64,([^"]+)"/)?.[1] as string;
    const png = Buffer.from(uri, 'base64');
    expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
    const width = png.readUInt32BE(16);
    const height = png.readUInt32BE(20);
    expect([width, height]).toEqual([81, 81]); // 81 nodes: one pixel per node
    const map = { nx: 450, ny: 3, f_Hz: 1e9, db: new Float32Array(1350).fill(-60) };
    map.db[2 * 450 + 449] = -3;
    map.db[0] = NaN;
    const shrunk = shrinkWorst(map);
    expect([shrunk.width, shrunk.height, shrunk.factor]).toEqual([150, 1, 3]);
    expect(shrunk.db[149]).toBe(-3); // the one bad node survives
    expect(shrunk.db[0]).toBe(-60); // NaN skipped when the block has values
    expect(Number.isNaN(shrinkWorst({ nx: 1, ny: 1, f_Hz: 1, db: new Float32Array([NaN]) }).db[0])).toBe(true);
    const rows = inflateSync(mapPng(shrunk, [-60, 0], 0).subarray(8 + 25 + 12 + 768 + 8)); // after signature, IHDR, PLTE and IDAT's header
    expect(rows.length).toBe(1 + 150);
  });

  it('fits the colour range to the interior in 5 dB steps, and its scale goes dark to bright', () => {
    const m = { width: 10, height: 10, factor: 1, db: new Float32Array(100).map((_, k) => -50 + (k % 10)) };
    expect(fittedRange(m, 0)).toEqual([-50, -40]); // common practice, no source (the page's "fit to the interior")
    expect(fittedRange({ ...m, db: new Float32Array(100).fill(NaN) }, 0)).toEqual([-80, 0]);
    const lightness = (u: number) => scaleColour(u).reduce((a, b) => a + b, 0);
    for (let k = 1; k <= 10; k++) expect(lightness(k / 10)).toBeGreaterThan(lightness((k - 1) / 10));
    expect(scaleColour(NaN)).toEqual(scaleColour(0));
  });
});

describe('cases', () => {
  it('says so for probes the pulse never reached, and when there is no error map', async () => {
    const short = await runFor(reportScenario({ steps: 40 }), false);
    const text = visible(buildReport({
      scenarioName: 'short.json', ...short, errorMapNote: 'the full-grid DFT would take the run above the cap', studies: [],
      version: '0.1.0', runtime: 'Node (test)', date: 'today',
    }));
    expect(text).toContain('not reached: the run ended before the pulse arrived');
    expect(text).toContain('No error map: the full-grid DFT would take the run above the cap.');
    expect(text).toContain('not-reached'); // the warning's code
    expect(text).toContain('none included (add study output folders with --with DIR)');
  });

  it('shows objects, their materials and the polarization when the scenario has them', () => {
    const s: Scenario = {
      ...makeScenario({ medium: { epsR: 2, sigma: 0.01, poles: [{ kind: 'debye', deltaEps: 3, tau: 1e-11 }] } }),
      polarization: 'TEz', fill: 'average',
      objects: [
        { name: '<i>slab</i>', shape: 'rectangle', x0: 0.01, y0: 0.01, x1: 0.02, y1: 0.03, material: { epsR: 4.4 } },
        { shape: 'circle', x: 0.05, y: 0.05, radius: 0.005, material: 'pec' },
      ],
    };
    const text = scenarioSection(s, s.steps).text;
    expect(text).toContain('TEz');
    expect(text).toContain('Debye pole: Δε 3, τ 10 ps');
    expect(text).toContain('σ 0.01 S/m');
    expect(text).toContain('&lt;i&gt;slab&lt;/i&gt;');
    expect(text).toContain('perfect electric conductor');
    expect(text).toContain('object 2');
  });

  it('recognises study files by shape and kind, and words a missing recommendation', () => {
    expect(isStudyJson({ candidates: [], recommended: null })).toBe(true);
    expect(isStudyJson({ candidates: [] })).toBe(false); // study.json of --emit has no recommendation
    expect(isStudyJson({ candidates: {}, recommended: null })).toBe(false);
    expect(isStudyJson([1])).toBe(false);
    expect(studyKind({ file: 'dir/Resolution.JSON', folder: '', data: null })).toBe('resolution');
    const none = (file: string, extra = {}) => studyVerdict({ file, folder: '', data: { candidates: [], recommended: null, ...extra } });
    expect(none('absorber.json', { target_dB: -60 })).toBe('No absorber setting meets the target −60 dB: nothing is recommended.');
    expect(none('resolution.json', { budget_deg: 5, size_wavelengths: 12 })).toBe('No resolution meets the budget 5° across 12 wavelengths: nothing is recommended.');
    expect(none('convergence.json', { budget_dB: 0.1, budget_deg: 1, caveats: ['far at 10 GHz: oscillatory'] })).toContain(': far at 10 GHz: oscillatory.');
    expect(none('other.json')).toContain('Nothing is recommended');
    // a hand-edited file with wrong types still gives a sentence, never a throw
    expect(studyVerdict({ file: 'absorber.json', folder: '', data: { recommended: { cells: 'six' }, target_dB: 'x' } })).toContain('— cells');
  });

  it('writes the README notation typographically and escapes it', () => {
    expect(notation('e^{+jωt} and H0^(2)(kρ) and (ρ/d)^m <x>').text).toBe('e<sup>+jωt</sup> and H<sub>0</sub><sup>(2)</sup>(kρ) and (ρ/d)<sup>m</sup> &lt;x&gt;');
  });
});
