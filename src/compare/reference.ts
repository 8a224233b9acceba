/**
 * The exact frequency-domain field of a scenario, where one exists (README "Exact field"):
 * the line source in a homogeneous medium (Hankel function; complex wavenumber in a lossy
 * or dispersive medium), or beside exactly one circular object (the cylinder series).
 * Any other set of objects has no exact reference: `kind` is "none" and every value NaN.
 * Values are field over source: Ez/I in V/m per A (TMz) or Hz/M in A/m per V (TEz).
 */
import { hankel2 as hankel2Complex } from '../exact/bessel.ts';
import { cScale, type Complex } from '../exact/complex.ts';
import { cylinderSeriesSolver, type CylinderInside } from '../exact/cylinder-series.ts';
import { isSimpleMedium, relativePermittivity, wavenumber, wavenumberOf } from '../exact/medium.ts';
import { lineCurrentTransfer } from '../exact/transfer.ts';
import { EPS0, MU0 } from '../scenario/constants.ts';
import { layoutOf, nodeDistance, type Node } from '../scenario/layout.ts';
import type { CircleObject, Scenario } from '../scenario/types.ts';

export type ExactKind = 'hankel' | 'cylinder-series' | 'none';

export interface ExactReference {
  kind: ExactKind;
  /** Field over source at each node at frequency f (NaN at the source node and with kind "none"). */
  transfer(f: number, nodes: readonly Node[]): Complex[];
}

const NAN: Complex = [NaN, NaN];

/** Which exact reference a scenario has. */
export function exactKind(s: Scenario): ExactKind {
  const objects = s.objects ?? [];
  if (objects.length === 0) return 'hankel';
  if (objects.length === 1 && objects[0].shape === 'circle') return 'cylinder-series';
  return 'none';
}

/** −(ωμ0/4) (TMz) or −(ωε0εr(ω)/4) (TEz): the factor in front of H0^(2)(kρ). */
function sourceFactor(s: Scenario, f: number): Complex {
  const w = 2 * Math.PI * f;
  if ((s.polarization ?? 'TMz') === 'TMz') return [-(w * MU0) / 4, 0];
  return cScale(relativePermittivity(s.medium, f), -(w * EPS0) / 4);
}

export function exactReference(s: Scenario): ExactReference {
  const kind = exactKind(s);
  const layout = layoutOf(s);
  const src = layout.source;
  const tmz = (s.polarization ?? 'TMz') === 'TMz';
  if (kind === 'none') return { kind, transfer: (_f, nodes) => nodes.map(() => NAN) };
  if (kind === 'hankel') {
    const simple = isSimpleMedium(s.medium);
    return {
      kind,
      transfer(f, nodes) {
        return nodes.map((node) => {
          const rho = nodeDistance(node, src, layout.dx, layout.dy);
          // the lossless TMz case keeps the real-argument form (outputs as before, bit for bit)
          if (simple && tmz) return lineCurrentTransfer(f, rho, s.medium.epsR);
          if (!(rho > 0) || !(f > 0)) return NAN;
          const k = wavenumber(s.medium, f);
          const h = hankel2Complex(0, [k[0] * rho, k[1] * rho]);
          const a = sourceFactor(s, f);
          return [a[0] * h[0] - a[1] * h[1], a[0] * h[1] + a[1] * h[0]];
        });
      },
    };
  }
  const circle = (s.objects as CircleObject[])[0];
  const polar = (n: { x: number; y: number }) => ({ rho: Math.hypot(n.x - circle.x, n.y - circle.y), phi: Math.atan2(n.y - circle.y, n.x - circle.x) });
  return {
    kind,
    transfer(f, nodes) {
      if (!(f > 0)) return nodes.map(() => NAN);
      const eps1 = relativePermittivity(s.medium, f);
      const inside: CylinderInside = circle.material === 'pec' ? 'pec' : (() => {
        const eps2 = relativePermittivity(circle.material as Exclude<typeof circle.material, 'pec'>, f);
        return { k2: wavenumberOf(eps2, f), eps2 };
      })();
      const solver = cylinderSeriesSolver({
        polarization: tmz ? 'TMz' : 'TEz', k1: wavenumberOf(eps1, f), eps1, inside, radius: circle.radius, source: polar(src),
      });
      const a = sourceFactor(s, f);
      return nodes.map((node) => {
        if (node.i === src.i && node.j === src.j) return NAN;
        const v = solver.at(polar(node)).value;
        return [a[0] * v[0] - a[1] * v[1], a[0] * v[1] + a[1] * v[0]];
      });
    },
  };
}
