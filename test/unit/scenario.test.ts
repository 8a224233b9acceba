import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { C0 } from '../../src/scenario/constants.ts';
import { demoScenario } from '../../src/scenario/defaults.ts';
import { deriveQuantities } from '../../src/scenario/derived.ts';
import { closestName, editDistance } from '../../src/scenario/did-you-mean.ts';
import { engineMemoryBytes, MEMORY_CAP_BYTES } from '../../src/scenario/memory.ts';
import { lineNodes } from '../../src/scenario/layout.ts';
import { formatProblem, MAX_PROBLEMS, parseScenarioText, validateScenario } from '../../src/scenario/parse.ts';
import type { ParseResult, Problem, Scenario } from '../../src/scenario/types.ts';

// Tests break scenarios on purpose, so they handle them untyped.
type Loose = any;

/** The demo scenario as a plain object to break on purpose. */
function demo(): Loose {
  return structuredClone(demoScenario());
}

function problemsOf(value: unknown): Problem[] {
  const r = validateScenario(value);
  if (r.ok) throw new Error('expected the scenario to be refused');
  return r.problems;
}

function refused(change: (s: Loose) => void): Problem[] {
  const s = demo();
  change(s);
  return problemsOf(s);
}

function accepted(r: ParseResult): Scenario {
  if (!r.ok) throw new Error(`expected the scenario to pass:\n${r.problems.map(formatProblem).join('\n')}`);
  return r.scenario;
}

/** The one problem on `path`; fails when there is none or more than one. */
function at(problems: Problem[], path: string): string {
  const hits = problems.filter((p) => p.path === path);
  expect(hits.map((p) => p.path), `problems: ${problems.map(formatProblem).join(' | ')}`).toEqual([path]);
  return hits[0].message;
}

describe('a valid scenario', () => {
  it('the demo passes and comes back unchanged', () => {
    // common practice, no source: validation of a complete scenario is the identity
    expect(accepted(validateScenario(demoScenario()))).toEqual(demoScenario());
  });

  it('examples/demo.json equals demoScenario()', () => {
    // common practice, no source: the shipped example and the built-in demo must not drift
    const text = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');
    expect(JSON.parse(text)).toEqual(demoScenario());
    expect(accepted(parseScenarioText(text))).toEqual(demoScenario());
  });

  it('examples/coarse-dielectric.json passes, εr = 4, with the ricker defaults filled in', () => {
    const text = readFileSync(new URL('../../examples/coarse-dielectric.json', import.meta.url), 'utf8');
    const s = accepted(parseScenarioText(text));
    expect(s.medium.epsR).toBe(4);
    expect(s.source.amplitude).toBe(1);
    expect(s.source.waveform).toEqual({ kind: 'ricker', f0: 5e9, t0: 2 / 5e9 }); // docs/scenario.md: t0 = 2/f0 for ricker
  });

  it('the demo runs long enough for the pulse to pass the farthest probe and line end', () => {
    // common practice, no source: the envelope exp(−u²) is below e^-25 ≈ 1e-11 at u = 5
    const s = demoScenario();
    const { dt_s } = deriveQuantities(s);
    const w = s.source.waveform;
    const points = [...s.probes.map((p) => [p.x, p.y]), ...s.lines.flatMap((l) => [[l.x0, l.y0], [l.x1, l.y1]])];
    const farthest = Math.max(...points.map(([x, y]) => Math.hypot(x - s.source.x, y - s.source.y)));
    const passed = w.t0 + 5 * (w.kind === 'ricker' ? NaN : w.tau) + farthest / C0;
    expect(s.steps * dt_s).toBeGreaterThan(passed);
  });

  it('fills the documented defaults when sections are left out', () => {
    // docs/scenario.md: defaults for medium, absorber, amplitude, lists, waveform
    const s = accepted(validateScenario({
      grid: { nx: 100, ny: 80, dx: 0.002, dy: 0.002, courant: 0.5 },
      source: { x: 0.1, y: 0.08, waveform: { kind: 'modulated-gaussian', f0: 2e9 } },
      steps: 10,
    }));
    expect(s.format).toBe('gridgauge-scenario');
    expect(s.version).toBe(1);
    expect(s.medium).toEqual({ epsR: 1 });
    expect(s.absorber).toEqual({ cells: 10, order: 3, sigmaScale: 1, kappaMax: 5, alphaMax: 0.05 });
    expect(s.source.amplitude).toBe(1);
    expect(s.probes).toEqual([]);
    expect(s.lines).toEqual([]);
    expect(s.frequencies).toEqual([]);
    expect(s.source.waveform).toEqual({ kind: 'modulated-gaussian', f0: 2e9, tau: 1 / 2e9, t0: 5 / 2e9 }); // τ = 1/f0, t0 = 5τ
  });

  it('gaussian takes tau and defaults t0 = 5τ; a given t0 is kept', () => {
    // docs/scenario.md: t0 = 5τ for both Gaussian kinds
    const s = demo();
    s.source.waveform = { kind: 'gaussian', tau: 2e-11 };
    expect(accepted(validateScenario(s)).source.waveform).toEqual({ kind: 'gaussian', tau: 2e-11, t0: 5 * 2e-11 });
    s.source.waveform = { kind: 'gaussian', tau: 2e-11, t0: 3e-10 };
    expect(accepted(validateScenario(s)).source.waveform.t0).toBe(3e-10);
  });

  it('accepts a file without format and version, and the stability limit typed out in full', () => {
    // common practice, no source: 1/√2 written to 17 digits rounds a hair above the computed limit
    const s = demo();
    delete s.format;
    delete s.version;
    s.grid.courant = 0.7071067811865476;
    expect(accepted(validateScenario(s)).grid.courant).toBe(0.7071067811865476);
  });

  it('accepts names of 40 characters with spaces, "_", "." and "-", and letters beyond ASCII', () => {
    const s = demo();
    s.probes[0].name = `a${'b'.repeat(39)}`;
    s.probes[1].name = '9 far_out.v-2';
    s.probes[2].name = 'Meßpunkt ü';
    expect(accepted(validateScenario(s)).probes.map((p) => p.name)).toEqual([s.probes[0].name, '9 far_out.v-2', 'Meßpunkt ü']);
  });

  it('accepts a byte-order mark before the JSON', () => {
    // common practice, no source: Windows editors write U+FEFF at the start of UTF-8 files
    expect(parseScenarioText(`\uFEFF${JSON.stringify(demoScenario())}`).ok).toBe(true);
  });

  it('accepts positions on the first and last interior node', () => {
    // docs/scenario.md: the interior is cells ≤ i ≤ nx−1−cells
    const s = demo();
    s.probes[0] = { name: 'low', x: 0.0095, y: 0.0095 }; // rounds half up to node 10
    s.probes[1] = { name: 'high', x: 0.289, y: 0.289 };
    expect(validateScenario(s).ok).toBe(true);
  });
});

