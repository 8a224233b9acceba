/**
 * Shared set-up for the browser tests and the page benchmark: the built page (dist/,
 * built on demand) served by Vite's preview server on 127.0.0.1 at a free port, and
 * Debian's Chromium driven headless through playwright-core.
 */
import { execSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { createServer } from 'node:net';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type BrowserContext, type ConsoleMessage, type Page } from 'playwright-core';
import { preview, type PreviewServer } from 'vite';

export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
export const ARTIFACTS = join(ROOT, 'test-artifacts');
export const CHROMIUM = '/usr/bin/chromium';
export const CHROMIUM_ARGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
];

/** Builds the page when dist/ is missing (or GRIDGAUGE_REBUILD is set). */
export function ensureBuilt(): void {
  if (existsSync(join(ROOT, 'dist', 'index.html')) && !process.env.GRIDGAUGE_REBUILD) return;
  execSync('npx vite build', { cwd: ROOT, stdio: 'inherit' });
}

function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const server = createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolvePort(port));
    });
  });
}

export interface Harness {
  /** Base URL of the page, ending in "/". */
  url: string;
  browser: Browser;
  server: PreviewServer;
  /** A fresh browser context (own storage) and page; console errors are collected. */
  newPage(options?: { colorScheme?: 'light' | 'dark' }): Promise<{ page: Page; context: BrowserContext; errors: string[] }>;
  close(): Promise<void>;
}

export async function startHarness(): Promise<Harness> {
  if (!existsSync(CHROMIUM)) {
    throw new Error(`${CHROMIUM} is missing: install with apt-get install -y chromium`);
  }
  ensureBuilt();
  mkdirSync(ARTIFACTS, { recursive: true });
  const port = await freePort();
  const server = await preview({
    root: ROOT,
    logLevel: 'silent',
    preview: { host: '127.0.0.1', port, strictPort: true, open: false },
  });
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  const url = `http://127.0.0.1:${port}/`;
  return {
    url, browser, server,
    async newPage(options = {}) {
      const context = await browser.newContext({
        acceptDownloads: true, viewport: { width: 1440, height: 1000 }, colorScheme: options.colorScheme ?? 'light',
      });
      const page = await context.newPage();
      const errors: string[] = [];
      page.on('console', (m: ConsoleMessage) => { if (m.type() === 'error') errors.push(m.text()); });
      page.on('pageerror', (e: Error) => errors.push(`page error: ${e.message}`));
      return { page, context, errors };
    },
    async close() {
      await browser.close();
      await new Promise<void>((done) => server.httpServer.close(() => done()));
    },
  };
}

/** Waits until the page's run is over (finished, stopped or failed) and returns the phase. */
export async function waitForRunEnd(page: Page, timeout = 60_000): Promise<string> {
  await page.waitForFunction(() => {
    const app = document.querySelector('gg-app') as HTMLElement | null;
    const phase = app?.dataset.phase;
    return phase === 'done' || phase === 'stopped' || phase === 'failed';
  }, undefined, { timeout });
  return page.evaluate(() => (document.querySelector('gg-app') as HTMLElement).dataset.phase as string);
}

/** Waits for the comparison of the latest run to be drawn. */
export async function waitForCompareDrawn(page: Page, timeout = 60_000): Promise<void> {
  await page.waitForFunction(() => {
    const app = document.querySelector('gg-app') as (HTMLElement & { store?: { state: { run: { runId: number } } } }) | null;
    return !!app?.dataset.drawnRun && app.dataset.drawnRun === String(app.store?.state.run.runId);
  }, undefined, { timeout });
}
