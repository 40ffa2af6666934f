// Real-browser test of the scatter notebook (Debian's Chromium via playwright-core, no GPU).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runScatter } from '../../src/core/index.js';
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
  it('is listed on the index page', async () => {
    const { page } = await openPage(h, '/');
    await expect(page.locator('#notebook-list a[href="scatter/"]').innerText()).resolves.toBe('Scatter');
  });
});
