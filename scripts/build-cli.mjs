// Bundles the command line and the Node study worker into plain JavaScript at build time, so
// `gridgauge` starts without a TypeScript loader: build/cli/gridgauge.mjs (ES module) and
// build/cli/study-worker.cjs (what each worker thread evaluates). Both sit two folders below
// the project root, so the engine's own `new URL('../../build/engine.wasm', import.meta.url)`
// still finds build/engine.wasm. Run by `npm run build` and `npm install` (prepare).
import { build } from 'esbuild';

const common = { bundle: true, platform: 'node', target: 'node20', logLevel: 'warning', legalComments: 'none' };

await build({
  ...common,
  entryPoints: ['src/cli/main.ts'],
  outfile: 'build/cli/gridgauge.mjs',
  format: 'esm',
  define: { 'globalThis.GRIDGAUGE_BUNDLED': 'true' },
  // the engine and its loader are found at run time, never bundled in
  banner: { js: "import { createRequire as gridgaugeRequire } from 'node:module'; const require = gridgaugeRequire(import.meta.url);" },
});

await build({
  ...common,
  entryPoints: ['src/studies/node-worker.ts'],
  outfile: 'build/cli/study-worker.cjs',
  format: 'cjs',
  // a worker gets the compiled engine from its parent; the loader's URL is still computed
  // when the module loads, so give it a location from which ../../build/engine.wasm resolves
  define: { 'import.meta.url': JSON.stringify('file:///gridgauge/build/cli/study-worker.cjs') },
});
