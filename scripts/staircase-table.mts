// Prints how well each fill represents one circle, against the eigenfunction series:
// |FDTD − exact| / |incident| at f0 near the surface (probes within 0.1 λ) and far (0.5 λ or
// more), worst and RMS over each group of probes, for a PEC post (radius 0.3 λ) and a
// dielectric rod (εr 4, radius 0.25 λ) in TMz and TEz, with the floor the same grid reaches
// without the object (dispersion and absorber), magnitude and phase errors, and the observed
// order fitted over the resolutions. Geometry and measures: test/studies/circle-accuracy-cases.ts.
// Run: npx tsx scripts/staircase-table.mts [--cells 10,20,40,80]   (10, 20, 40 by default;
// about 15 s; 80 adds some 10 s more)
import { measureCircle, observedOrder, PEC_RADIUS, ROD, ROD_RADIUS, type CircleCase, type CircleErrors } from '../test/studies/circle-accuracy-cases.ts';

const at = process.argv.indexOf('--cells');
const text = at >= 0 ? process.argv[at + 1] : process.argv.find((a) => a.startsWith('--cells='))?.slice('--cells='.length);
const cells = (text ?? '10,20,40').split(',').map(Number);
if (cells.some((n) => !Number.isInteger(n) || n < 10 || n % 10 !== 0)) {
  console.error('--cells: give multiples of 10 cells per wavelength, e.g. --cells 10,20,40,80');
  process.exit(2);
}

const cases: (CircleCase & { object: string })[] = [];
for (const polarization of ['TMz', 'TEz'] as const) {
  for (const fill of ['staircase', 'conformal'] as const) cases.push({ object: 'PEC post', polarization, fill, material: 'pec', radius: PEC_RADIUS });
}
for (const polarization of ['TMz', 'TEz'] as const) {
  for (const fill of ['staircase', 'average'] as const) cases.push({ object: 'rod εr 4', polarization, fill, material: ROD, radius: ROD_RADIUS });
}

const e = (v: number) => v.toExponential(2).padStart(10);
const header = ['object    ', 'pol', 'fill     ', 'cells/λ', 'near worst', '  near RMS', ' far worst', '   far RMS', 'floor near', ' floor far', ' |dB| near', '  |°| near', '  |dB| far', '   |°| far'];
console.log('|FDTD − exact| / |incident| at f0 = 10 GHz; near: within 0.1 λ of the surface; floor: the same probes without the object');
console.log(header.join('  '));
const orders: string[] = [];
for (const c of cases) {
  const rows: CircleErrors[] = [];
  for (const n of cells) {
    const r = await measureCircle(c, n);
    rows.push(r);
    console.log([
      c.object.padEnd(10), c.polarization, c.fill.padEnd(9), String(n).padStart(7),
      e(r.near.rel), e(r.near.rms), e(r.far.rel), e(r.far.rms), e(r.near.floor), e(r.far.floor),
      r.near.mag_dB.toFixed(3).padStart(10), r.near.phase_deg.toFixed(2).padStart(10),
      r.far.mag_dB.toFixed(3).padStart(10), r.far.phase_deg.toFixed(2).padStart(10),
    ].join('  '));
  }
  if (cells.length > 1) {
    const o = (pick: (r: CircleErrors) => number) => observedOrder(cells, rows.map(pick)).toFixed(2).padStart(5);
    orders.push(`${c.object.padEnd(10)}  ${c.polarization}  ${c.fill.padEnd(9)}  near worst ${o((r) => r.near.rel)}  near RMS ${o((r) => r.near.rms)}  far worst ${o((r) => r.far.rel)}  far RMS ${o((r) => r.far.rms)}  scattered near ${o((r) => r.near.scattered)}  floor near ${o((r) => r.near.floor)}`);
  }
}
if (orders.length > 0) {
  console.log(`\nobserved order, least-squares slope of log(error) against log(cell size) over ${cells.join(', ')} cells per wavelength`);
  for (const line of orders) console.log(line);
}
