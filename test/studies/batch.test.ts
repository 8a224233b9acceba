/**
 * A study through a batch scheduler (README "Batch scheduler round trip"): --emit writes the
 * runs, each is run on its own with `gridgauge run FILE --out DIR/<name>` (here by xargs, as
 * a job array would), and --from scores them. The figures must equal a local study's to the
 * last digit (same engine, same scenarios); a missing, unfinished or foreign run is named
 * and scored as failed. Common practice, no source.
 */
import { execSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { stableText } from '../golden/cases.ts';

const bin = join(process.cwd(), 'bin/gridgauge.js');
const gridgauge = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });
/** The job array: every emitted scenario run in parallel by xargs, as README shows. */
const runAll = (dir: string) => execSync(
  `ls *.json | grep -v '^study.json$' | xargs -P 2 -I{} sh -c '"${process.execPath}" "${bin}" run "$1" --out "\${1%.json}" >/dev/null 2>&1' _ {}`,
  { cwd: dir, shell: '/bin/sh' },
);

const STUDIES: [string, string[]][] = [
  ['absorber', ['absorber-study', 'test/golden/small.json', '--target', '-40', '--cells', '6,10', '--grading-cells', '8', '--orders', '3',
    '--sigma-scales', '1', '--kappa-maxes', '1,5', '--alpha-maxes', '0.05', '--long-run', '2']],
  ['resolution', ['resolution-study', 'test/golden/small.json', '--size', '6', '--budget', '10', '--min-cells', '8', '--max-cells', '12']],
];

describe('batch scheduler round trip', () => {
  for (const [name, args] of STUDIES) {
    it(`${name}: --from gives the local study's JSON (timing fields aside) and names a deleted run`, () => {
      const dir = mkdtempSync(join(tmpdir(), `gridgauge-batch-${name}-`));
      const emitted = gridgauge(...args, '--emit', dir);
      expect(emitted.status).toBe(0);
      const manifest = JSON.parse(readFileSync(join(dir, 'study.json'), 'utf8'));
      expect(manifest.runs.length).toBeGreaterThan(1);
      runAll(dir);
      const local = gridgauge(...args, '--json', '--workers', '2');
      const from = gridgauge(...args, '--json', '--from', dir);
      expect(from.status).toBe(0);
      expect(stableText('x.json', from.stdout)).toBe(stableText('x.json', local.stdout));

      // a run that never came back is named and its candidate scored as failed
      const victim = manifest.runs.find((r: { candidate: string | null }) => r.candidate !== null);
      rmSync(join(dir, victim.out), { recursive: true, force: true });
      const missing = gridgauge(...args, '--json', '--from', dir);
      expect(missing.stderr).toMatch(new RegExp(`failed: run ${victim.out}: summary.json is missing`));
      const failed = JSON.parse(missing.stdout).candidates.filter((c: { error?: string }) => c.error);
      expect(failed.length).toBe(1);

      // a run of another scenario in its place is refused by fingerprint
      const scenario = JSON.parse(readFileSync(join(dir, victim.file), 'utf8'));
      scenario.source.amplitude = 2;
      writeFileSync(join(dir, 'other.json'), JSON.stringify(scenario));
      expect(gridgauge('run', join(dir, 'other.json'), '--out', join(dir, victim.out)).status).toBe(0);
      expect(gridgauge(...args, '--json', '--from', dir).stderr).toMatch(new RegExp(`run ${victim.out} is of another scenario`));
    }, 300_000);
  }
});