describe('refused: grid', () => {
  // every case below checks a rule of the scenario contract: docs/scenario.md "Format 1" (no outside source applies)
  it('nx not a whole number', () => {
    expect(at(refused((s) => { s.grid.nx = 300.5; }), 'grid.nx')).toMatch(/300\.5 is not a whole number; use a whole number such as 30[01]/);
  });
  it('nx too small for the absorber', () => {
    // docs/scenario.md "Format 1": nx, ny ≥ 3 + 2·cells
    expect(at(refused((s) => { s.grid.nx = 22; }), 'grid.nx')).toBe('22 nodes are too few for 10 absorber cells on each side; nx must be at least 3 + 2·10 = 23, so use 23 or more, or fewer absorber cells');
  });
  it('ny too small for the absorber', () => {
    expect(at(refused((s) => { s.grid.ny = 20; }), 'grid.ny')).toMatch(/ny must be at least 3 \+ 2·10 = 23/);
  });
  it('nx below 3 even without an absorber', () => {
    expect(at(refused((s) => { s.grid.nx = 2; s.absorber.cells = 0; }), 'grid.nx')).toMatch(/^2 is below 3, too few nodes for any grid; give the number of Ez nodes along x/);
  });
  it('nx as text', () => {
    expect(at(refused((s) => { s.grid.nx = '300'; }), 'grid.nx')).toBe('"300" is text; write the number without quotes: 300');
  });
  it('nx beyond the safe integers', () => {
    expect(at(refused((s) => { s.grid.nx = 2 ** 60; }), 'grid.nx')).toMatch(/is far too large/);
  });
  it('dx zero', () => {
    expect(at(refused((s) => { s.grid.dx = 0; }), 'grid.dx')).toBe('0 is not above 0; give the cell size along x in metres, e.g. 0.001');
  });
  it('dy negative', () => {
    expect(at(refused((s) => { s.grid.dy = -0.001; }), 'grid.dy')).toMatch(/^-0\.001 is not above 0; give the cell size along y in metres/);
  });
  it('dx NaN', () => {
    expect(at(refused((s) => { s.grid.dx = NaN; }), 'grid.dx')).toMatch(/^NaN is not a finite number; give the cell size along x/);
  });
  it('dy Infinity', () => {
    expect(at(refused((s) => { s.grid.dy = Infinity; }), 'grid.dy')).toMatch(/^Infinity is not a finite number/);
  });
  it('courant zero', () => {
    expect(at(refused((s) => { s.grid.courant = 0; }), 'grid.courant')).toMatch(/^0 is not above 0; give the Courant number/);
  });
  it('courant above the square-cell stability limit', () => {
    // S ≤ 1/√2 for square 2D Yee cells: Taflove & Hagness, Computational Electrodynamics, 3rd ed., §4.7
    expect(at(refused((s) => { s.grid.courant = 0.75; }), 'grid.courant'))
      .toBe('0.75 is above the 2D stability limit 0.7071 for these cells; use 0.7071 or less');
  });
  it('courant a hair above the limit', () => {
    expect(at(refused((s) => { s.grid.courant = 0.70711; }), 'grid.courant'))
      .toBe('0.70711 is above the 2D stability limit 0.7071 for these cells; use 0.7071 or less');
  });
  it('shows the limit in full when rounding it would put it above the refused value', () => {
    // common practice, no source: dy chosen so the limit is 0.80006, which rounds up to 0.8001
    const dy = 0.001 / Math.sqrt(1 / 0.80006 ** 2 - 1);
    expect(at(refused((s) => { s.grid.dy = dy; s.grid.courant = 0.80007; }), 'grid.courant'))
      .toMatch(/^0\.80007 is above the 2D stability limit 0\.8000[56]\d* for these cells; use 0\.8 or less$/);
  });
  it('courant above the limit for oblong cells', () => {
    // limit 1/(min·√(1/dx² + 1/dy²)) = 1/√1.25 ≈ 0.8944 for dy = 2dx (docs/physics.md)
    expect(at(refused((s) => { s.grid.dy = 0.002; s.grid.courant = 0.9; }), 'grid.courant'))
      .toBe('0.9 is above the 2D stability limit 0.8944 for these cells; use 0.8944 or less');
  });
  it('grid missing', () => {
    expect(at(refused((s) => { delete s.grid; }), 'grid')).toMatch(/^required; give the grid as \{ "nx", "ny", "dx", "dy", "courant" \}/);
  });
  it('grid not an object', () => {
    expect(at(refused((s) => { s.grid = [300, 300]; }), 'grid')).toMatch(/^expected the grid as .* but found an array/);
  });
});

