/**
 * Pure helpers of the page (src/app) that need no browser: messages rewritten into a
 * field's unit, tick choices for map and log axes, and label placement on the maps.
 */
import { describe, expect, it } from 'vitest';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { validateScenario } from '../../src/scenario/parse.ts';
import { logTickLabels, niceTicks } from '../../src/app/axis-ticks.ts';
import { messageInUnit, scaledNumeral } from '../../src/app/field-messages.ts';
import { placeLabels, type Box } from '../../src/app/label-placement.ts';
import { ENGINE_MAPS_PER_RUN, mapMenu, plannedMaps } from '../../src/app/map-plan.ts';
import type { ErrorMap } from '../../src/compare/error-map.ts';
import { deriveQuantities } from '../../src/scenario/derived.ts';

/** The model's message for `path` after breaking the demo with `change`. */
function messageFor(path: string, change: (s: any) => void): string {
  const s: any = structuredClone(demoScenario());
  change(s);
  const r = validateScenario(s);
  if (r.ok) throw new Error('expected a problem');
  return r.problems.filter((p) => p.path === path).map((p) => p.message).join(' ');
}

describe('messages in the field\'s unit', () => {
  it('scales numerals exactly', () => {
    expect(scaledNumeral('0.001', -3)).toBe('1'); // 1 mm, SI prefixes (BIPM SI Brochure Table 7)
    expect(scaledNumeral('1e10', 9)).toBe('10'); // 10 GHz, BIPM SI Brochure Table 7
    expect(scaledNumeral('5e-10', -12)).toBe('500'); // 500 ps, BIPM SI Brochure Table 7
    expect(scaledNumeral('0.15', -6)).toBe('150000'); // common practice, no source
    expect(scaledNumeral('-0.0035', -3)).toBe('-3.5'); // common practice, no source
    expect(scaledNumeral('1', -12)).toBe('1e12'); // 1 s in ps, written as typed (common practice, no source)
    expect(scaledNumeral('2.5', -9)).toBe('2.5e9'); // common practice, no source
  });

  it('rewrites a cell-size message from metres into mm', () => {
    const m = messageFor('grid.dx', (s) => { s.grid.dx = -0.002; });
    expect(m).toContain('in metres, e.g. 0.001'); // the model's own wording, SI (README "Scenario file")
    const shown = messageInUnit(m, 'length', 'mm');
    expect(shown).toBe('-2 mm is not above 0; give the cell size along x in mm, e.g. 1'); // common practice, no source
  });

  it('rewrites positions, frequencies and times, and leaves node indices alone', () => {
    const pos = messageInUnit(messageFor('source.x', (s) => { s.source.x = 0.5; }), 'length', 'mm');
    expect(pos).toBe('500 mm lies outside the grid (nearest node i = 500); keep x between 10 mm and 289 mm, the interior nodes i = 10 to 289'); // common practice, no source
    const f = messageInUnit(messageFor('source.waveform.f0', (s) => { delete s.source.waveform.f0; }), 'frequency', 'MHz');
    expect(f).toContain('give the centre frequency in MHz, e.g. 10000'); // 1e10 Hz = 10000 MHz, BIPM SI Brochure Table 7
    const t = messageInUnit(messageFor('source.waveform.t0', (s) => { s.source.waveform.t0 = -1e-9; }), 'time', 'ps');
    expect(t.startsWith('-1000 ps is below 0')).toBe(true); // common practice, no source
    expect(t).toContain('in ps, e.g. 500'); // 5e-10 s = 500 ps, BIPM SI Brochure Table 7
    expect(t).not.toMatch(/seconds|e-10/); // common practice, no source
  });

  it('keeps a message in the SI unit as it is, and leaves unrelated words alone', () => {
    const m = messageFor('grid.dx', (s) => { s.grid.dx = 0; });
    expect(messageInUnit(m, 'length', 'm')).toBe(m); // common practice, no source
    expect(messageInUnit('12 mm is fine; 3 ms later', 'length', 'mm')).toBe('12 mm is fine; 3 ms later'); // no bare " m" here, common practice, no source
    expect(messageInUnit('', 'time', 'ns')).toBe(''); // common practice, no source
  });
});

