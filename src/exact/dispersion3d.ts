/*
 * Numerical dispersion of the 3D Yee scheme in a lossless, non-dispersive medium, and the
 * arithmetic that projects a 2D resolution choice onto a 3D run. A plane wave
 * exp(j(ωt − k̃·r)) on the 3D grid satisfies (Taflove & Hagness, Computational
 * Electrodynamics, 3rd ed., 2005, ch. 4, chapter from memory)
 *   sin²(ω·dt/2)/(c·dt)² = sin²(k̃x·dx/2)/dx² + sin²(k̃y·dy/2)/dy² + sin²(k̃z·dz/2)/dz²,
 * k̃x = k̃·sinθ·cosφ, k̃y = k̃·sinθ·sinφ, k̃z = k̃·cosθ (θ from the z axis, φ from the x axis in
 * the xy plane). As in 2D the right side increases with k̃ up to the edge of the first
 * Brillouin zone along the direction, min over axes of π/(|uᵢ|·Δᵢ), and the physical root is
 * the one in (0, that edge]; above the frequency at which the left side passes the right
 * side there, or above 1/(2·dt), no real root exists.
 */

/** Newton iterations allowed in {@link numericalWavenumber3d}; bisection keeps each inside the bracket. */
const MAX_ITERATIONS = 200;

