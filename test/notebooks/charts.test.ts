// Real-browser tests of the charts (Debian's Chromium via playwright-core, no GPU): step axes carry
// whole-step ticks from 0 (the starting stock), values held after each step are drawn as steps at
// the runner's numbers, and every chart fills the container it is given — in the notebooks (and
// again after the window is resized) and in the runner's HTML report.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openPage, settled, startHarness, REPO, SCREENSHOTS, type Harness } from './browser.js';
import { pathPoints } from '../helpers.js';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

type Page = import('playwright-core').Page;

interface ChartFacts {
  ticks: { text: string; x: number }[];
  dots: { x: number; y: number }[];
  /** Every line's path data (SVG user units). */
  lines: string[];
  svgWidth: number;
  containerWidth: number;
  /** Client y of a value on the chart's own y scale, for each value asked. */
  yOf: number[];
}

/** Reads a Plot chart inside `sel`: tick labels, dots, line vertices (client px) and widths. */
function chartFacts(page: Page, sel: string, values: number[] = []): Promise<ChartFacts> {
  return page.$eval(sel, (root, values) => {
    const svg = [...root.querySelectorAll('svg')].find((s) => s.getBoundingClientRect().width > 100)!;
    const box = svg.getBoundingClientRect();
    const sx = box.width / Number(svg.getAttribute('width'));
    const sy = box.height / Number(svg.getAttribute('height'));
    const center = (e: Element) => { const r = e.getBoundingClientRect(); return r.left + r.width / 2; };
    const lines = [...svg.querySelectorAll('g[aria-label="line"] path')].map((p) => p.getAttribute('d') ?? '');
    const chart = root.querySelector('figure, svg') as unknown as { scale?: (n: string) => { apply(v: number): number } };
    const y = chart.scale?.('y');
    return {
      ticks: [...svg.querySelectorAll('g[aria-label="x-axis tick label"] text')].map((t) => ({ text: t.textContent ?? '', x: center(t) })),
      dots: [...svg.querySelectorAll('g[aria-label="dot"] circle')].map((c) => { const r = c.getBoundingClientRect(); return { x: r.left + r.width / 2, y: r.top + r.height / 2 }; }),
      lines,
      svgWidth: box.width,
      containerWidth: (root as HTMLElement).clientWidth,
      yOf: values.map((v) => box.top + (y ? y.apply(v) : NaN) * sy),
    };
  }, values);
}

/** A line is a staircase when each run is flat or vertical (a sloping join moves x and y at once). */
function isStaircase(d: string): boolean {
  const pts = pathPoints(d);
  if (pts.length < 2) return false;
  for (let i = 1; i < pts.length; i++) {
    const [x0, y0] = pts[i - 1]!;
    const [x1, y1] = pts[i]!;
    if (Math.abs(x1 - x0) > 1e-6 && Math.abs(y1 - y0) > 1e-6) return false;
  }
  return true;
}

const runner = (...args: string[]) => spawnSync(process.execPath, [join(REPO, 'bin', 'strainledger.js'), ...args], { cwd: REPO, encoding: 'utf8' });

describe('step charts in the route planner', () => {
  it('carry whole-step ticks from 0, draw the runner\'s numbers as steps with step 0 = the starting stock, and fill their container', async () => {
    const { page, errors, context } = await openPage(h, '/route/');
    await settled(page, 'route');
    // The route planner opens on the first demo plan; read the same plan through the built runner.
    const planFile = (await page.locator('#demo-select option:checked').innerText()).split(' ')[0]!;
    const run = runner('run', planFile, '--format', 'json');
    expect([0, 1]).toContain(run.status);
    const report = JSON.parse(run.stdout) as { material: { initial: { reloadYield: number; tensileStrength: number; uniformElongationPct: number } }; steps: { index: number; reloadYield: number; tensileStrength: number }[] };
    const n = report.steps.length;
    const ry = [report.material.initial.reloadYield, ...report.steps.map((s) => s.reloadYield)];
    for (const sel of ['#cell-strength-chart', '#cell-ductility-chart']) {
      const f = await chartFacts(page, sel, ry);
      expect(f.ticks.map((t) => t.text), sel).toEqual(Array.from({ length: n + 1 }, (_, i) => String(i)));
      // Fills its container (whole pixels: the width is floored).
      expect(Math.abs(f.svgWidth - f.containerWidth), `${sel} ${f.svgWidth} px in ${f.containerWidth} px`).toBeLessThanOrEqual(1);
      expect(f.dots.length, sel).toBe(2 * (n + 1));
      for (const line of f.lines) expect(isStaircase(line), `${sel}: a line with a sloping run`).toBe(true);
      if (sel === '#cell-strength-chart') {
        // The reload-yield dots sit at tick i and at the runner's value for step i (step 0: the starting stock).
        for (let i = 0; i <= n; i++) {
          const tick = f.ticks[i]!;
          const hit = f.dots.some((d) => Math.abs(d.x - tick.x) < 1.5 && Math.abs(d.y - f.yOf[i]!) < 1.5);
          expect(hit, `reload yield dot for step ${i} (${ry[i]})`).toBe(true);
        }
      }
    }
    expect(await page.locator('#cell-strength-chart').innerText()).toMatch(/yield target/);
    await page.locator('.sl-charts').screenshot({ path: `${SCREENSHOTS}/route-charts-1280.png` });
    // Narrow the window: the charts are redrawn at their new container width.
    const before = (await chartFacts(page, '#cell-strength-chart')).svgWidth;
    await page.setViewportSize({ width: 860, height: 800 });
    await page.waitForFunction((w) => {
      const svg = [...document.querySelectorAll('#cell-strength-chart svg')].find((s) => s.getBoundingClientRect().width > 100);
      return svg && Number(svg.getAttribute('width')) !== w;
    }, before, { timeout: 10_000 });
    await settled(page, 'route');
    for (const sel of ['#cell-strength-chart', '#cell-ductility-chart']) {
      const f = await chartFacts(page, sel);
      expect(Math.abs(f.svgWidth - f.containerWidth), `${sel} after resize`).toBeLessThanOrEqual(1);
      expect(f.ticks.every((t) => /^\d+$/.test(t.text))).toBe(true);
    }
    await page.locator('.sl-charts').screenshot({ path: `${SCREENSHOTS}/route-charts-860.png` });
    expect(errors).toEqual([]);
    await context.close();
  });
});

