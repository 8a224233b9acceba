/** Speed of light in vacuum, m/s (exact, SI 2019). */
export const C0 = 299_792_458;
/** Vacuum permeability, H/m (CODATA 2018 recommended value). */
export const MU0 = 1.25663706212e-6;
/** Vacuum permittivity, F/m, from ε0 = 1/(μ0·c0²). */
export const EPS0 = 1 / (MU0 * C0 * C0);
/** Impedance of free space, Ω, η0 = μ0·c0. */
export const ETA0 = MU0 * C0;