function checkPositive(pairs: [string, number][]): void {
  for (const [name, value] of pairs) {
    if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be finite and > 0, got ${value}`);
  }
}

/**
 * Courant stability limit of the 3D Yee scheme: S = c·dt/Δmin ≤ 1/(Δmin·√(1/dx² + 1/dy² + 1/dz²)),
 * 1/√3 for cubic cells. Source: Taflove & Hagness, Computational Electrodynamics, 3rd ed.,
 * ch. 4 (chapter from memory).
 *
 * @param dx - cell size along x, m
 * @param dy - cell size along y, m
 * @param dz - cell size along z, m
 * @returns the largest stable Courant number c·dt/min(dx, dy, dz), dimensionless
 * @throws RangeError when a cell size is not finite and > 0
 *
 * @example
 * stabilityLimit3d(1e-3, 1e-3, 1e-3); // 0.5773502691896258 (1/√3)
 */
export function stabilityLimit3d(dx: number, dy: number, dz: number): number {
  checkPositive([['dx', dx], ['dy', dy], ['dz', dz]]);
  return 1 / (Math.min(dx, dy, dz) * Math.sqrt(1 / (dx * dx) + 1 / (dy * dy) + 1 / (dz * dz)));
}

/**
 * Numerical wavenumber k̃ of the 3D Yee grid at frequency f along the direction (θ, φ): the
 * root in (0, zone edge] of the 3D relation (module comment), by Newton's method from the
 * exact k = 2πf/c, kept inside a shrinking bracket by bisection whenever a step would leave
 * it (at most 200 iterations). f = 0 gives 0. Source: Taflove & Hagness, Computational
 * Electrodynamics, 3rd ed., ch. 4 (chapter from memory).
 *
 * @param f - frequency, Hz (finite, ≥ 0)
 * @param theta - angle from the z axis, rad
 * @param phi - angle from the x axis in the xy plane, rad
 * @param dx - cell size along x, m
 * @param dy - cell size along y, m
 * @param dz - cell size along z, m
 * @param dt - time step, s
 * @param c - wave speed in the medium, m/s
 * @returns k̃, rad/m, or NaN above the grid's cutoff in that direction
 * @throws RangeError when an argument is out of range (the message names it)
 *
 * @example
 * // 20 cells per wavelength along z, cubic cells, S = 0.5
 * numericalWavenumber3d(299792458 / 0.02, 0, 0, 1e-3, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // ≈ 315.1388 rad/m (k = 314.1593)
 */
export function numericalWavenumber3d(
  f: number, theta: number, phi: number, dx: number, dy: number, dz: number, dt: number, c: number,
): number {
  if (!(f >= 0) || !Number.isFinite(f)) throw new RangeError(`f must be finite and ≥ 0, got ${f}`);
  if (!Number.isFinite(theta)) throw new RangeError(`theta must be finite, got ${theta}`);
  if (!Number.isFinite(phi)) throw new RangeError(`phi must be finite, got ${phi}`);
  checkPositive([['dx', dx], ['dy', dy], ['dz', dz], ['dt', dt], ['c', c]]);
  if (f === 0) return 0;
  const cells = [dx, dy, dz];
  const cosines = [Math.abs(Math.sin(theta) * Math.cos(phi)), Math.abs(Math.sin(theta) * Math.sin(phi)), Math.abs(Math.cos(theta))];
  const spatial = (k: number): number => {
    let sum = 0;
    for (let i = 0; i < 3; i++) {
      const s = Math.sin((k * cosines[i] * cells[i]) / 2) / cells[i];
      sum += s * s;
    }
    return sum;
  };
  const slope = (k: number): number => {
    let sum = 0;
    for (let i = 0; i < 3; i++) sum += (cosines[i] * Math.sin(k * cosines[i] * cells[i])) / (2 * cells[i]);
    return sum;
  };
  let kMax = Number.POSITIVE_INFINITY;
  for (let i = 0; i < 3; i++) if (cosines[i] > 0) kMax = Math.min(kMax, Math.PI / (cosines[i] * cells[i]));
  const halfPhase = Math.PI * f * dt;
  const target = Math.sin(halfPhase) / (c * dt);
  const target2 = target * target;
  if (halfPhase > Math.PI / 2 || spatial(kMax) < target2) return Number.NaN;
  const k = (2 * Math.PI * f) / c;
  let lo = 0;
  let hi = kMax;
  let kt = k < kMax ? k : 0.5 * kMax;
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
    const residual = spatial(kt) - target2;
    if (residual === 0) return kt;
    if (residual < 0) lo = kt;
    else hi = kt;
    let next = kt - residual / slope(kt);
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - kt) <= 4 * Number.EPSILON * kt) return next;
    kt = next;
  }
  return kt;
}

/**
 * Phase lag of the 3D Yee grid per wavelength travelled along (θ, φ), 360·(k̃ − k)/k
 * degrees, positive when the grid lags. Source: Taflove & Hagness, Computational
 * Electrodynamics, 3rd ed., ch. 4 (chapter from memory). f = 0 gives 0 (the limit); NaN
 * above the cutoff.
 *
 * @param f - Hz; theta, phi - rad (as {@link numericalWavenumber3d}); dx, dy, dz - m;
 *   dt - s; c - m/s
 * @returns degrees per wavelength
 * @throws RangeError as {@link numericalWavenumber3d}
 *
 * @example
 * phaseLagPerWavelength3dDeg(299792458 / 0.02, 0, 0, 1e-3, 1e-3, 1e-3, 0.5e-3 / 299792458, 299792458); // ≈ 1.122
 */
export function phaseLagPerWavelength3dDeg(
  f: number, theta: number, phi: number, dx: number, dy: number, dz: number, dt: number, c: number,
): number {
  const kt = numericalWavenumber3d(f, theta, phi, dx, dy, dz, dt, c);
  if (f === 0) return 0;
  const k = (2 * Math.PI * f) / c;
  return (360 * (kt - k)) / k;
}

/** θ of the body diagonal (1, 1, 1)/√3, rad. */
const DIAGONAL_THETA = Math.acos(1 / Math.sqrt(3));

/**
 * Phase lag per wavelength, degrees, of the 3D Yee grid with cubic cells along an axis or
 * along the body diagonal (1, 1, 1)/√3, for a given resolution and Courant number
 * S = c·dt/Δ. The grid is solved in units of the cell (Δ = 1, c = 1, dt = S, f = 1/N) by
 * {@link numericalWavenumber3d}. Source: Taflove & Hagness, Computational
 * Electrodynamics, 3rd ed., ch. 4 (chapter from memory).
 *
 * @param cellsPerWavelength - N = λ/Δ (> 0)
 * @param courant - S = c·dt/Δ (> 0; stable up to 1/√3)
 * @param along - 'axis' or 'diagonal'
 * @returns degrees per wavelength, or NaN above the cutoff
 * @throws RangeError when N or S is not finite and > 0
 *
 * @example
 * cubicPhaseLagDeg(20, 0.5, 'axis');     // ≈ 1.122
 * cubicPhaseLagDeg(20, 0.5, 'diagonal'); // ≈ 0.124, much smaller
 */
export function cubicPhaseLagDeg(cellsPerWavelength: number, courant: number, along: 'axis' | 'diagonal'): number {
  checkPositive([['cellsPerWavelength', cellsPerWavelength], ['courant', courant]]);
  const [theta, phi] = along === 'axis' ? [0, 0] : [DIAGONAL_THETA, Math.PI / 4];
  return phaseLagPerWavelength3dDeg(1 / cellsPerWavelength, theta, phi, 1, 1, 1, courant, 1);
}

/** What {@link project3d} needs. */
export interface Projection3dInput {
  /** Phase budget across the structure, degrees (> 0). */
  budgetDeg: number;
  /** Size of the structure along the path of the wave, wavelengths in the medium (> 0). */
  sizeWavelengths: number;
  /** Courant number as a fraction of the stability limit, in (0, 1]: the user's 2D S over the 2D limit. */
  courantFraction: number;
  /** Frequency at which the budget applies (the highest of interest), Hz. */
  frequency: number;
  /** Wave speed in the medium, m/s (c0/√εr; the medium is taken as lossless and non-dispersive). */
  waveSpeed: number;
  /** Extent of the region to model, X, Y, Z in m, absorber not included. */
  volume: [number, number, number];
  /** Absorber (CPML) thickness in cells on each of the six sides (whole number ≥ 0). */
  absorberCells: number;
  /** Simulated time, s. */
  simulatedTime: number;
  /** Speed of the 3D engine, millions of Yee cells (all six field components) updated per second. */
  mcellsPerSecond: number;
  /** A floor on the resolution from geometry (the thinnest feature), cells per wavelength; default none. */
  minCellsPerWavelength?: number;
}

/** What {@link project3d} returns. */
export interface Projection3d {
  /** Cells per wavelength used: {@link Projection3d.cellsPerWavelengthMin} rounded up to a whole number. */
  cellsPerWavelength: number;
  /** The coarsest resolution meeting the budget, a real number of cells per wavelength. */
  cellsPerWavelengthMin: number;
  /** Cubic cell size, m. */
  dx_m: number;
  /** Courant number c·dt/dx, the requested fraction of 1/√3. */
  courant: number;
  /** Time step, s. */
  dt_s: number;
  /** Cells along x, y, z, absorber included. */
  nx: number;
  ny: number;
  nz: number;
  /** nx·ny·nz. */
  cells: number;
  /** Field memory plus CPML ψ memory, bytes. */
  memory_bytes: number;
  /** Time steps: simulated time / dt, rounded up. */
  steps: number;
  /** cells·steps / (mcells_per_second·1e6), s. */
  seconds: number;
  /** The speed the run time assumes, Mcells/s (as given). */
  mcells_per_second: number;
  /** Which requirement set the resolution: the phase budget, or the geometry floor. */
  governedBy: 'dispersion' | 'feature';
}

function checkInput(input: Projection3dInput): void {
  checkPositive([
    ['budgetDeg', input.budgetDeg], ['sizeWavelengths', input.sizeWavelengths], ['frequency', input.frequency],
    ['waveSpeed', input.waveSpeed], ['volume[0]', input.volume[0]], ['volume[1]', input.volume[1]],
    ['volume[2]', input.volume[2]], ['simulatedTime', input.simulatedTime], ['mcellsPerSecond', input.mcellsPerSecond],
  ]);
  if (!(input.courantFraction > 0 && input.courantFraction <= 1)) {
    throw new RangeError(`courantFraction must be in (0, 1], got ${input.courantFraction}`);
  }
  if (!Number.isInteger(input.absorberCells) || input.absorberCells < 0) {
    throw new RangeError(`absorberCells must be a whole number ≥ 0, got ${input.absorberCells}`);
  }
}

/** Cells across a length, rounded up; a length within 1e-9 of a whole number of cells is not rounded up past it. */
function cellsAcross(length: number, dx: number): number {
  return Math.ceil(length / dx - 1e-9);
}

/**
 * Projects a resolution choice onto a 3D Yee run with cubic cells and a CPML on all six
 * sides: the coarsest resolution whose worst-direction phase lag across the structure
 * stays within the budget, and the grid, memory and run time it implies.
 *
 * Assumptions, all of them:
 * - Lossless, non-dispersive medium with wave speed c = `waveSpeed`; wavelength λ = c/f.
 * - Cubic cells, Courant number S = courantFraction/√3 (the same fraction of the 3D limit
 *   as the 2D run's S is of the 2D limit), dt = S·dx/c.
 * - The worst direction is along an axis (checked over directions in the tests): the
 *   requirement is cubicPhaseLagDeg(N, S, 'axis')·sizeWavelengths ≤ budgetDeg. Its real
 *   root N* (the lag falls as N grows; found by bisection to 1e-12 relative) is
 *   `cellsPerWavelengthMin`; `cellsPerWavelength` = ⌈N*⌉, the next whole number of cells
 *   per wavelength (N* itself when it is whole to within 1e-12); dx = λ/⌈N*⌉.
 * - Grid: n = ⌈length/dx⌉ + 2L along each axis (L = absorberCells; a length within 1e-9
 *   cell of a whole number of cells counts as that number), cells = nx·ny·nz.
 * - Memory: 24 bytes per cell for the six float32 field components; plus CPML ψ, one
 *   float32 for each of the 4 field components with a derivative normal to a layer, in
 *   every cell of that layer (a layer normal to x holds ψ for Ey, Ez, Hy, Hz). Each pair of
 *   layers spans the whole grid across the other two axes, so where layers overlap (edges
 *   of the box, 8 ψ per cell; corners, 12) each axis keeps its own ψ:
 *   ψ bytes = 16·2L·(ny·nz + nx·nz + nx·ny). Material and coefficient arrays, probes and
 *   sources are not counted (a homogeneous medium with 1D coefficient profiles).
 * - Time: steps = ⌈simulatedTime/dt⌉; seconds = cells·steps/(mcellsPerSecond·1e6), with
 *   one "cell" update meaning all six components of one Yee cell. The 2D engine's Mcells/s
 *   (three components per node) is not this speed; the caller states the 3D speed.
 * Source: the 3D Yee dispersion relation and stability limit (Taflove & Hagness,
 * Computational Electrodynamics, 3rd ed., ch. 4, chapter from memory); the CPML auxiliary
 * variables (Roden & Gedney 2000); the rest is counting.
 *
 * @param input - see {@link Projection3dInput} (units there)
 * @returns see {@link Projection3d}
 * @throws RangeError when an input is out of range (the message names it), or when no
 *   resolution up to 10⁷ cells per wavelength meets the budget
 *
 * @example
 * project3d({ budgetDeg: 10, sizeWavelengths: 5, courantFraction: 0.99, frequency: 1e10,
 *   waveSpeed: 299792458, volume: [0.1, 0.1, 0.05], absorberCells: 10,
 *   simulatedTime: 2e-9, mcellsPerSecond: 200 });
 * // cellsPerWavelength 15 (N* ≈ 14.27), dx ≈ 1.999 mm, 71 × 71 × 46 = 231 886 cells,
 * // 9 268 624 bytes, 525 steps, ≈ 0.61 s
 */
export function project3d(input: Projection3dInput): Projection3d {
  checkInput(input);
  const courant = input.courantFraction / Math.sqrt(3);
  const excess = (cells: number): number => cubicPhaseLagDeg(cells, courant, 'axis') * input.sizeWavelengths - input.budgetDeg;
  // Along an axis a real root needs sin(πS/N) ≤ S, i.e. N ≥ πS/asin(S).
  let lo = (Math.PI * courant) / Math.asin(courant);
  let hi = 2 * lo;
  while (!(excess(hi) <= 0)) {
    lo = hi;
    hi *= 2;
    if (hi > 1e7) throw new RangeError(`no resolution up to 1e7 cells per wavelength keeps the phase lag within ${input.budgetDeg}°`);
  }
  for (let iteration = 0; iteration < 200 && hi - lo > 1e-12 * hi; iteration++) {
    const mid = 0.5 * (lo + hi);
    if (excess(mid) <= 0) hi = mid;
    else lo = mid;
  }
  const cellsPerWavelengthMin = hi;
  const byFeature = (input.minCellsPerWavelength ?? 0) > cellsPerWavelengthMin;
  const cellsPerWavelength = Math.ceil((byFeature ? input.minCellsPerWavelength as number : cellsPerWavelengthMin) * (1 - 1e-12));
  const wavelength = input.waveSpeed / input.frequency;
  const dx = wavelength / cellsPerWavelength;
  const dt = (courant * dx) / input.waveSpeed;
  const L = input.absorberCells;
  const [nx, ny, nz] = input.volume.map((length) => cellsAcross(length, dx) + 2 * L);
  const cells = nx * ny * nz;
  const psiBytes = 16 * 2 * L * (ny * nz + nx * nz + nx * ny);
  const steps = Math.ceil(input.simulatedTime / dt);
  return {
    cellsPerWavelength,
    cellsPerWavelengthMin,
    dx_m: dx,
    courant,
    dt_s: dt,
    nx,
    ny,
    nz,
    cells,
    memory_bytes: 24 * cells + psiBytes,
    steps,
    seconds: (cells * steps) / (input.mcellsPerSecond * 1e6),
    mcells_per_second: input.mcellsPerSecond,
    governedBy: byFeature ? 'feature' : 'dispersion',
  };
}