describe('every notebook chart fills its container', () => {
  for (const [nb, sels] of [
    ['prestrain', ['#cell-flow-chart', '#cell-lur-chart']],
    ['reversal', ['#cell-path-chart', '#cell-residual-chart']],
    ['scatter', ['#cell-histogram']],
  ] as const) {
    it(nb, async () => {
      const { page, errors, context } = await openPage(h, `/${nb}/`);
      await settled(page, nb);
      for (const sel of sels) {
        const f = await chartFacts(page, sel);
        expect(f.containerWidth, sel).toBeGreaterThan(300);
        expect(Math.abs(f.svgWidth - f.containerWidth), `${sel}: ${f.svgWidth} px in ${f.containerWidth} px`).toBeLessThanOrEqual(1);
      }
      expect(errors).toEqual([]);
      await context.close();
    });
  }
});

describe('the record bench charts fill their container', () => {
  it('records (INVENTED demo record from examples/)', async () => {
    const { page, errors, context } = await openPage(h, '/records/');
    await settled(page, 'records');
    await page.selectOption('#example-select', { label: 'stamping-strip-loops.csv' });
    await page.click('#load-example');
    await expect.poll(() => page.locator('#cell-curve-chart svg').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    await settled(page, 'records');
    for (const sel of ['#cell-curve-chart', '#cell-residual-chart']) {
      const f = await chartFacts(page, sel);
      expect(f.containerWidth, sel).toBeGreaterThan(300);
      expect(Math.abs(f.svgWidth - f.containerWidth), `${sel}: ${f.svgWidth} px in ${f.containerWidth} px`).toBeLessThanOrEqual(1);
    }
    await page.locator('.sl-charts').screenshot({ path: `${SCREENSHOTS}/records-charts.png` });
    expect(errors).toEqual([]);
    await context.close();
  });
});

describe('step charts in the HTML report', () => {
  it('fill the report column, carry whole-step ticks from 0 and scale down on a narrow screen', async () => {
    const run = runner('run', 'examples/fencing-wire-us.json', '--format', 'html');
    expect(run.status, run.stderr).toBe(0);
    const ctx = await h.browser.newContext({ viewport: { width: 1400, height: 900 } });
    const page = await ctx.newPage();
    await page.setContent(run.stdout, { waitUntil: 'load' });
    const figs = page.locator('body > figure');
    // Strength, ductility and hardness (every report carries the Tabor estimate, issue 15).
    expect(await figs.count()).toBe(3);
    for (let i = 0; i < 3; i++) {
      const f = await chartFacts(page, `body > figure >> nth=${i}`);
      // The report's text column is 72rem (1152 px at the default 16 px font).
      expect(f.svgWidth).toBeGreaterThanOrEqual(0.98 * f.containerWidth);
      expect(f.ticks.map((t) => t.text)).toEqual(['0', '1', '2', '3', '4']);
      for (const line of f.lines) expect(isStaircase(line)).toBe(true);
    }
    await page.screenshot({ path: `${SCREENSHOTS}/report-html-1400.png`, fullPage: true });
    await page.setViewportSize({ width: 700, height: 900 });
    const narrow = await chartFacts(page, 'body > figure >> nth=0');
    expect(narrow.svgWidth).toBeLessThanOrEqual(narrow.containerWidth + 1);
    await ctx.close();
  });
});
