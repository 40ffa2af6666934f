// The notebook server and browser every notebook benchmark uses: vite (programmatically, on a free
// loopback port, no HMR) and Debian's Chromium through playwright-core (headless, --disable-gpu;
// CHROMIUM_PATH overrides /usr/bin/chromium). One place for the launch code, so the benchmarks
// start the page the same way and measure the same thing (the tests' twin: test/notebooks/browser.ts).
import { createServer as netServer } from 'node:net';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { createServer } from 'vite';

const repo = join(import.meta.dirname, '..');
export const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'];

function freePort() {
  return new Promise((resolve, reject) => {
    const s = netServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => { const p = s.address().port; s.close(() => resolve(p)); });
  });
}

/**
 * Starts the notebook dev server and Chromium. Returns `{ base, browser, close }`; call `close()` in a
 * `finally` (it stops the browser, then the server).
 */
export async function startNotebooks() {
  const port = await freePort();
  const server = await createServer({ configFile: join(repo, 'vite.config.ts'), mode: 'development', logLevel: 'error', server: { port, strictPort: true, host: '127.0.0.1', hmr: false } });
  await server.listen();
  let browser;
  try {
    browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: CHROMIUM_ARGS });
  } catch (e) {
    await server.close();
    throw e;
  }
  return {
    base: `http://127.0.0.1:${port}`,
    browser,
    async close() {
      await browser.close();
      await server.close();
    },
  };
}

/**
 * Opens a notebook (`name`, optionally with a query, e.g. `design?sync`) in a 1280×800 page and waits
 * until its cells have settled (`window.strainledger[name].idle()`). Returns the page.
 */
export async function openNotebook(nb, name, query = '') {
  const page = await nb.browser.newPage({ viewport: { width: 1280, height: 800 } });
  await page.goto(`${nb.base}/${name}/${query ? `?${query}` : ''}`);
  await page.waitForFunction((n) => Boolean(window.strainledger?.[n]), name, { timeout: 60_000 });
  await page.evaluate((n) => window.strainledger[n].idle(), name);
  return page;
}
