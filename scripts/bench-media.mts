// Speed of the media engine (assembly/media.ts) beside the lossless engine, in million cell
// updates per second (nx·ny·steps / seconds / 1e6), on the benchmark grids of `gridgauge
// bench` (square 1 mm cells, S = 0.5, 10-cell CPML, a 15 GHz pulse in the middle) with the
// background medium swapped; and the bytes per cell the extra arrays take, from memoryBytes.
// Every variant is stepped 200 steps first, then timed in alternation with the others
// (CPU time of this process), medians over the runs. Not a timed test: run it on a quiet
// machine (check `uptime`).
// Run: npx tsx scripts/bench-media.mts [--sizes 256,1024] [--runs 7]
import { benchScenario } from '../src/engine/bench-scenario.ts';
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
const runs = Number(option('runs', '7'));

interface Variant { name: string; engine: 'lossless' | 'media'; medium: Medium; polarization?: Polarization }
const variants: Variant[] = [
  { name: 'lossless engine (reference)', engine: 'lossless', medium: { epsR: 1 } },
  { name: 'media, lossless', engine: 'media', medium: { epsR: 1 } },
  { name: 'media, σ only', engine: 'media', medium: { epsR: 1, sigma: 0.01 } },
  { name: 'media, 1 Debye pole', engine: 'media', medium: { epsR: 1, poles: [{ kind: 'debye', deltaEps: 2, tau: 1e-11 }] } },
  { name: 'media, 1 Drude pole', engine: 'media', medium: { epsR: 1, poles: [{ kind: 'drude', omegaP: 1e11, gamma: 1e10 }] } },
  { name: 'media, 1 Lorentz pole', engine: 'media', medium: { epsR: 1, poles: [{ kind: 'lorentz', deltaEps: 1, omega0: 1e11, delta: 1e9 }] } },
  { name: 'media, TEz lossless', engine: 'media', medium: { epsR: 1 }, polarization: 'TEz' },
  { name: 'media, TEz 1 Debye pole', engine: 'media', medium: { epsR: 1, poles: [{ kind: 'debye', deltaEps: 2, tau: 1e-11 }] }, polarization: 'TEz' },
];

const cpu = () => {
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
console.log(`media engine benchmark: ${runs} alternating runs per variant, CPU time; load average ${(await import('node:os')).loadavg().map((x) => x.toFixed(2)).join(' ')}`);
for (const n of sizes) {
  // About 0.15 s a run at 2000 Mcells/s.
  const steps = Math.max(20, Math.round((0.15 * 2e9) / (n * n)));
  const total = 200 + (runs + 1) * steps;
  const sims = variants.map((v) => {
    const s: Scenario = { ...benchScenario(n, total), medium: v.medium, ...(v.polarization ? { polarization: v.polarization } : {}) };
    const sim = v.engine === 'lossless' ? new Simulation(lossless, s) : new MediaSimulation(media, s);
    sim.step(200);
    return sim;
  });
  const speeds = variants.map(() => [] as number[]);
  for (let r = 0; r < runs; r++) {
    sims.forEach((sim, v) => {
      const t0 = cpu();
      sim.step(steps);
      speeds[v].push((n * n * steps) / (cpu() - t0) / 1e6);
    });
  }
  const plainMedia = sims[1] as MediaSimulation;
  console.log(`\n${n} × ${n}, ${steps} steps a run`);
  console.log('  variant                          Mcells/s   of lossless   extra bytes/cell');
  const reference = median(speeds[0]);
  variants.forEach((v, k) => {
    const m = median(speeds[k]);
    const extra = k === 0 ? '' : ((sims[k].memoryBytes - plainMedia.memoryBytes) / (n * n)).toFixed(2);
    console.log(`  ${v.name.padEnd(32)} ${m.toFixed(0).padStart(8)}   ${(m / reference).toFixed(2).padStart(11)}   ${extra.padStart(16)}`);
  });
  console.log(`  (media engine, lossless: ${((plainMedia.memoryBytes - sims[0].memoryBytes) / (n * n)).toFixed(2)} bytes/cell beyond the lossless engine)`);
  sims.forEach((s) => s.dispose());
}
