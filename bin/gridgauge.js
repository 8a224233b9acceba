#!/usr/bin/env node
// The gridgauge command: the command line bundled at build time (build/cli/gridgauge.mjs,
// made by `npm install` and `npm run build`), which needs no TypeScript loader. Without that
// build, or when a source file is newer than it (someone is editing), it runs the TypeScript
// sources through tsx, so it never runs stale code.
import { readdirSync, statSync } from 'node:fs';

const built = new URL('../build/cli/gridgauge.mjs', import.meta.url);

function newestSource(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = new URL(`${entry.name}${entry.isDirectory() ? '/' : ''}`, dir);
    newest = Math.max(newest, entry.isDirectory() ? newestSource(path) : statSync(path).mtimeMs);
  }
  return newest;
}

function builtIsCurrent() {
  try {
    return statSync(built).mtimeMs >= newestSource(new URL('../src/', import.meta.url));
  } catch {
    return false;
  }
}

// A reader that closes early (`| head`) is not an error of ours.
process.stdout.on('error', (e) => { if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0); else throw e; });
try {
  let main;
  if (builtIsCurrent()) {
    ({ main } = await import(built.href));
  } else {
    const { register } = await import('tsx/esm/api');
    register();
    ({ main } = await import('../src/cli/main.ts'));
  }
  process.exitCode = await main(process.argv.slice(2));
} catch (e) {
  process.stderr.write(`gridgauge: could not start: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 1;
}
