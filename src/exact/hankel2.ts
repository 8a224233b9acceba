import besselj0 from '@stdlib/math-base-special-besselj0';
import bessely0 from '@stdlib/math-base-special-bessely0';

/**
 * Hankel function of the second kind, order zero, of a real argument:
 * H0^(2)(x) = J0(x) − j·Y0(x) (Abramowitz & Stegun 9.1.4; DLMF 10.4.3). With the e^{+jωt}
 * time convention H0^(2)(kρ) is the outgoing cylindrical wave. J0 and Y0 come from
 * @stdlib/math-base-special-besselj0 and -bessely0 (rational approximations ported from
 * Boost.Math), accurate to about double precision.
 *
 * Edge cases: x = 0 gives [1, +Infinity] (Y0 has a logarithmic pole); x = +Infinity gives
 * [0, 0] (the wave has decayed); x < 0, x = −Infinity and NaN give [NaN, NaN] because the
 * function lies on its branch cut there and a real-argument caller never needs it.
 *
 * @param x - argument, dimensionless (kρ for a wave of wavenumber k in rad/m at distance ρ in m)
 * @returns [re, im] of H0^(2)(x), dimensionless
 *
 * @example
 * hankel2(1); // [0.7651976865579666, -0.08825696421567701]
 */
export function hankel2(x: number): [number, number] {
  if (!(x >= 0)) return [Number.NaN, Number.NaN];
  if (x === Number.POSITIVE_INFINITY) return [0, 0];
  return [besselj0(x), -bessely0(x)];
}