describe('refused: medium and absorber', () => {
  // every case below checks a rule of the scenario contract: docs/scenario.md "Format 1" (no outside source applies)
  it('epsR below 1', () => {
    expect(at(refused((s) => { s.medium.epsR = 0.5; }), 'medium.epsR')).toMatch(/^0\.5 is below 1, which no passive medium has; give the relative permittivity/);
  });
  it('epsR Infinity', () => {
    expect(at(refused((s) => { s.medium.epsR = Infinity; }), 'medium.epsR')).toMatch(/^Infinity is not a finite number/);
  });
  it('cells negative', () => {
    expect(at(refused((s) => { s.absorber.cells = -1; }), 'absorber.cells')).toMatch(/^-1 is below 0; a layer cannot be thinner than 0 cells; give the CPML thickness/);
  });
  it('cells not whole', () => {
    expect(at(refused((s) => { s.absorber.cells = 2.5; }), 'absorber.cells')).toMatch(/^2\.5 is not a whole number/);
  });
  it('cells leaving no interior node', () => {
    const problems = refused((s) => { s.absorber.cells = 150; });
    expect(at(problems, 'absorber.cells')).toBe('150 cells on each side leave no interior nodes on a 300 × 300 grid; use at most 148 cells, or a larger grid');
    expect(at(problems, 'grid.nx')).toMatch(/nx must be at least 3 \+ 2·150 = 303/);
    expect(at(problems, 'grid.ny')).toMatch(/ny must be at least 3 \+ 2·150 = 303/);
  });
  it('order below 1', () => {
    expect(at(refused((s) => { s.absorber.order = 0.5; }), 'absorber.order')).toMatch(/^0\.5 is below 1.*give the polynomial grading order/);
  });
  it('sigmaScale negative', () => {
    expect(at(refused((s) => { s.absorber.sigmaScale = -1; }), 'absorber.sigmaScale')).toMatch(/^-1 is below 0; a conductivity cannot be negative/);
  });
  it('kappaMax below 1', () => {
    expect(at(refused((s) => { s.absorber.kappaMax = 0.9; }), 'absorber.kappaMax')).toMatch(/^0\.9 is below 1; κ below 1 would shrink the layer/);
  });
  it('alphaMax negative', () => {
    expect(at(refused((s) => { s.absorber.alphaMax = -0.01; }), 'absorber.alphaMax')).toMatch(/^-0\.01 is below 0; a negative shift makes the layer unstable/);
  });
});

