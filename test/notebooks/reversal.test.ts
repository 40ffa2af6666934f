// Real-browser test of the reversal-and-springback notebook (Debian's Chromium via playwright-core).
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { backstressAfter, hollomon, springback } from '../../src/core/index.js';
import { expectRelClose } from '../helpers.js';
import { openPage, settled, startHarness, REPO, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

const num = async (page: import('playwright-core').Page, q: string) => Number(await page.locator(`[data-q="${q}"] .sl-num`).innerText());

describe('reversal and springback notebook', () => {
  it('opens on the kinematic demo, shows the early reverse yield, and springback follows the prestrain slider', async () => {
    const { page, errors } = await openPage(h, '/reversal/');
    await settled(page, 'reversal');
    expect(await page.locator('#material-select option:checked').innerText()).toContain('hinge-tab-bend');
    // Isotropic hardening reverses at −σ(ε̄); with backstresses at X − R = 2X − σ(ε̄) (combined split,
    // X = (C/γ)(1 − e^(−γε̄)), Armstrong–Frederick closed form). Demo material: Callister low-carbon
    // steel, Hollomon K 600 MPa, n 0.21 (2nd ed., p. 199); invented backstress C 15000 MPa, γ 150.
    // One decimal shown: 0.05 MPa absolute.
    const iso = await num(page, 'reverseYieldIso');
    const kin = await num(page, 'reverseYieldKin');
    const s05 = 600 * 0.05 ** 0.21;
    expect(Math.abs(iso + s05)).toBeLessThanOrEqual(0.051);
    expect(Math.abs(kin - (2 * 100 * (1 - Math.exp(-150 * 0.05)) - s05))).toBeLessThanOrEqual(0.051);
    const chart0 = await page.locator('#cell-path-chart').innerHTML();
    const sb0 = await num(page, 'springbackDeg');
    await page.fill('#prestrain-number', '0.3');
    await settled(page, 'reversal');
    const sb1 = await num(page, 'springbackDeg');
    expect(sb1).toBeGreaterThan(sb0);
    expect(await page.locator('#cell-path-chart').innerHTML()).not.toEqual(chart0);
    // The page equals the core for the same inputs (demo plan data: E 207 GPa, ν 0.3, invented
    // backstress C 15000 MPa, γ 150 and chord-modulus decay Ea 180 GPa, ξ 25; strip 1.8 mm, R 4 mm, 90°).
    const core = springback({
      elasticModulus: 207000, poissonRatio: 0.3, law: hollomon({ K: 600, n: 0.21 }), thickness: 1.8, prestrain: 0.3,
      kinematic: { backstresses: [{ C: 15000, gamma: 150 }] }, backstresses: [backstressAfter(0, 15000, 150, 1, 0.3)],
      modulusDecay: { Ea: 180000, xi: 25 },
    }, { radius: 4, angleDeg: 90 });
    expectRelClose(sb1, Number(core.springbackDeg.toFixed(2)), 1e-12, 'springback shown = core to 2 decimals');
    expect(await page.locator('.sl-cautions').isVisible()).toBe(true);
    expect(await page.locator('.sl-invented').first().isVisible()).toBe(true);
    await page.screenshot({ path: `${SCREENSHOTS}/reversal.png`, fullPage: true });
    expect(errors).toEqual([]);
  });
  it('fits backstresses to the INVENTED demo reversal record: the runner\'s numbers, near the values it was made from', async () => {
    const { page, errors, context } = await openPage(h, '/reversal/');
    await settled(page, 'reversal');
    await page.click('#kinfit-demo');
    await settled(page, 'reversal');
    const C = await num(page, 'kinC1');
    const gamma = await num(page, 'kinGamma1');
    // The same fit through the runner (`strainledger kinematic`, the same core function).
    const r = spawnSync(process.execPath, [join(REPO, 'bin', 'strainledger.js'), 'kinematic', 'examples/hinge-tab-bend.json', 'examples/reversal/hinge-tab-reversal.csv', '--format', 'json'], { cwd: REPO, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const cli = JSON.parse(r.stdout).backstresses[0];
    expect(C).toBe(Number(cli.C.toFixed(0)));
    expect(gamma).toBe(Number(cli.gamma.toFixed(2)));
    // The record was generated (scripts/gen-reversal-demo.mjs) with C 15000 MPa, γ 150 and 1 MPa noise:
    // the fit lands within three standard errors of them.
    expect(Math.abs(cli.C - 15000)).toBeLessThan(3 * cli.standardError.C);
    expect(Math.abs(cli.gamma - 150)).toBeLessThan(3 * cli.standardError.gamma);
    expect(await page.locator('#cell-kinfit-chart svg').count()).toBeGreaterThan(0);
    // A file that is not a record shows its problem in the panel; the rest of the page keeps working.
    await page.setInputFiles('#kinfit-file', { name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('strain,stress [MPa]\n0.01,abc\n') });
    await settled(page, 'reversal');
    await expect(page.locator('#cell-kinfit-numbers .sl-error').count()).resolves.toBeGreaterThan(0);
    expect(await num(page, 'springbackDeg')).toBeGreaterThan(0);
    expect(errors).toEqual([]);
    await context.close();
  });
  it('a prestrain move retraces the kept charts at once (preview), Plot redraws them when the slider rests; the numbers are the full computation throughout', async () => {
    const { page, errors } = await openPage(h, '/reversal/');
    await settled(page, 'reversal');
    const before = await page.locator('#cell-path-chart [aria-label="line"] path').first().getAttribute('d');
    const preview = await page.evaluate(async () => {
      const r = document.getElementById('prestrain-range') as HTMLInputElement;
      r.value = '0.08';
      r.dispatchEvent(new Event('input', { bubbles: true }));
      for (let i = 0; i < 30; i++) {
        await new Promise((res) => setTimeout(res, 2));
        const path = document.querySelector('#cell-path-chart [data-resolution]');
        const res = document.querySelector('#cell-residual-chart [data-resolution]');
        if (path?.getAttribute('data-resolution') === 'preview' && res?.getAttribute('data-resolution') === 'preview') {
          return { d: path.querySelector('[aria-label="line"] path')?.getAttribute('d') ?? '', paths: path.querySelectorAll('[aria-label="line"] path').length,
            iso: Number(document.querySelector('[data-q="reverseYieldIso"] .sl-num')?.textContent) };
        }
      }
      return null;
    });
    expect(preview, 'no preview shown').not.toBeNull();
    expect(preview!.paths).toBe(2);
    expect(preview!.d).not.toBe(before);
    // Hollomon K 600 MPa, n 0.21 (Callister, 2nd ed., p. 199): isotropic reverse yield −σ(0.08), shown during the preview.
    expect(Math.abs(preview!.iso + 600 * 0.08 ** 0.21)).toBeLessThanOrEqual(0.051);
    await settled(page, 'reversal');
    expect(await page.getAttribute('#cell-path-chart [data-resolution]', 'data-resolution')).toBe('full');
    expect(await page.getAttribute('#cell-residual-chart [data-resolution]', 'data-resolution')).toBe('full');
    expect(Math.abs(await num(page, 'reverseYieldIso') + 600 * 0.08 ** 0.21)).toBeLessThanOrEqual(0.051);
    // The redraw fits the axes to the new path: it is not the preview's path on the old axes.
    expect(await page.locator('#cell-path-chart [aria-label="line"] path').first().getAttribute('d')).not.toBe(preview!.d);
    expect(errors).toEqual([]);
  });

  it('is linked from the index page', async () => {
    const { page } = await openPage(h, '/');
    await expect(page.locator('#notebook-list a', { hasText: 'Reversal and springback' }).count()).resolves.toBe(1);
  });
});
