// What a forming engineer reads first in the notebooks, in real Chromium (Debian's, via playwright-core,
// no GPU): targets in words (never the plan keys), chart labels inside the chart wherever a target
// lies, a push-back branch drawn wide enough to read, captions only where there is something to caption,
// and the hardness caution where a margin is inside Tabor's ±15 % (common practice, from memory).
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TARGET_LABELS } from '../../src/core/index.js';
import { openPage, settled, startHarness, REPO, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

type Page = import('playwright-core').Page;
const KEYS = Object.keys(TARGET_LABELS).filter((k) => k !== 'temper');

/** Every text a person sees on the page (text nodes and SVG text), without form controls' own text. */
function visibleTexts(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = [];
    const walk = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    for (let n = walk.nextNode(); n; n = walk.nextNode()) {
      const el = n.parentElement;
      if (!el || el.closest('textarea, pre, code, script, style, select, [hidden]')) continue;
      const t = n.textContent?.trim();
      if (t) out.push(t);
    }
    return out;
  });
}

/** Boxes (client px) of every text mark of the histogram's SVG, and the SVG's own box. */
function labelBoxes(page: Page, sel: string): Promise<{ svg: DOMRect; texts: { text: string; left: number; right: number; top: number; bottom: number }[] }> {
  return page.$eval(sel, (root) => {
    const svg = [...root.querySelectorAll('svg')].find((s) => s.getBoundingClientRect().width > 100)!;
    const texts = [...svg.querySelectorAll('g[aria-label="text"] text')].map((t) => {
      const r = t.getBoundingClientRect();
      return { text: t.textContent ?? '', left: r.left, right: r.right, top: r.top, bottom: r.bottom };
    });
    return { svg: svg.getBoundingClientRect().toJSON() as DOMRect, texts };
  });
}