describe('refused: source and waveform', () => {
  // every case below checks a rule of the scenario contract: docs/scenario.md "Format 1" (no outside source applies)
  it('amplitude zero', () => {
    expect(at(refused((s) => { s.source.amplitude = 0; }), 'source.amplitude')).toBe('is 0, which drives no field at all; use a non-zero current in amperes, e.g. 1');
  });
  it('amplitude NaN', () => {
    expect(at(refused((s) => { s.source.amplitude = NaN; }), 'source.amplitude')).toMatch(/^NaN is not a finite number; give the peak current in amperes/);
  });
  it('unknown kind lists the kinds', () => {
    expect(at(refused((s) => { s.source.waveform.kind = 'sine'; }), 'source.waveform.kind'))
      .toBe('"sine" is not a waveform kind; use one of gaussian, modulated-gaussian, ricker');
  });
  it('misspelt kind gets a did-you-mean', () => {
    expect(at(refused((s) => { s.source.waveform.kind = 'Modulated_Gaussian'; }), 'source.waveform.kind'))
      .toMatch(/\(did you mean modulated-gaussian\?\)$/);
  });
  it('kind missing', () => {
    expect(at(refused((s) => { delete s.source.waveform.kind; }), 'source.waveform.kind')).toBe('required; use one of gaussian, modulated-gaussian, ricker');
  });
  it('gaussian without tau', () => {
    expect(at(refused((s) => { s.source.waveform = { kind: 'gaussian' }; }), 'source.waveform.tau'))
      .toBe('required for a gaussian waveform; give the Gaussian width τ in seconds, e.g. 1e-10');
  });
  it('modulated-gaussian without f0', () => {
    expect(at(refused((s) => { s.source.waveform = { kind: 'modulated-gaussian', tau: 1e-10 }; }), 'source.waveform.f0'))
      .toBe('required for a modulated-gaussian waveform; give the centre frequency in Hz, e.g. 1e10');
  });
  it('ricker without f0', () => {
    expect(at(refused((s) => { s.source.waveform = { kind: 'ricker' }; }), 'source.waveform.f0')).toMatch(/^required for a ricker waveform/);
  });
  it('tau on ricker', () => {
    expect(at(refused((s) => { s.source.waveform = { kind: 'ricker', f0: 1e10, tau: 1e-10 }; }), 'source.waveform.tau'))
      .toBe('does not apply to a ricker waveform, whose width follows from f0; remove tau');
  });
  it('f0 on gaussian', () => {
    expect(at(refused((s) => { s.source.waveform = { kind: 'gaussian', tau: 1e-10, f0: 1e10 }; }), 'source.waveform.f0'))
      .toMatch(/^does not apply to a gaussian waveform, which takes tau and t0; remove f0/);
  });
  it('f0 not positive', () => {
    expect(at(refused((s) => { s.source.waveform.f0 = -1e10; }), 'source.waveform.f0')).toMatch(/^-10000000000 is not above 0; give the centre frequency in Hz/);
  });
  it('tau zero', () => {
    expect(at(refused((s) => { s.source.waveform.tau = 0; }), 'source.waveform.tau')).toMatch(/^0 is not above 0; give the Gaussian width/);
  });
  it('t0 negative', () => {
    expect(at(refused((s) => { s.source.waveform.t0 = -1e-10; }), 'source.waveform.t0')).toMatch(/^-1e-10 is below 0; the pulse must be centred after t = 0/);
  });
  it('source x NaN', () => {
    expect(at(refused((s) => { s.source.x = NaN; }), 'source.x')).toMatch(/^NaN is not a finite number; give the x coordinate in metres/);
  });
  it('source in the absorber, with the allowed range in metres', () => {
    // docs/scenario.md: interior nodes 10..289 on a 300-node grid with 10 absorber cells
    expect(at(refused((s) => { s.source.x = 0.005; }), 'source.x'))
      .toBe('0.005 m lies in the absorber layer (nearest node i = 5); keep x between 0.01 m and 0.289 m, the interior nodes i = 10 to 289');
  });
  it('source outside the grid', () => {
    expect(at(refused((s) => { s.source.y = 1; }), 'source.y'))
      .toBe('1 m lies outside the grid (nearest node j = 1000); keep y between 0.01 m and 0.289 m, the interior nodes j = 10 to 289');
  });
});

