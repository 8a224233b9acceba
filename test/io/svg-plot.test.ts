/**
 * The SVG plot writer: 1-2-5 ticks on linear axes, decades (with 2 and 5) on log axes, tick
 * labels in SI prefixes, escaping of every text, byte-for-byte determinism, gaps at NaN, null,
 * infinities and (on log axes) non-positive values, and thinning of dense series that keeps
 * their extremes.
 */
import { describe, expect, it } from 'vitest';
import { colourOf, escapeXml, linearTicks, logTicks, PALETTE, svgPlot, type PlotSpec } from '../../src/io/svg-plot.ts';

/** The text of every <text> element, in order. */
const texts = (svg: string) => [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]);
/** The clipped plot area: the data, without axes and legend. */
const plotArea = (svg: string) => svg.slice(svg.indexOf('<g clip-path='), svg.lastIndexOf('</g>'));
/** The d attribute of every path inside the clipped plot area. */
const dataPaths = (svg: string) => [...plotArea(svg).matchAll(/<path d="([^"]*)"/g)].map((m) => m[1]);

const base: PlotSpec = {
  title: 'Ez at a probe', x: { label: 't', unit: 's' }, y: { label: 'Ez', unit: 'V/m' },
  series: [{ label: 'FDTD', x: [0, 1e-9, 2e-9], y: [0, 1500, -800] }],
};

describe('ticks', () => {
  it('linear ticks are multiples of a 1-2-5 step, without binary noise', () => {
    expect(linearTicks(0, 1)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]); // common practice, no source (1-2-5 steps)
    expect(linearTicks(-0.3, 0.7)).toEqual([-0.2, 0, 0.2, 0.4, 0.6]); // common practice, no source
    expect(linearTicks(0, 2.0016e-9)).toEqual([0, 5e-10, 1e-9, 1.5e-9, 2e-9]); // common practice, no source
    expect(linearTicks(-120, -20)).toEqual([-120, -100, -80, -60, -40, -20]); // common practice, no source
    for (const t of linearTicks(0, 0.7)) expect(String(t).length).toBeLessThanOrEqual(4); // no 0.30000000000000004
  });

  it('linear ticks of degenerate ranges', () => {
    expect(linearTicks(NaN, 1)).toEqual([]); // common practice, no source
    expect(linearTicks(3, 3)).toEqual([3]); // common practice, no source
    expect(linearTicks(0, Infinity)).toEqual([0]); // common practice, no source
    expect(linearTicks(-1e300, 1e300).length).toBeGreaterThanOrEqual(2); // huge but finite
  });

  it('log ticks: decades, with 2 and 5 over two decades or less, every n-th decade over many', () => {
    expect(logTicks(1, 1000)).toEqual([1, 10, 100, 1000]); // common practice, no source
    expect(logTicks(5, 100)).toEqual([5, 10, 20, 50, 100]); // common practice, no source
    expect(logTicks(0.005, 0.2)).toEqual([0.005, 0.01, 0.02, 0.05, 0.1, 0.2]); // common practice, no source
    expect(logTicks(1e-12, 1)).toEqual([1e-12, 1e-10, 1e-8, 1e-6, 1e-4, 1e-2, 1]); // common practice, no source
    expect(logTicks(2, 4)).toEqual([2, 2.5, 3, 3.5, 4]); // too narrow for decades: linear ticks
  });

  it('log ticks of impossible ranges are empty', () => {
    expect(logTicks(0, 10)).toEqual([]); // common practice, no source
    expect(logTicks(-1, 10)).toEqual([]); // common practice, no source
    expect(logTicks(NaN, 10)).toEqual([]); // common practice, no source
  });
});