describe('targets in words in the notebooks', () => {
  for (const nb of ['route', 'scatter', 'reversal', 'prestrain', 'records', 'design']) {
    it(`${nb}: no plan key of a target in the visible text`, async () => {
      const { page, errors } = await openPage(h, `/${nb}/`);
      await settled(page, nb);
      const texts = await visibleTexts(page);
      expect(texts.length).toBeGreaterThan(10);
      for (const t of texts) for (const k of KEYS) expect(t, `${nb}: "${t}"`).not.toMatch(new RegExp(`\\b${k}\\b`));
      expect(texts.join(' ')).not.toMatch(/\(es\)/);
      expect(errors).toEqual([]);
      await page.close();
    });
  }
  it('scatter: the probability of each target is named in words', async () => {
    const { page } = await openPage(h, '/scatter/');
    await settled(page, 'scatter');
    const dts = await page.locator('#numbers dt').allInnerTexts();
    expect(dts).toContain('probability the minimum reload yield (Rp0.2) target is met');
    expect(dts).toContain('probability the maximum reload yield (Rp0.2) target is met');
    await page.close();
  });
  it('route: a hardness band inside the estimate\'s error is marked, with the caution, not a clean "met"', async () => {
    const { page, errors } = await openPage(h, '/route/');
    await settled(page, 'route');
    await page.selectOption('#demo-select', { label: 'examples/hardness-steel-strip.json (INVENTED)' });
    await page.click('#load-demo');
    await settled(page, 'route');
    const li = page.locator('[data-target="minHardnessHV"]');
    expect(await li.innerText()).toMatch(/^met, within the model's error — minimum hardness \(HV\): predicted 159\.5 HV, limit 140\.0 HV, margin 19\.5 HV to spare Caution: margin 19\.5 HV is smaller than the hardness estimate's own error \(±15 % ≈ 23\.9 HV/);
    expect(await li.locator('[data-caution="withinModelError"]').count()).toBe(1);
    // Widen the band: 100 HV leaves 59.5 HV, more than the estimate's error, and the caution goes.
    await page.fill('#target-minHardnessHV', '100');
    await settled(page, 'route');
    expect(await li.innerText()).toMatch(/^met — minimum hardness \(HV\): predicted 159\.5 HV, limit 100\.0 HV, margin 59\.5 HV to spare$/);
    await page.screenshot({ path: join(SCREENSHOTS, 'labels-route-hardness.png'), fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });
});

describe('the scatter histogram keeps every label inside the chart', () => {
  it('in the notebook, and for a target or bound at either edge of the x range', async () => {
    const { page, errors } = await openPage(h, '/scatter/');
    await settled(page, 'scatter');
    const inside = (b: Awaited<ReturnType<typeof labelBoxes>>, what: string) => {
      expect(b.texts.length, what).toBeGreaterThan(0);
      for (const t of b.texts) {
        expect(t.left, `${what}: "${t.text}" left`).toBeGreaterThanOrEqual(b.svg.left);
        expect(t.right, `${what}: "${t.text}" right`).toBeLessThanOrEqual(b.svg.right);
        expect(t.top, `${what}: "${t.text}" top`).toBeGreaterThanOrEqual(b.svg.top);
      }
    };
    inside(await labelBoxes(page, '#cell-histogram'), 'notebook');
    // The chart module itself (served by vite), with targets placed at the data's edges and beyond.
    const cases: [string, { minYield?: number; maxYield?: number; bound?: number }][] = [
      ['minimum at the left edge', { minYield: 300, bound: 302 }],
      ['minimum left of every sample', { minYield: 280 }],
      ['maximum at the right edge', { maxYield: 400, bound: 399 }],
      ['both, bound right', { minYield: 300, maxYield: 400, bound: 398 }],
      ['bound at the left edge', { bound: 300 }],
    ];
    for (const [what, o] of cases) {
      await page.evaluate(async ({ url, o }) => {
        // (new Function: the test runner would rewrite a literal import() in this function's source)
        const { yieldHistogram } = await (new Function('u', 'return import(u)') as (u: string) => Promise<any>)(url);
        const values = Array.from({ length: 2000 }, (_, i) => 300 + (100 * (i + 0.5)) / 2000); // uniform 300–400 MPa (INVENTED)
        const host = document.getElementById('probe-host') ?? document.body.appendChild(Object.assign(document.createElement('div'), { id: 'probe-host' }));
        host.replaceChildren(yieldHistogram(values, { stressUnit: 'MPa', width: 640, ...o }));
      }, { url: `/@fs${REPO}/src/charts/scatter.ts`, o });
      const b = await labelBoxes(page, '#probe-host');
      expect(b.texts.length, what).toBe(Number(o.minYield !== undefined) + Number(o.maxYield !== undefined) + Number(o.bound !== undefined));
      inside(b, what);
      if (what === 'minimum at the left edge') await page.locator('#probe-host').screenshot({ path: join(SCREENSHOTS, 'labels-histogram-left-target.png') });
    }
    expect(errors).toEqual([]);
    await page.close();
  });
});

describe('reversal notebook: every branch legible, captions only with something to caption', () => {
  /** x extent of each line of a chart, as a share of the plot frame's width. */
  const spans = (page: Page, sel: string) => page.$eval(sel, (root) => {
    const svg = [...root.querySelectorAll('svg')].find((s) => s.getBoundingClientRect().width > 100)!;
    const ticks = [...svg.querySelectorAll('g[aria-label="x-axis tick"] path, g[aria-label="x-grid"] line')].map((e) => e.getBoundingClientRect().left);
    const frame = Math.max(...ticks) - Math.min(...ticks);
    return [...svg.querySelectorAll('g[aria-label="line"] path')].map((p) => p.getBoundingClientRect().width / frame);
  });
  it('the push-back gets its own axis: each model\'s reversed branch spans most of that chart, whatever the prestrain', async () => {
    const { page, errors } = await openPage(h, '/reversal/');
    await settled(page, 'reversal');
    for (const [pre, back] of [['0.05', '0.02'], ['0.3', '0.01']]) {
      await page.fill('#prestrain-number', pre);
      await page.fill('#reverse-number', back);
      await settled(page, 'reversal');
      await page.waitForFunction(() => document.querySelector('#cell-push-chart [data-resolution]')?.getAttribute('data-resolution') !== 'preview');
      const s = await spans(page, '#cell-push-chart');
      expect(s.length).toBe(2); // with backstresses, isotropic only
      for (const w of s) expect(w, `prestrain ${pre}, push-back ${back}`).toBeGreaterThan(0.8);
      expect(await page.locator('#cell-push-chart').locator('xpath=..').locator('figcaption').innerText()).toMatch(/strain pushed back since it/);
    }
    await page.screenshot({ path: join(SCREENSHOTS, 'labels-reversal-push-back.png'), fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });
  it('the record-fit chart and its caption appear only with a record, and name it', async () => {
    const { page, errors } = await openPage(h, '/reversal/');
    await settled(page, 'reversal');
    expect(await page.locator('#cell-kinfit-chart figcaption').count()).toBe(0);
    expect((await visibleTexts(page)).join(' ')).not.toMatch(/fitted model driven through the same strains/);
    expect(await page.locator('#cell-kinfit-numbers').innerText()).toMatch(/No record yet: choose or drop one, or open the demo record\./);
    await page.click('#kinfit-demo');
    await settled(page, 'reversal');
    expect(await page.locator('#cell-kinfit-chart figcaption').innerText()).toMatch(/^hinge-tab-reversal\.csv \(true values\) and the fitted model driven through the same strains/);
    expect(await page.locator('#cell-kinfit-chart svg').count()).toBeGreaterThan(0);
    expect(errors).toEqual([]);
    await page.close();
  });
});
