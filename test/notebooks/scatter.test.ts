// Real-browser test of the scatter notebook (Debian's Chromium via playwright-core, no GPU).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { prepareScatter, runScatter, sampleScatterBlock } from '../../src/core/index.js';
import { loadPlanText } from '../../src/plan/load.js';
import { withFinalPass } from '../../notebooks/scatter/problem.js';
import { openPage, settled, startHarness, REPO, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

const num = async (page: import('playwright-core').Page, q: string) => Number(await page.locator(`[data-q="${q}"] .sl-num`).innerText());
const FILE = 'examples/clip-strip-scatter.json';
const plan = loadPlanText(readFileSync(join(REPO, FILE), 'utf8'), FILE);

describe('scatter notebook', () => {
  it('shows the histogram and the probability of meeting the targets, and both follow the final-pass slider', async () => {
    const { page, errors } = await openPage(h, '/scatter/');
    await settled(page, 'scatter');
    // The page's numbers are the core's runScatter for the same problem and seed, computed in a web
    // worker: compare with the same function run here in Node, to the displayed precision.
    const eps0 = Number(await page.inputValue('#prestrain-number'));
    expect(eps0).toBe(0.303); // the demo's finish pass 1.3 → 1.0 mm: (2/√3)·ln(1.3) = 0.3030 (Marciniak, Duncan & Hu §3.4)
    const ref0 = runScatter(withFinalPass(plan.scatter!, eps0));
    expect(await num(page, 'probability')).toBe(Number((ref0.probabilityAllTargetsMet * 100).toFixed(2)));
    expect(await num(page, 'mean')).toBe(Number(ref0.finalReloadYield.mean.toFixed(1)));
    expect(await num(page, 'bound')).toBe(Number(ref0.toleranceBound.value.toFixed(1)));
    const hist0 = await page.locator('#cell-histogram').innerHTML();
    expect(hist0).toContain('probability all targets met');
    expect(await page.locator('#histogram rect').count()).toBeGreaterThan(10);
    await page.screenshot({ path: join(SCREENSHOTS, 'scatter.png'), fullPage: true });
    // More cold work in the final pass: a higher yield, so more parts clear minYield 330 MPa but
    // fewer keep 2 % uniform elongation; the histogram moves to the right.
    await page.fill('#prestrain-number', '0.4');
    await settled(page, 'scatter');
    const ref1 = runScatter(withFinalPass(plan.scatter!, 0.4));
    expect(await num(page, 'mean')).toBe(Number(ref1.finalReloadYield.mean.toFixed(1)));
    expect(await num(page, 'mean')).toBeGreaterThan(Number(ref0.finalReloadYield.mean.toFixed(1)));
    expect(await num(page, 'probability')).toBe(Number((ref1.probabilityAllTargetsMet * 100).toFixed(2)));
    expect(await page.locator('#cell-histogram').innerHTML()).not.toEqual(hist0);
    // The slider from the keyboard.
    await page.locator('#prestrain-range').press('ArrowLeft');
    await settled(page, 'scatter');
    expect(Number(await page.inputValue('#prestrain-number'))).toBe(0.399);
    expect(await page.locator('.sl-cautions').first().isVisible()).toBe(true);
    expect(errors).toEqual([]);
  });
  it('a slider move answers at once with a preview from the first 1,024 samples; the full run replaces it when the slider rests', async () => {
    const { page, errors } = await openPage(h, '/scatter/');
    await settled(page, 'scatter');
    // Catch the preview before the full run (which starts 120 ms after the last move).
    const preview = await page.evaluate(async () => {
      const r = document.getElementById('prestrain-range') as HTMLInputElement;
      r.value = '0.35';
      r.dispatchEvent(new Event('input', { bubbles: true }));
      for (let i = 0; i < 100; i++) {
        await new Promise((res) => setTimeout(res, 2));
        const el = document.querySelector('#cell-numbers [data-resolution]');
        if (el?.getAttribute('data-resolution') === 'preview') {
          return { p: el.querySelector('[data-q="probability"] .sl-num')?.textContent ?? '', note: el.textContent ?? '', hist: document.querySelector('#histogram')?.getAttribute('data-resolution') };
        }
      }
      return null;
    });
    expect(preview, 'no preview shown').not.toBeNull();
    expect(preview!.note).toContain('Preview from the first 1,024 of 20,000 samples');
    // The histogram is not redrawn for a preview: the last full one stays, dimmed and marked as updating.
    expect(preview!.hist).toBe('updating');
    // The preview is the core's runScatter on 1,024 samples of the same problem and seed ...
    const problem = withFinalPass(plan.scatter!, 0.35);
    const small = runScatter({ ...problem, samples: 1024 });
    expect(Number(preview!.p)).toBe(Number((small.probabilityAllTargetsMet * 100).toFixed(2)));
    // ... and those samples are the first 1,024 of the full run (block 0's stream, drawn in order).
    const head = sampleScatterBlock(prepareScatter({ ...problem, samples: 1024 }), 0).reloadYield;
    const full0 = sampleScatterBlock(prepareScatter(problem), 0).reloadYield;
    expect(Array.from(head)).toEqual(Array.from(full0.subarray(0, 1024)));
    await settled(page, 'scatter');
    expect(await page.getAttribute('#cell-numbers [data-resolution]', 'data-resolution')).toBe('full');
    expect(await page.getAttribute('#histogram', 'data-resolution')).toBe('full');
    const full = runScatter(problem);
    expect(await num(page, 'probability')).toBe(Number((full.probabilityAllTargetsMet * 100).toFixed(2)));
    expect(errors).toEqual([]);
  });
  it('is listed on the index page', async () => {
    const { page } = await openPage(h, '/');
    await expect(page.locator('#notebook-list a[href="scatter/"]').innerText()).resolves.toBe('Scatter');
  });
});
