#!/usr/bin/env node
// The gridgauge command. Node 20 cannot load TypeScript itself, so the sources run through
// tsx's loader; the engine itself is build/engine.wasm (npm install builds it).
import { register } from 'tsx/esm/api';

register();
// A reader that closes early (`| head`) is not an error of ours.
process.stdout.on('error', (e) => { if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0); else throw e; });
try {
  const { main } = await import('../src/cli/main.ts');
  process.exitCode = await main(process.argv.slice(2));
} catch (e) {
  process.stderr.write(`gridgauge: could not start: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 1;
}