describe('refused: probes and lines', () => {
  // every case below checks a rule of the scenario contract: docs/scenario.md "Format 1" (no outside source applies)
  it('probe outside the interior', () => {
    expect(at(refused((s) => { s.probes[2].y = 0.295; }), 'probes[2].y')).toMatch(/^0\.295 m lies in the absorber layer \(nearest node j = 295\); keep y between 0\.01 m and 0\.289 m/);
  });
  it('line end outside the interior', () => {
    expect(at(refused((s) => { s.lines[0].x1 = 0.3; }), 'lines[0].x1')).toMatch(/^0\.3 m lies outside the grid .*keep x1 between 0\.01 m and 0\.289 m/);
  });
  it('line start in the absorber', () => {
    expect(at(refused((s) => { s.lines[0].y0 = 0.002; }), 'lines[0].y0')).toMatch(/^0\.002 m lies in the absorber layer/);
  });
  it('duplicate probe names', () => {
    expect(at(refused((s) => { s.probes[2].name = 'near'; }), 'probes[2].name'))
      .toBe('"near" is already the name of probes[0]; give every probe and line its own name');
  });
  it('a line named like a probe', () => {
    expect(at(refused((s) => { s.lines[0].name = 'far'; }), 'lines[0].name')).toMatch(/is already the name of probes\[1\]/);
  });
  it('empty name', () => {
    expect(at(refused((s) => { s.probes[0].name = ''; }), 'probes[0].name')).toMatch(/^is empty; give a name of 1 to 40/);
  });
  it('name of 41 characters', () => {
    expect(at(refused((s) => { s.probes[0].name = 'x'.repeat(41); }), 'probes[0].name')).toMatch(/is 41 characters long; use at most 40$/);
  });
  it('name starting with "-" (it would also read as a formula in a spreadsheet)', () => {
    expect(at(refused((s) => { s.probes[1].name = '-far'; }), 'probes[1].name')).toBe('"-far" starts with "-"; start the name with a letter or digit');
  });
  it('name with a character outside the set', () => {
    expect(at(refused((s) => { s.lines[0].name = 'x/axis'; }), 'lines[0].name')).toMatch(/contains "\/"; use only letters, digits, spaces/);
  });
  it('name not text', () => {
    expect(at(refused((s) => { s.probes[0].name = 7; }), 'probes[0].name')).toBe('expected a name in double quotes but found 7');
  });
  it('probe missing a coordinate', () => {
    expect(at(refused((s) => { delete s.probes[1].x; }), 'probes[1].x')).toMatch(/^required; give the x coordinate in metres/);
  });
  it('probes not a list', () => {
    expect(at(refused((s) => { s.probes = { name: 'near', x: 0.18, y: 0.15 }; }), 'probes')).toMatch(/^expected a list of probes .* but found an object/);
  });
});

describe('refused: frequencies and steps', () => {
  // every case below checks a rule of the scenario contract: docs/scenario.md "Format 1" (no outside source applies)
  it('a negative frequency', () => {
    expect(at(refused((s) => { s.frequencies[1] = -1; }), 'frequencies[1]')).toMatch(/^-1 is not above 0; give a frequency in Hz/);
  });
  it('a zero frequency', () => {
    expect(at(refused((s) => { s.frequencies[2] = 0; }), 'frequencies[2]')).toMatch(/^0 is not above 0/);
  });
  it('an infinite frequency', () => {
    expect(at(refused((s) => { s.frequencies[0] = Infinity; }), 'frequencies[0]')).toMatch(/^Infinity is not a finite number/);
  });
  it('a frequency at or above 1/(2·dt)', () => {
    // Nyquist: a signal sampled every dt holds frequencies below 1/(2·dt) (Shannon 1949)
    expect(at(refused((s) => { s.frequencies[0] = 3e11; }), 'frequencies[0]'))
      .toBe('300000000000 Hz is not below 1/(2·dt) = 2.998e11 Hz, the highest frequency this time step can sample; use a lower frequency, or smaller cells or Courant number');
  });
  it('steps zero', () => {
    expect(at(refused((s) => { s.steps = 0; }), 'steps')).toMatch(/^0 is below 1; run at least one step; give the number of time steps/);
  });
  it('steps not whole', () => {
    expect(at(refused((s) => { s.steps = 12.5; }), 'steps')).toMatch(/^12\.5 is not a whole number/);
  });
  it('steps missing', () => {
    expect(at(refused((s) => { delete s.steps; }), 'steps')).toMatch(/^required; give the number of time steps to run, e.g. 1200/);
  });
});

describe('refused: memory', () => {
  // every case below checks a rule of the scenario contract: docs/scenario.md "Format 1" (no outside source applies)
  it('a grid above the cap names grid.nx and grid.ny, the bytes and the cap', () => {
    const problems = refused((s) => { s.grid.nx = 30000; s.grid.ny = 30000; });
    const bytes = engineMemoryBytes({
      nx: 30000, ny: 30000, cells: 10, steps: 1200, probes: 3,
      dftPoints: 3 + lineNodes(0.16, 0.15, 0.28, 0.15, 0.001, 0.001).length, frequencies: 3, fullGridDft: false,
    });
    for (const path of ['grid.nx', 'grid.ny']) {
      const m = at(problems, path);
      expect(m).toContain(`(${bytes} bytes)`);
      expect(m).toContain(`above the cap of 2 GiB (${MEMORY_CAP_BYTES} bytes)`);
      expect(m).toMatch(/use a smaller grid/);
    }
  });
  it('a grid that fits but too many steps also names steps', () => {
    const problems = refused((s) => { s.steps = 200_000_000; });
    expect(at(problems, 'grid.nx')).toMatch(/above the cap/);
    expect(at(problems, 'steps')).toMatch(/the fields fit, but the stored time series and running DFTs do not/);
  });
});

