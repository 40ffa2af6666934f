// Notebook latency: from a prestrain-slider `input` event to every dependent cell settled and the
// result painted, over 100 moves in headless Chromium (Debian's /usr/bin/chromium, --disable-gpu).
// "Painted" = the first animation frame after the runtime settled has run and its paint has been
// committed (a message posted from that frame's rAF callback is delivered after the paint).
// Moves are spaced by a seeded pseudo-random 0–20 ms so events land at every phase of the frame.
// Run: node bench/notebook-latency.mjs  (starts and stops its own vite server and browser)
import { createServer as netServer } from 'node:net';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { createServer } from 'vite';

const repo = join(import.meta.dirname, '..');
const MOVES = 100;

const port = await new Promise((resolve, reject) => {
  const s = netServer();
  s.once('error', reject);
  s.listen(0, '127.0.0.1', () => { const p = s.address().port; s.close(() => resolve(p)); });
});
const server = await createServer({ configFile: join(repo, 'vite.config.ts'), mode: 'development', logLevel: 'error', server: { port, strictPort: true, host: '127.0.0.1', hmr: false } });
await server.listen();
const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true,
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
});
try {
  const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
  await page.goto(`http://127.0.0.1:${port}/prestrain/`);
  await page.waitForFunction(() => Boolean(window.strainledger?.prestrain));
  await page.evaluate(() => window.strainledger.prestrain.idle());
  const result = await page.evaluate(async (moves) => {
    const nb = window.strainledger.prestrain;
    const range = document.getElementById('prestrain-range');
    const numbers = document.querySelector('#cell-numbers');
    let seed = 12345;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const painted = () => new Promise((resolve) => requestAnimationFrame(() => {
      const ch = new MessageChannel();
      ch.port1.onmessage = () => resolve(performance.now());
      ch.port2.postMessage(0);
    }));
    const settle = [];
    const paint = [];
    let changed = 0;
    // Warm-up moves (JIT, chart code paths), not counted.
    for (let i = 0; i < 10; i++) { range.value = String(0.05 + i * 0.01); range.dispatchEvent(new Event('input', { bubbles: true })); await nb.idle(); await painted(); }
    for (let i = 0; i < moves; i++) {
      await new Promise((r) => setTimeout(r, rand() * 20));
      const before = numbers.textContent;
      const t0 = performance.now();
      range.value = String(0.2 + (i % 50) * 0.02);
      range.dispatchEvent(new Event('input', { bubbles: true }));
      await nb.idle();
      const t1 = performance.now();
      const t2 = await painted();
      if (numbers.textContent !== before) changed++;
      settle.push(t1 - t0);
      paint.push(t2 - t0);
    }
    // Baseline in the same run: the interval between animation frames with nothing to do, i.e.
    // how often this browser on this machine paints at all (the floor under any paint latency).
    const frames = [];
    let last = await painted();
    for (let i = 0; i < 100; i++) { const t = await painted(); frames.push(t - last); last = t; }
    return { settle, paint, changed, frames };
  }, MOVES);
  const q = (xs, p) => { const s = [...xs].sort((a, b) => a - b); return s[Math.min(s.length - 1, Math.ceil(p * s.length) - 1)]; };
  const f = (x) => x.toFixed(1);
  console.log(`notebook latency, prestrain explorer, ${MOVES} slider moves (${result.changed} changed the numbers), headless Chromium --disable-gpu, ${new Date().toISOString()}`);
  console.log(`  input → all cells settled:          median ${f(q(result.settle, 0.5))} ms, p95 ${f(q(result.settle, 0.95))} ms, max ${f(Math.max(...result.settle))} ms`);
  console.log(`  input → settled and painted:        median ${f(q(result.paint, 0.5))} ms, p95 ${f(q(result.paint, 0.95))} ms, max ${f(Math.max(...result.paint))} ms`);
  console.log(`  idle frame interval (baseline):     median ${f(q(result.frames, 0.5))} ms, p95 ${f(q(result.frames, 0.95))} ms`);
  console.log(`  load average during the run: ${(await import('node:os')).loadavg().map((x) => x.toFixed(1)).join(' ')} (2 cores)`);
  console.log(`  aim: p95 of settled-and-painted ≤ 16 ms (one frame at 60 Hz): ${q(result.paint, 0.95) <= 16 ? 'met' : 'NOT met'}`);
} finally {
  await browser.close();
  await server.close();
}
