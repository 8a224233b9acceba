/**
 * Stability of the media engine's pole updates (README "Materials"): conductivity and Debye
 * poles need nothing beyond the Courant limit with c∞ = c0/√ε∞, but the explicit Drude and
 * Lorentz updates do (a von Neumann analysis of the scheme's dispersion relation
 * μ0ε0ε̃r(ω)Ω² = K², all of whose roots Ω² must lie in [0, 4/dt²) for every grid wavenumber
 * up to the largest, K²c∞²dt² = 4s², s = the Courant number over its 2D limit; exact for
 * γ = 0 and δ = 0, damping only helps):
 *   Drude   ωp·dt < 2·√ε∞·√(1 − s²);
 *   Lorentz ω0·dt < 2·√(ε∞(1 − s²)/(εs − ε∞·s²)), εs = ε∞ + Δε.
 */
import { stabilityLimit, timeStep } from './layout.ts';
import { approx } from './show.ts';
import type { Medium, Problem, Scenario } from './types.ts';

function mediumProblems(m: Medium, path: string, s: Scenario): Problem[] {
  const dt = timeStep(s.grid.courant, s.grid.dx, s.grid.dy, s.medium.epsR);
  const ratio = s.grid.courant / stabilityLimit(s.grid.dx, s.grid.dy);
  const room = 1 - ratio * ratio;
  const out: Problem[] = [];
  (m.poles ?? []).forEach((p, k) => {
    if (p.kind === 'drude') {
      const limit = 2 * Math.sqrt(m.epsR) * Math.sqrt(room);
      if (!(p.omegaP * dt < limit)) {
        out.push({ path: `${path}.poles[${k}].omegaP`, message: `${p.omegaP} rad/s with dt = ${approx(dt)} s gives ωp·dt = ${approx(p.omegaP * dt)}, above the ${approx(limit)} the Drude update stays stable at this Courant number; use a smaller grid.courant or finer cells (ωp·dt below about ${approx(0.9 * limit)})` });
      }
    } else if (p.kind === 'lorentz') {
      const es = m.epsR + p.deltaEps;
      const limit = 2 * Math.sqrt((m.epsR * room) / (es - m.epsR * ratio * ratio));
      if (!(p.omega0 * dt < limit)) {
        out.push({ path: `${path}.poles[${k}].omega0`, message: `${p.omega0} rad/s with dt = ${approx(dt)} s gives ω0·dt = ${approx(p.omega0 * dt)}, above the ${approx(limit)} the Lorentz update stays stable at this Courant number; use a smaller grid.courant or finer cells` });
      }
    }
  });
  return out;
}

/** Pole updates that would be unstable at the scenario's time step, for the medium and every object's material. */
export function poleStabilityProblems(s: Scenario): Problem[] {
  return [
    ...mediumProblems(s.medium, 'medium', s),
    ...(s.objects ?? []).flatMap((o, i) => (o.material === 'pec' ? [] : mediumProblems(o.material, `objects[${i}].material`, s))),
  ];
}