describe('refused: file level', () => {
  // every case below checks a rule of the scenario contract: docs/scenario.md "Format 1" (no outside source applies)
  it('version 2 is a newer format, and nothing else is judged', () => {
    const problems = refused((s) => { s.version = 2; s.grid.courant = 5; s.extra = true; });
    expect(problems).toEqual([{
      path: 'version',
      message: '2 is a newer scenario format than this build of gridgauge reads (it reads version 1); update gridgauge, or rewrite the file as version 1',
    }]);
  });
  it('version as text', () => {
    expect(at(refused((s) => { s.version = '1'; }), 'version')).toBe('"1" (text) is not a scenario format version; write 1 or leave the field out');
  });
  it('version 0', () => {
    expect(at(refused((s) => { s.version = 0; }), 'version')).toMatch(/^0 is not a scenario format version/);
  });
  it('a wrong format name', () => {
    expect(at(refused((s) => { s.format = 'other-tool'; }), 'format')).toBe('"other-tool" (text) is not the name of this format; write "gridgauge-scenario" or leave the field out');
  });
  it('unknown field with a did-you-mean', () => {
    const problems = refused((s) => { s.grid.courrant = s.grid.courant; delete s.grid.courant; });
    expect(at(problems, 'grid.courrant')).toBe('unknown field; did you mean grid.courant?');
    expect(at(problems, 'grid.courant')).toMatch(/^required/);
  });
  it('unknown field in the wrong section', () => {
    expect(at(refused((s) => { s.grid.epsR = 4; }), 'grid.epsR')).toBe('unknown field here; did you mean medium.epsR?');
  });
  it('a waveform field directly in source', () => {
    expect(at(refused((s) => { s.source.f0 = 1e10; }), 'source.f0')).toBe('unknown field here; did you mean source.waveform.f0?');
  });
  it('unknown field inside a probe', () => {
    expect(at(refused((s) => { s.probes[1].nmae = 'x'; }), 'probes[1].nmae')).toBe('unknown field; did you mean probes[1].name?');
  });
  it('a time step given directly', () => {
    expect(at(refused((s) => { s.dt = 1e-12; }), 'dt')).toMatch(/^unknown field; the time step is not given directly; it follows from grid.courant/);
  });
  it('an unknown field with nothing close lists the fields', () => {
    expect(at(refused((s) => { s.absorber.thickness = 3; }), 'absorber.thickness'))
      .toBe('unknown field; remove it (absorber takes cells, order, sigmaScale, kappaMax, alphaMax)');
  });
  it('an odd key is quoted in the path', () => {
    expect(at(refused((s) => { s['a b'] = 1; }), '["a b"]')).toMatch(/^unknown field/);
  });
  it.each([
    ['a list', [1, 2]],
    ['null', null],
    ['a number', 3],
    ['text', 'scenario'],
  ])('a top-level value that is %s', (kind, value) => {
    expect(at(problemsOf(value), '(scenario)')).toMatch(new RegExp(`^expected a scenario object .* but found ${kind}`));
  });
  it('lists every problem, not only the first', () => {
    const problems = refused((s) => { s.grid.dx = -1; s.medium.epsR = 0; s.steps = 0; s.probes[0].name = ''; });
    expect(problems.map((p) => p.path)).toEqual(['grid.dx', 'medium.epsR', 'probes[0].name', 'steps']);
  });
  it('skips a rule whose inputs are invalid: no stability or frequency message when dx is wrong', () => {
    // the 1/(2·dt) check needs dx; with dx refused it must stay silent
    const problems = refused((s) => { s.grid.dx = 'big'; s.grid.courant = 0.9; s.frequencies = [1e15]; });
    expect(problems.map((p) => p.path)).toEqual(['grid.dx']);
  });
  it('caps the list at MAX_PROBLEMS and says how many more there are', () => {
    const problems = refused((s) => { for (let k = 0; k < 150; k++) s[`junk${k}`] = k; });
    expect(problems).toHaveLength(MAX_PROBLEMS);
    expect(problems.at(-1)).toEqual({ path: '(scenario)', message: `${150 - MAX_PROBLEMS + 1} more problems not listed; fix the ones above first` });
  });
  it('a getter that throws does not escape', () => {
    const s = demo();
    Object.defineProperty(s.grid, 'nx', { enumerable: true, get() { throw new Error('boom'); } });
    expect(at(problemsOf(s), '(scenario)')).toBe('could not be read (boom); pass plain data as read from a JSON file');
  });
  it('a proxy that throws on every trap does not escape', () => {
    const hostile = new Proxy({}, { get() { throw new Error('no'); }, ownKeys() { throw new Error('no'); }, has() { throw new Error('no'); } });
    expect(validateScenario(hostile).ok).toBe(false);
  });
});

