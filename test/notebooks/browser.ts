// Starts the notebook server (vite, programmatically, on a free loopback port) and Debian's
// Chromium (playwright-core, never a downloaded browser, never the GPU); stops both afterwards.
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { createServer as netServer } from 'node:net';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { createServer, type ViteDevServer } from 'vite';

export const REPO = join(import.meta.dirname, '..', '..');
export const SCREENSHOTS = join(REPO, 'test-results', 'screenshots');
export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'];

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = netServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

export interface Harness {
  base: string;
  server: ViteDevServer;
  browser: Browser;
  close(): Promise<void>;
}

export async function startHarness(): Promise<Harness> {
  const port = await freePort();
  // Each server gets its own dependency cache, so test files running in parallel never race on
  // node_modules/.vite.
  const cacheDir = mkdtempSync(join(tmpdir(), 'sl-vite-'));
  const server = await createServer({
    configFile: join(REPO, 'vite.config.ts'),
    mode: 'development',
    logLevel: 'error',
    cacheDir,
    server: { port, strictPort: true, host: '127.0.0.1', hmr: false },
  });
  await server.listen();
  // playwright's launch() gives Chromium a fresh temporary profile (user-data-dir) of its own.
  let browser: Browser;
  try {
    browser = await chromium.launch({ executablePath: CHROMIUM, headless: true, args: CHROMIUM_ARGS });
  } catch (e) {
    await server.close();
    rmSync(cacheDir, { recursive: true, force: true });
    throw e;
  }
  mkdirSync(SCREENSHOTS, { recursive: true });
  return {
    base: `http://127.0.0.1:${port}`,
    server,
    browser,
    async close() {
      await browser.close();
      await server.close();
      rmSync(cacheDir, { recursive: true, force: true });
    },
  };
}

/** A page at 1280×800 that records console errors and uncaught page errors. */
export async function openPage(h: Harness, path: string, context?: BrowserContext): Promise<{ page: Page; errors: string[]; context: BrowserContext }> {
  const ctx = context ?? await h.browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
  const page = await ctx.newPage();
  const errors: string[] = [];
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  page.on('pageerror', (e) => errors.push(String(e)));
  await page.goto(h.base + path, { waitUntil: 'load' });
  return { page, errors, context: ctx };
}

/** Waits until the named notebook's cells have all settled. */
export async function settled(page: Page, notebook: string): Promise<void> {
  await page.waitForFunction((n) => Boolean((window as any).strainledger?.[n]), notebook, { timeout: 30_000 });
  await page.evaluate((n) => (window as any).strainledger[n].idle(), notebook);
}
