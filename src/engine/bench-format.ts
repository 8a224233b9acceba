/**
 * The engine benchmark's report as aligned text for a terminal (`gridgauge bench`).
 */
import type { BenchReport } from './bench.ts';

/** The report as aligned text for a terminal. */
export function formatBenchReport(r: BenchReport): string {
  const pad = (x: string | number, w: number) => String(x).padStart(w);
  const pct = (x: number | null) => (x === null ? 'n/a' : `${x >= 0 ? '+' : ''}${x.toFixed(1)} %`);
  const lines: string[] = [];
  const env = r.environment;
  lines.push(`gridgauge engine benchmark (${env.runtime}; ${env.cores} cores, load average ${env.loadAverage.join(' ') || 'n/a'})`);
  lines.push(`10-cell CPML on all sides; medians of ${r.runs} runs of about ${r.run_seconds} s, engine and plain TypeScript alternating.`);
  lines.push('');
  lines.push(`${pad('grid', 11)}  ${pad('engine', 7)}  ${pad('plain TS', 8)}  ${pad('ratio', 5)}  ${pad('B/cell', 6)}  ${pad('implied', 7)}  ${pad('of bw', 5)}  ${pad('probes+DFT', 10)}  ${pad('by CPU time: engine', 19)}  ${pad('plain TS', 8)}`);
  lines.push(`${pad('', 11)}  ${pad('Mcells/s', 7)}  ${pad('Mcells/s', 8)}  ${pad('', 5)}  ${pad('', 6)}  ${pad('GB/s', 7)}  ${pad('', 5)}  ${pad('', 10)}  ${pad('Mcells/s', 19)}  ${pad('Mcells/s', 8)}`);
  for (const x of r.results.filter((row) => row.medium === 'lossless')) {
    lines.push([
      pad(`${x.nx} × ${x.ny}`, 11), pad(x.engine_mcells, 7), pad(x.plain_ts_mcells, 8), pad(x.ratio.toFixed(2), 5),
      pad(x.bytes_per_cell.toFixed(1), 6), pad(x.implied_GBps.toFixed(1), 7), pad(`${x.bandwidth_share_pct} %`, 5),
      pad(pct(x.probes_overhead_pct), 10), pad(x.engine_cpu_mcells ?? 'n/a', 19), pad(x.plain_ts_cpu_mcells ?? 'n/a', 8),
    ].join('  '));
  }
  lines.push('');
  const bw = r.memoryBandwidth;
  lines.push(`memory bandwidth ${r.memoryBandwidth_GBps.toFixed(1)} GB/s: the larger of three arrays read and rewritten in wasm (${bw.stream3_GBps.toFixed(1)} GB/s)`);
  lines.push(`  and a copy (${bw.copy_GBps.toFixed(1)} GB/s), over ${(bw.bytes / 2 ** 20).toFixed(0)} MiB.`);
  lines.push('B/cell: bytes a step must move per cell update if each field and ψ value is read and written once;');
  lines.push('  implied = B/cell × engine Mcells/s; "of bw" is its share of the memory bandwidth. Grids whose');
  lines.push(`  fields fit in the caches (${r.results.filter((x) => x.field_bytes <= 2 ** 20).map((x) => `${x.nx}²`).join(', ') || 'none here'} at 1 MiB or less) move less than that to memory.`);
  lines.push('probes+DFT: extra time with 10 probes, 2 lines of 200 nodes and 3 running DFT frequencies.');
  const media = r.results.filter((row) => row.medium !== 'lossless');
  if (media.length) {
    lines.push('');
    lines.push('media engine, timed in alternation with the lossless engine on the same grid:');
    for (const x of media) {
      lines.push(`  ${pad(`${x.nx} × ${x.ny}`, 11)}  ${pad(x.medium, 6)}  ${pad(x.engine_mcells, 6)} Mcells/s  (lossless ${x.lossless_engine_mcells}; ratio ${x.ratio_to_lossless?.toFixed(2)})  ` +
        `plain TS ${x.plain_ts_mcells}  extra memory ${x.extra_bytes_per_cell} B/cell`);
    }
  }
  const s = r.speedOverRun;
  if (s) {
    lines.push('');
    lines.push(`speed through a ${s.nx} × ${s.ny} run, ${s.windows.length} windows of ${s.window} steps (CPU time): early (steps 0–300) ${s.early_mcells},`);
    lines.push(`  late (last 500 steps) ${s.late_mcells} Mcells/s; the same grid with no source, stepped alternately: ${s.zero_field_mcells} Mcells/s.`);
    if (s.subnormal_steps) {
      lines.push(`  Subnormal field values (the band at the numerical wave front, at most ${s.max_subnormals} of ${3 * s.nx * s.ny} at step ${s.max_subnormals_step})`);
      lines.push(`  were present in steps ${s.subnormal_steps[0]}–${s.subnormal_steps[1]}: ${s.with_subnormals_mcells} Mcells/s there, ${pct(s.subnormal_slowdown_pct)} time against the twin.`);
    } else {
      lines.push('  No subnormal field values appeared.');
    }
  }
  return lines.join('\n');
}