describe('malformed JSON', () => {
  // RFC 8259 grammar; line and column are counted from 1 (common practice, no source)
  const cases: [string, string, string][] = [
    ['trailing comma', '{\n  "steps": 10,\n}', 'malformed JSON at line 3, column 1: a comma before "}" is not allowed in JSON; remove the last comma'],
    ['missing comma', '{\n  "grid": {\n    "nx": 300\n    "ny": 300\n  }\n}', 'malformed JSON at line 4, column 5: expected "," or "}" but found "\\""; is a comma missing?'],
    ['unclosed object', '{ "steps": 10', 'malformed JSON at line 1, column 14: the file ends inside an object; a "}" is missing'],
    ['single quotes', "{ 'steps': 10 }", 'malformed JSON at line 1, column 3: expected a field name in double quotes but found a single quote (JSON needs double quotes)'],
    ['a comment', '{\r\n  // note\r\n  "steps": 1 }', 'malformed JSON at line 2, column 3: comments are not allowed in JSON; remove them'],
    ['NaN', '{ "steps": NaN }', 'malformed JSON at line 1, column 12: NaN is not allowed in JSON; write a finite number'],
    ['a leading zero', '{ "steps": 012 }', 'malformed JSON at line 1, column 12: malformed number; JSON numbers have no leading zeros, hex or trailing dots; write it like 0.5, -2 or 1e-3'],
    ['unclosed text', '{ "name": "near }', 'malformed JSON at line 1, column 11: this text is never closed; add the closing double quote'],
    ['a bad escape', '{ "a": "C:\\dir" }', 'malformed JSON at line 1, column 11: "\\d" is not a JSON escape; write "\\\\" for a backslash'],
    ['text after the object', '{} {}', 'malformed JSON at line 1, column 4: unexpected "{" after the end of the scenario; remove it'],
    ['a bare word', '{ "kind": ricker }', 'malformed JSON at line 1, column 11: "ricker" is not a JSON value; text needs double quotes, and only true, false and null are bare words'],
    ['columns count characters, not UTF-16 units', '{ "𝑥": 1 x }', 'malformed JSON at line 1, column 10: expected "," or "}" but found "x"; is a comma missing?'],
  ];
  it.each(cases)('%s', (_name, text, message) => {
    // RFC 8259 (JSON grammar); line and column are 1-based, common practice in editors
    expect(parseScenarioText(text)).toEqual({ ok: false, problems: [{ path: '(file)', message }] });
  });
  it('an empty file', () => {
    expect(parseScenarioText('  \n')).toEqual({ ok: false, problems: [{ path: '(file)', message: 'is empty; a scenario file holds one JSON object, see examples/demo.json' }] });
  });
  it('a very deep nesting is reported, not a stack overflow', () => {
    const r = parseScenarioText('['.repeat(200_000));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems[0].message).toMatch(/^malformed JSON at line 1, column 200001: the file ends/);
  });
});

describe('derived quantities', () => {
  const d = deriveQuantities(demoScenario());
  it('time step, speed and stability margin', () => {
    // dt = S·min(dx,dy)/c and the 1/√2 limit: docs/physics.md (Taflove & Hagness §4.7)
    expect(d.dt_s).toBeCloseTo((0.5 * 0.001) / 299_792_458, 25);
    expect(d.c_m_per_s).toBe(299_792_458);
    expect(d.stabilityLimit).toBeCloseTo(Math.SQRT1_2, 15);
    expect(d.stabilityMargin).toBeCloseTo(Math.SQRT1_2 - 0.5, 15);
    expect(d.stabilityMarginFraction).toBeCloseTo(1 - 0.5 * Math.SQRT2, 15);
    expect(d.duration_s).toBeCloseTo(1200 * d.dt_s, 22);
    expect(d.nyquist_Hz).toBeCloseTo(1 / (2 * d.dt_s), 0);
  });
  it('band edge of the modulated Gaussian matches its closed form', () => {
    // from memory: |I(f)| ∝ exp(−(π(f−f0)τ)²) near f0, so −40 dB lies at f0 + √(ln 100)/(πτ)
    const edge = 1e10 + Math.sqrt(Math.log(100)) / (Math.PI * 1e-10);
    expect(d.f0_Hz).toBe(1e10);
    expect(d.bandEdge_Hz / edge).toBeCloseTo(1, 6);
  });
  it('wavelengths and cells per wavelength', () => {
    // common practice, no source: λ = c/f, cells per wavelength along the coarser cell
    expect(d.wavelengthAtF0_m).toBeCloseTo(0.0299792458, 12);
    expect(d.cellsPerWavelengthAtF0).toBeCloseTo(29.9792458, 9);
    expect(d.cellsPerWavelengthAtBandEdge).toBeCloseTo(d.wavelengthAtBandEdge_m / 0.001, 9);
  });
  it('memory and interior size', () => {
    expect(d.memory_bytes).toBe(engineMemoryBytes({
      nx: 300, ny: 300, cells: 10, steps: 1200, probes: 3,
      dftPoints: 3 + lineNodes(0.16, 0.15, 0.28, 0.15, 0.001, 0.001).length, frequencies: 3, fullGridDft: false,
    }));
    expect(d.memoryCap_bytes).toBe(MEMORY_CAP_BYTES);
    expect([d.interiorNx, d.interiorNy]).toEqual([280, 280]);
  });
  it('uses the coarser cell and the medium', () => {
    const s = demoScenario();
    s.grid.dy = 0.002;
    s.medium.epsR = 4;
    const q = deriveQuantities(s);
    expect(q.c_m_per_s).toBeCloseTo(299_792_458 / 2, 6);
    expect(q.cellsPerWavelengthAtF0).toBeCloseTo(0.0299792458 / 2 / 0.002, 9);
  });
  it('a baseband gaussian has no centre wavelength (NaN, null in JSON)', () => {
    const s = demoScenario();
    s.source.waveform = { kind: 'gaussian', tau: 2e-11, t0: 1e-10 };
    const q = deriveQuantities(s);
    expect(q.f0_Hz).toBe(0);
    expect(q.wavelengthAtF0_m).toBeNaN();
    expect(q.cellsPerWavelengthAtF0).toBeNaN();
    // from memory: |I(f)| ∝ exp(−(πfτ)²), so −40 dB lies at √(ln 100)/(πτ)
    expect(q.bandEdge_Hz / (Math.sqrt(Math.log(100)) / (Math.PI * 2e-11))).toBeCloseTo(1, 6);
  });
});

