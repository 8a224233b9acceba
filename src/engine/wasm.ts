/**
 * The one loader of build/engine.wasm (and build/media.wasm) for Node, the page and its workers. The module is
 * compiled once per realm; each simulation gets its own instance (and so its own memory,
 * released when the instance is dropped).
 */

export interface EngineExports {
  memory: WebAssembly.Memory;
  allocate(nx: number, ny: number, layer: number, steps: number, probes: number, points: number, frequencies: number, fullGrid: number): number;
  setUpdateCoefficients(cex: number, cey: number, chx: number, chy: number, sourceScale: number, sourceNode: number): void;
  pointerTo(which: number): number;
  /** Address of the table of the full-grid DFTs, 16 bytes each: ω·dt (f64), decimation m and offset r (i32). */
  fullGridTable(): number;
  /** Address of the real (imaginary = 0) or imaginary (1) part of full-grid DFT k. */
  fullGridAt(k: number, imaginary: number): number;
  stepsDone(): number;
  step(count: number): void;
  maxAbsEz(): number;
  /** Reads and rewrites the three fields `passes` times, unchanged (memory-traffic probe). */
  streamFields(passes: number): void;
}

/** Exports of build/media.wasm (assembly/media.ts): lossy and dispersive media, TMz or TEz, objects. */
export interface MediaExports {
  memory: WebAssembly.Memory;
  allocate(
    nx: number, ny: number, layer: number, steps: number, probes: number, points: number, frequencies: number, fullGrid: number,
    polarization: number, slots: number, poles: number, patchA: number, patchB: number, patchC: number, poolSlots: number, corrections: number,
    runsA: number, runsB: number, runsC: number, maskRows: number,
  ): number;
  setCoefficients(
    caA: number, cbxA: number, cbyA: number, cqA: number, caB: number, cbB: number, cqB: number,
    caC: number, cbC: number, cqC: number, backgroundPoles: number, sourceScale: number, sourceNode: number,
  ): void;
  pointerTo(which: number): number;
  fullGridTable(): number;
  fullGridAt(k: number, imaginary: number): number;
  stepsDone(): number;
  step(count: number): void;
  maxAbsA(): number;
}

const engineUrl = new URL('../../build/engine.wasm', import.meta.url);
const mediaUrl = new URL('../../build/media.wasm', import.meta.url);
let compiled: Promise<WebAssembly.Module> | undefined;
let compiledMedia: Promise<WebAssembly.Module> | undefined;

async function compileFrom(url: URL): Promise<WebAssembly.Module> {
  if (url.protocol === 'file:') {
    const fsName = 'node:fs/promises';
    const fs = (await import(/* @vite-ignore */ fsName)) as typeof import('node:fs/promises');
    const bytes = await fs.readFile(url).catch((e: NodeJS.ErrnoException) => {
      throw new Error(`engine not built: ${url.pathname} is missing (${e.code}); run "npm run build:wasm"`);
    });
    return WebAssembly.compile(bytes);
  }
  const response = await fetch(url);
  if (!response.ok) throw new Error(`engine could not be loaded from ${url.href}: HTTP ${response.status}`);
  return WebAssembly.compileStreaming(response);
}

/** The compiled engine module (cached). Pass another URL to load a variant build. */
export function loadEngineModule(url: URL = engineUrl): Promise<WebAssembly.Module> {
  if (url !== engineUrl) return compileFrom(url);
  compiled ??= compileFrom(engineUrl);
  return compiled;
}

/** A fresh engine instance with its own memory. */
export function instantiateEngine(module: WebAssembly.Module): EngineExports {
  const instance = new WebAssembly.Instance(module, {});
  return instance.exports as unknown as EngineExports;
}

/** The compiled media engine module (cached). Pass another URL to load a variant build. */
export function loadMediaModule(url: URL = mediaUrl): Promise<WebAssembly.Module> {
  if (url !== mediaUrl) return compileFrom(url);
  compiledMedia ??= compileFrom(mediaUrl);
  return compiledMedia;
}

/** A fresh media engine instance with its own memory. */
export function instantiateMedia(module: WebAssembly.Module): MediaExports {
  const instance = new WebAssembly.Instance(module, {});
  return instance.exports as unknown as MediaExports;
}
