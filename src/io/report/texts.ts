/**
 * The report's fixed wording: what gridgauge checks and why, the caution, and the
 * conventions every figure is measured in (README "Physics conventions", docs/physics.md).
 * The cover and the closing section both print the caution.
 */

export const JOB_PARAGRAPHS = [
  'gridgauge checks the numerical settings of a finite-difference time-domain (FDTD) simulation — cell size, time step and absorbing layers — against fields that are known exactly. ' +
    'It runs a pulsed line current on a 2D Yee grid with your settings and lays every FDTD value beside the exact field of that source (the Hankel-function Green\'s function in frequency, its transient form in time). ' +
    'What is left between the two is the error the grid itself adds: the phase it loses per wavelength, the reflection of its absorber, the error at each point of interest.',
  'This report records one such check for a design review: the scenario as run, the quantities that follow from it, the comparison with the exact field, and the studies that recommend a cell size, an absorber or a grid from an error budget. ' +
    'It lets a reviewer see whether the settings chosen for a project are fine enough for the accuracy the project needs, and what finer settings would cost.',
];

export const CAUTION = 'These results check numerical method only: how far a grid departs from the exact field of an idealised source. ' +
  'They are not evidence for RF-exposure or EMC compliance. For those, defer to the applicable standards and to licensed practice.';

export const CONVENTIONS: readonly string[] = [
  'Time convention e^{+jωt}: the outgoing wave is H0^(2)(kρ). Texts written with e^{−iωt} use H0^(1); their phases are the negatives of the ones here.',
  '2D TMz grid: Ez at node (i, j) = (i·dx, j·dy) over the whole grid, absorber included; Hx at (i, j+½), Hy at (i+½, j). Fields are 32-bit floats.',
  'Courant number S = c·dt/min(dx, dy), with c = c0/√εr the wave speed in the medium; the 2D stability limit is S ≤ 1/(min(dx, dy)·√(1/dx² + 1/dy²)), 1/√2 for square cells. The stability margin is the limit minus S.',
  'The line current enters as Jz = I/(dx·dy) at the half step; Ez sample n is at t = n·dt. Exact field: Ez(ω) = −(ωμ0/4)·I(ω)·H0^(2)(kρ), k = ω√εr(ω)/c0 (εr(ω) complex in a lossy or dispersive medium); beside one circular object, the eigenfunction series of that circle.',
  'Absorber: CPML (Roden & Gedney 2000) in the outer absorber.cells nodes of each side, PEC behind it, graded as σ = σmax(ρ/d)^m, κ = 1 + (κmax − 1)(ρ/d)^m, α = αmax(1 − ρ/d), with σmax = sigmaScale·0.8(m + 1)/(η·Δ), η = η0/√εr.',
  'Phase error = arg(FDTD) − arg(exact), wrapped to (−180°, 180°]; negative when the grid lags the exact wave. The predicted phase error is −(k̃ − k)·ρ from the Yee dispersion relation along the direction from the source. Magnitude error = 20·log10|FDTD/exact|.',
  'relErrMax = max over time of |FDTD − exact| / max over time of |exact| at a probe. Error map: 20·log10|FDTD/exact − 1| at every node.',
  'Cells per wavelength count along the coarser of dx and dy, with the wavelength in the medium.',
];

/** The two conventions that differ in TEz, in the order of the TMz ones they replace. */
const TEZ_REPLACEMENTS: readonly [number, string][] = [
  [1, '2D TEz grid: Hz at node (i, j) = (i·dx, j·dy) over the whole grid, absorber included; Ex at (i, j+½), Ey at (i+½, j). Fields are 32-bit floats.'],
  [3, 'The magnetic line current enters as Mz = M/(dx·dy) at the half step; Hz sample n is at t = n·dt. Exact field: Hz(ω) = −(ωε0εr(ω)/4)·M(ω)·H0^(2)(kρ), k = ω√εr(ω)/c0; beside one circular object, the eigenfunction series of that circle.'],
];

/**
 * The conventions for a run's polarization: TMz as listed above, TEz with the grid and
 * source lines exchanged for their duals.
 *
 * @example
 * conventionsFor('TEz')[1]; // "2D TEz grid: Hz at node (i, j) …"
 */
export function conventionsFor(polarization: string | undefined): readonly string[] {
  if (polarization !== 'TEz') return CONVENTIONS;
  const list = [...CONVENTIONS];
  for (const [i, text] of TEZ_REPLACEMENTS) list[i] = text;
  return list;
}