describe('did-you-mean', () => {
  it('edit distance', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3); // Levenshtein's textbook example (Wikipedia, "Levenshtein distance")
    expect(editDistance('ca', 'abc')).toBe(3); // the optimal-string-alignment variant (Wikipedia, "Damerau–Levenshtein distance")
    expect(editDistance('coruant', 'courant')).toBe(1); // one swap of neighbours, common practice, no source
    expect(editDistance('', 'abc')).toBe(3);
  });
  it('closest name', () => {
    // common practice, no source
    expect(closestName('courrant', ['nx', 'courant'])).toBe('courant');
    expect(closestName('EPSR', ['epsR'])).toBe('epsR');
    expect(closestName('freq', ['steps', 'frequencies'])).toBe('frequencies');
    expect(closestName('zzz', ['nx', 'ny'])).toBeUndefined();
    expect(closestName('x'.repeat(100), ['x'])).toBeUndefined();
  });
});

describe('never throws (property)', () => {
  const demoText = JSON.stringify(demoScenario(), null, 2);
  const leafPaths: (string | number)[][] = [];
  const walk = (v: unknown, path: (string | number)[]) => {
    leafPaths.push(path);
    if (v !== null && typeof v === 'object') for (const [k, c] of Object.entries(v)) walk(c, [...path, Array.isArray(v) ? Number(k) : k]);
  };
  walk(demoScenario(), []);
  const strange = fc.oneof(
    fc.anything({ withBigInt: true, withDate: true, withTypedArray: true, withSparseArray: true, withNullPrototype: true, withBoxedValues: true }),
    fc.double(),
    fc.constantFrom(NaN, Infinity, -Infinity, -0, 0, 1e308, -1, 2 ** 53, '', '0.5', null, undefined, [], {}),
  );

  const mutatedValue = fc.tuple(fc.constantFrom(...leafPaths.filter((p) => p.length > 0)), fc.constantFrom('set', 'delete', 'add'), strange, fc.string())
    .map(([path, action, value, key]) => {
      const s = demo();
      let parent = s;
      for (const seg of path.slice(0, -1)) parent = parent[seg];
      const last = path[path.length - 1];
      if (action === 'set') parent[last] = value;
      else if (action === 'delete') delete parent[last];
      else if (parent[last] !== null && typeof parent[last] === 'object') parent[last][key] = value;
      return { kind: 'value' as const, input: s as unknown };
    });
  const mutatedText = fc.tuple(fc.nat({ max: demoText.length }), fc.nat({ max: 8 }), fc.string({ maxLength: 6 }))
    .map(([at, cut, insert]) => ({ kind: 'text' as const, input: demoText.slice(0, at) + insert + demoText.slice(at + cut) as unknown }));
  const arbitraryText = fc.oneof(fc.string(), fc.json(), fc.string({ unit: 'binary' })).map((t) => ({ kind: 'text' as const, input: t as unknown }));
  const arbitraryValue = strange.map((v) => ({ kind: 'value' as const, input: v }));

  it('on 2 000 arbitrary and mutated inputs, and every rejection has a path and a message', () => {
    // common practice, no source: untrusted input must give problems, never an exception
    fc.assert(
      fc.property(fc.oneof(mutatedValue, mutatedText, arbitraryText, arbitraryValue), ({ kind, input }) => {
        const r = kind === 'text' ? parseScenarioText(input as string) : validateScenario(input);
        if (r.ok) return;
        expect(r.problems.length).toBeGreaterThan(0);
        for (const p of r.problems) {
          expect(typeof p.path === 'string' && p.path.length > 0).toBe(true);
          expect(typeof p.message === 'string' && p.message.length > 0).toBe(true);
        }
      }),
      { numRuns: 2000 },
    );
  });
});