describe('axis ticks', () => {
  it('steps 1, 2 or 5 × 10^k within the count asked for', () => {
    expect(niceTicks(0, 299, 6)).toEqual([0, 50, 100, 150, 200, 250]); // common practice, no source
    expect(niceTicks(0, 0.299, 5)).toEqual([0, 0.1, 0.2]); // common practice, no source
    expect(niceTicks(0, 2.99e-6, 4)).toEqual([0, 1e-6, 2e-6]); // common practice, no source
    expect(niceTicks(3, 3, 4)).toEqual([3]); // common practice, no source
    expect(niceTicks(5, 1, 4)).toEqual([]); // common practice, no source
    expect(niceTicks(0, NaN, 4)).toEqual([]); // common practice, no source
    expect(niceTicks(0, Infinity, 4)).toEqual([]); // common practice, no source
    for (let n = 2; n < 12; n++) expect(niceTicks(0, 123.4, n).length).toBeLessThanOrEqual(n); // common practice, no source
  });

  it('labels a log axis spanning less than a decade with more than one tick', () => {
    // the resolution study's axis: 8 to 60 cells per wavelength, 1100 px wide
    const values = [7.62, 9, 10, 20, 30, 40, 50, 60];
    const positions = values.map((v) => (Math.log10(v / 7.62) / Math.log10(60 / 7.62)) * 1100);
    const shown = values.filter((_v, k) => logTickLabels(values, positions, 34)[k]);
    expect(shown).toEqual([9, 10, 20, 30, 40, 50, 60]); // common practice, no source
    const narrow = values.map((v) => (Math.log10(v / 7.62) / Math.log10(60 / 7.62)) * 200);
    const few = values.filter((_v, k) => logTickLabels(values, narrow, 34)[k]);
    expect(few).toEqual([10, 20, 30, 50]); // 1-2-5 first, then 3 where it fits; common practice, no source
    expect(logTickLabels([0, -1, 10], [0, 50, 100], 10)).toEqual([false, false, true]); // common practice, no source
  });
});

describe('label placement on the maps', () => {
  const overlap = (a: Box, b: Box) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

  it('never prints two labels over each other', () => {
    // three probes a few pixels apart on a probe line, as in the demo
    const requests = [0, 4, 8, 30].map((dx) => ({ at: [100 + dx, 100] as [number, number], width: 40, height: 14 }));
    const boxes = placeLabels(requests, 7);
    const drawn = boxes.filter((b): b is Box => b !== null);
    for (let a = 0; a < drawn.length; a++) for (let b = a + 1; b < drawn.length; b++) expect(overlap(drawn[a], drawn[b])).toBe(false); // common practice, no source
    expect(drawn.length).toBeGreaterThanOrEqual(3); // common practice, no source
  });

  it('keeps labels off the markers and inside the bounds, or leaves them out', () => {
    const markers: Box[] = [{ x: 104, y: 80, width: 40, height: 40 }];
    const [box] = placeLabels([{ at: [100, 100], width: 30, height: 12 }], 7, markers, { x: 0, y: 0, width: 200, height: 200 });
    expect(box).not.toBeNull(); // common practice, no source
    expect(overlap(box as Box, markers[0])).toBe(false); // common practice, no source
    const [none] = placeLabels([{ at: [5, 5], width: 300, height: 12 }], 7, [], { x: 0, y: 0, width: 100, height: 100 });
    expect(none).toBeNull(); // too wide for the map, common practice, no source
    expect(placeLabels([], 7)).toEqual([]); // common practice, no source
  });
});

describe('error maps of a run and the map menu', () => {
  const map = (f_Hz: number): ErrorMap => ({ nx: 2, ny: 2, f_Hz, db: new Float32Array(4) });

  it('maps the chosen frequency first, then the others, as many as fit and the engine keeps', () => {
    const s = demoScenario();
    const d = deriveQuantities(s);
    const all = plannedMaps(s, { ...d, errorMapsFitting: 3 }, 1e10);
    expect(all).toEqual([1e10, 5e9, 1.5e10].slice(0, ENGINE_MAPS_PER_RUN)); // common practice, no source
    expect(plannedMaps(s, d, undefined)[0]).toBe(5e9); // nothing chosen: the first frequency, common practice, no source
    expect(plannedMaps(s, d, 7e9)[0]).toBe(5e9); // a frequency the set-up lacks is not mapped, common practice, no source
    expect(plannedMaps(s, { ...d, errorMapsFitting: 0 }, 1e10)).toEqual([]); // no room beside the run, common practice, no source
  });

  it('never labels a frequency with a picture of another', () => {
    const menu = mapMenu([map(5e9)], [5e9, 1e10], [1e10], 1e10);
    expect(menu.options.map((o) => o.label)).toEqual(['5 GHz', '10 GHz (next run)']); // common practice, no source
    expect(menu.map).toBeUndefined(); // 10 GHz chosen, no map of 5 GHz shown under it, common practice, no source
    expect(menu.shown?.note).toContain('applies to the next run'); // common practice, no source
    const two = mapMenu([map(5e9), map(1e10)], [5e9, 1e10], [1e10], 1e10);
    expect(two.map?.f_Hz).toBe(1e10); // switches without a run, common practice, no source
    expect(two.shown?.note).toBe(''); // common practice, no source
    const gone = mapMenu([map(5e9)], [1e10], [1e10], undefined);
    expect(gone.options.map((o) => o.label)).toEqual(['10 GHz (next run)', '5 GHz (last run)']); // common practice, no source
    expect(gone.map?.f_Hz).toBe(5e9); // nothing chosen: the map there is, under its own label, common practice, no source
    const full = mapMenu([], [1e10], [], 1e10);
    expect(full.options[0].label).toBe('10 GHz (no room for a map)'); // common practice, no source
    expect(full.shown?.note).toContain('does not fit'); // common practice, no source
    expect(mapMenu([], [], [], undefined)).toEqual({ options: [], shown: undefined, map: undefined }); // common practice, no source
    expect(mapMenu([], [1e10], undefined, undefined).options[0].label).toBe('10 GHz (next run)'); // set-up being fixed, common practice, no source
  });
});