describe('svgPlot', () => {
  it('writes the axes in SI prefixes: one prefix per linear axis, in the axis title', () => {
    const t = texts(svgPlot(base));
    expect(t).toContain('t (ns)'); // 2e-9 s is 2 ns
    expect(t).toContain('Ez (kV/m)'); // 1500 V/m is 1.5 kV/m
    for (const tick of ['0', '0.5', '1', '1.5', '2']) expect(t).toContain(tick); // time ticks in ns
    expect(t).toContain('−1'); // negative ticks with a true minus sign
  });

  it('labels each tick of a log axis with its own prefix', () => {
    const svg = svgPlot({
      title: 'GCI', x: { label: 'cell size dx', unit: 'm', log: true }, y: { label: 'GCI (°)', log: true },
      series: [{ label: 'GCI', x: [2.5e-4, 5e-4, 1e-3], y: [0.5, 2, 8], style: 'points' }],
    });
    const t = texts(svg);
    expect(t).toEqual(expect.arrayContaining(['200 µm', '500 µm', '1 mm', '2 mm', '0.2', '1', '10'])); // formatSI per tick
    expect(plotArea(svg).match(/<circle/g)?.length).toBe(3); // three markers
  });

  it('puts the points on the log scale: equal ratios, equal distances', () => {
    const svg = svgPlot({ title: '', x: { label: 'x', log: true }, y: { label: 'y', log: true }, series: [{ label: 's', x: [1, 10, 100], y: [1, 10, 100], style: 'points' }] });
    const cx = [...plotArea(svg).matchAll(/<circle cx="([^"]+)" cy="([^"]+)"/g)].map((m) => [Number(m[1]), Number(m[2])]);
    expect(cx).toHaveLength(3);
    expect(cx[1][0] - cx[0][0]).toBeCloseTo(cx[2][0] - cx[1][0], 0); // log10 spacing
    expect(cx[0][1] - cx[1][1]).toBeCloseTo(cx[1][1] - cx[2][1], 0); // same on y, upward
  });

  it('escapes every text: title, axis labels, series and limit names, and the id', () => {
    const evil = '<img src=x onerror=alert(1)> & "q" \'s\'';
    const svg = svgPlot({
      ...base, id: 'a"b<c', title: evil, x: { label: evil, unit: '<u>' }, y: { label: evil },
      series: [{ label: evil, x: [0, 1], y: [0, 1] }], limits: [{ axis: 'y', value: 0.5, label: evil }],
    });
    expect(svg).not.toContain('<img');
    expect(svg).not.toContain('<u>');
    expect(svg).toContain(escapeXml('<img src=x onerror=alert(1)>'));
    for (const m of svg.matchAll(/ id="([^"]*)"/g)) expect(m[1]).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(escapeXml(`<a href="x">&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&amp;&#39;&lt;/a&gt;'); // XML 1.0 §2.4
  });

  it('is deterministic: the same plot gives the same bytes, whatever array type holds the data', () => {
    const spec: PlotSpec = { ...base, series: [{ label: 'a', x: [0, 1e-9, 2e-9], y: [0.25, -0.5, 0.125] }] };
    const typed: PlotSpec = { ...base, series: [{ label: 'a', x: Float64Array.from([0, 1e-9, 2e-9]), y: Float32Array.from([0.25, -0.5, 0.125]) }] };
    expect(svgPlot(spec)).toBe(svgPlot(spec));
    expect(svgPlot(typed)).toBe(svgPlot(spec));
  });

  it('breaks a line at NaN, null and infinities, and at non-positive values on a log axis', () => {
    const gaps = svgPlot({ ...base, series: [{ label: 'g', x: [0, 1, 2, 3, 4, 5, 6, 7], y: [0, 1, NaN, 1, 2, null, Infinity, 3] }] });
    const d = dataPaths(gaps)[0];
    expect(d.match(/M/g)?.length).toBe(3); // three runs: [0,1], [1,2], [3]
    expect(gaps).not.toContain('NaN');
    const log = svgPlot({ ...base, y: { label: 'y', log: true }, series: [{ label: 'g', x: [0, 1, 2, 3, 4], y: [1, 10, 0, -5, 100] }] });
    expect(dataPaths(log)[0].match(/M/g)?.length).toBe(2);
    expect(log).not.toContain('NaN');
  });

  it('draws an empty frame saying "no data" when nothing is finite', () => {
    const svg = svgPlot({ ...base, series: [{ label: 'none', x: [0, 1], y: [NaN, null] }] });
    expect(texts(svg)).toContain('no data');
    expect(svg).not.toContain('NaN');
    expect(svgPlot({ ...base, series: [] })).toContain('no data');
  });

  it('survives huge and tiny values', () => {
    for (const [lo, hi] of [[1e-300, 2e-300], [1e300, 1.5e300], [-1e-20, 1e-20]]) {
      const svg = svgPlot({ title: 't', x: { label: 'x' }, y: { label: 'y' }, series: [{ label: 's', x: [0, 1], y: [lo, hi] }] });
      expect(svg).not.toContain('NaN');
      expect(svg).not.toContain('Infinity');
    }
  });

  it('thins a dense series but keeps its peaks', () => {
    const n = 200_000;
    const x = Array.from({ length: n }, (_, k) => k);
    const y = x.map((k) => (k === 123_457 ? 10 : Math.sin(k / 500)));
    const svg = svgPlot({ title: 'dense', x: { label: 'n' }, y: { label: 'y' }, series: [{ label: 's', x, y }], width: 600, height: 300 });
    expect(svg.length).toBeLessThan(120_000); // about four points per pixel column
    const ys = dataPaths(svg)[0].split(/[ML]/).filter(Boolean).map((p) => Number(p.split(' ')[1]));
    const full = svgPlot({ title: 'dense', x: { label: 'n' }, y: { label: 'y' }, series: [{ label: 's', x: [0, 123_457, n - 1], y: [0, 10, 0] }], width: 600, height: 300 });
    const peak = Number(dataPaths(full)[0].split(/[ML]/).filter(Boolean)[1].split(' ')[1]);
    expect(Math.min(...ys)).toBeCloseTo(peak, 5); // the single-sample spike is still drawn
  });

  it('draws limit lines dashed and names them in the legend', () => {
    const svg = svgPlot({ ...base, limits: [{ axis: 'y', value: 2000, label: 'target' }] });
    expect(svg).toMatch(/stroke-dasharray="6 4"/);
    expect(texts(svg)).toContain('target');
    expect(texts(svg)).toContain('Ez (kV/m)'); // the range grew to take in the limit
  });

  it('cuts names too long for the plot with an ellipsis, never past the edge', () => {
    const long = 'x'.repeat(300);
    const t = texts(svgPlot({ ...base, title: long, series: [{ label: long, x: [0, 1], y: [0, 1] }], width: 400 }));
    for (const s of t) expect(s.length).toBeLessThan(70);
    expect(t.some((s) => s.endsWith('…'))).toBe(true);
  });

  it('writes the SVG namespace unless told it is inline', () => {
    expect(svgPlot(base)).toContain('xmlns="http://www.w3.org/2000/svg"');
    expect(svgPlot({ ...base, xmlns: false })).not.toContain('xmlns');
  });

  it('colours by role or palette index', () => {
    expect(colourOf(2, 0)).toBe(PALETTE[2]);
    expect(colourOf(-1, 0)).toBe(PALETTE[PALETTE.length - 1]);
    expect(colourOf(undefined, 9)).toBe(PALETTE[9 % PALETTE.length]);
    expect(colourOf('error', 0)).toMatch(/^#[0-9a-f]{6}$/);
  });
});
