// Speed of the media engine (assembly/media.ts) beside the lossless engine, in million cell
// updates per second (nx·ny·steps / seconds / 1e6), on the benchmark grids of `gridgauge
// bench` (square 1 mm cells, S = 0.5, 10-cell CPML, a 15 GHz pulse in the middle) with the
// background medium swapped, plus a PEC cylinder of radius n/10 cells; and the bytes per
// cell the extra arrays take, from memoryBytes. Every variant is stepped 200 steps first,
// then timed in short alternating runs by this process's CPU time (so that time spent
// waiting for a core is not counted): the median, and the best run, which is closest to what
// the machine gives when nothing else runs. Not a timed test: run it on a quiet machine
// (check `uptime`); under load, caches shared with other processes still slow every run.
// Run: npx tsx scripts/bench-media.mts [--sizes 256,1024] [--runs 30]
import { benchScenario } from '../src/engine/bench-scenario.ts';
import type { ComponentPatch, MaterialMap } from '../src/engine/material-map.ts';
import { MediaSimulation } from '../src/engine/media-simulation.ts';
import { Simulation } from '../src/engine/simulation.ts';
import { loadEngineModule, loadMediaModule } from '../src/engine/wasm.ts';
import type { Medium, Polarization, Scenario } from '../src/scenario/types.ts';

const args = process.argv.slice(2);
const option = (name: string, fallback: string) => {
  const at = args.indexOf(`--${name}`);
  return at >= 0 ? args[at + 1] : fallback;
};
const sizes = option('sizes', '256,1024').split(',').map(Number);
const runs = Number(option('runs', '30'));

interface Variant { name: string; engine: 'lossless' | 'media'; medium: Medium; polarization?: Polarization; cylinder?: boolean }
const debye: Medium = { epsR: 1, poles: [{ kind: 'debye', deltaEps: 2, tau: 1e-11 }] };
const variants: Variant[] = [
  { name: 'lossless engine (reference)', engine: 'lossless', medium: { epsR: 1 } },
  { name: 'media, lossless', engine: 'media', medium: { epsR: 1 } },
  { name: 'media, σ only', engine: 'media', medium: { epsR: 1, sigma: 0.01 } },
  { name: 'media, 1 Debye pole', engine: 'media', medium: debye },
  { name: 'media, 1 Drude pole', engine: 'media', medium: { epsR: 1, poles: [{ kind: 'drude', omegaP: 1e11, gamma: 1e10 }] } },
  { name: 'media, 1 Lorentz pole', engine: 'media', medium: { epsR: 1, poles: [{ kind: 'lorentz', deltaEps: 1, omega0: 1e11, delta: 1e9 }] } },
  { name: 'media, Debye + Drude (2 poles)', engine: 'media', medium: { epsR: 1, poles: [...(debye.poles ?? []), { kind: 'drude', omegaP: 1e11, gamma: 1e10 }] } },
  { name: 'media, TEz lossless', engine: 'media', medium: { epsR: 1 }, polarization: 'TEz' },
  { name: 'media, TEz 1 Debye pole', engine: 'media', medium: debye, polarization: 'TEz' },
  { name: 'media, lossless, PEC cylinder', engine: 'media', medium: { epsR: 1 }, cylinder: true },
  { name: 'media, TEz lossless, PEC cylinder', engine: 'media', medium: { epsR: 1 }, polarization: 'TEz', cylinder: true },
];

/** PEC points of a cylinder of radius n/10 cells centred 3n/10 cells left of the source. */
function cylinder(n: number, polarization: Polarization, medium: Medium): MaterialMap {
  const cx = Math.floor(n / 2) - Math.round((3 * n) / 10);
  const cy = Math.floor(n / 2);
  const r = n / 10;
  const inside = (x: number, y: number) => (x - cx) ** 2 + (y - cy) ** 2 <= r * r;
  const a: ComponentPatch[] = [];
  const b: ComponentPatch[] = [];
  const c: ComponentPatch[] = [];
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      const k = j * n + i;
      if (inside(i, j)) a.push({ k, kind: 'pec' });
      if (polarization === 'TEz' && inside(i, j + 0.5)) b.push({ k, kind: 'pec' });
      if (polarization === 'TEz' && inside(i + 0.5, j)) c.push({ k, kind: 'pec' });
    }
  }
  return { polarization, background: medium, a, b, c, nodesPerObject: [a.length + b.length + c.length] };
}

const now = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e6;
};
const median = (xs: number[]) => {
  const s = [...xs].sort((p, q) => p - q);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

const lossless = await loadEngineModule();
const media = await loadMediaModule();
const os = await import('node:os');
console.log(`media engine benchmark: ${runs} alternating runs per variant; load average ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
for (const n of sizes) {
  // About 0.06 s a run at 2000 Mcells/s.
  const steps = Math.max(4, Math.round((0.06 * 2e9) / (n * n)));
  const total = 200 + (runs + 1) * steps;
  const sims = variants.map((v) => {
    const s: Scenario = { ...benchScenario(n, total), medium: v.medium, ...(v.polarization ? { polarization: v.polarization } : {}) };
    const map = v.cylinder ? cylinder(n, v.polarization ?? 'TMz', v.medium) : undefined;
    const sim = v.engine === 'lossless' ? new Simulation(lossless, s) : new MediaSimulation(media, s, {}, map);
    sim.step(200);
    return sim;
  });
  const speeds = variants.map(() => [] as number[]);
  for (let r = 0; r < runs; r++) {
    sims.forEach((sim, v) => {
      const t0 = now();
      sim.step(steps);
      speeds[v].push((n * n * steps) / (now() - t0) / 1e6);
    });
  }
  const plainMedia = sims[1] as MediaSimulation;
  console.log(`\n${n} × ${n}, ${steps} steps a run`);
  console.log('  variant                              median Mcells/s  (× lossless)   best Mcells/s  (× lossless)   extra bytes/cell');
  const reference = median(speeds[0]);
  const referenceBest = Math.max(...speeds[0]);
  variants.forEach((v, k) => {
    const m = median(speeds[k]);
    const best = Math.max(...speeds[k]);
    const extra = k === 0 ? '' : ((sims[k].memoryBytes - plainMedia.memoryBytes) / (n * n)).toFixed(2);
    console.log(`  ${v.name.padEnd(36)} ${m.toFixed(0).padStart(8)}  ${('(' + (m / reference).toFixed(2) + ')').padStart(12)}   ${best.toFixed(0).padStart(13)}  ${('(' + (best / referenceBest).toFixed(2) + ')').padStart(12)}   ${extra.padStart(16)}`);
  });
  console.log(`  (media engine, lossless: ${((plainMedia.memoryBytes - sims[0].memoryBytes) / (n * n)).toFixed(2)} bytes/cell beyond the lossless engine; fields a, b, c are 12 bytes/cell in both)`);
  sims.forEach((s) => s.dispose());
}
