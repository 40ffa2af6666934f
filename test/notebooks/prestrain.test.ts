// Real-browser test of the prestrain explorer (Debian's Chromium via playwright-core).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hollomon, stateProperties } from '../../src/core/index.js';
import { expectRelClose } from '../helpers.js';
import { openPage, settled, startHarness, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

const num = async (page: import('playwright-core').Page, q: string) => Number(await page.locator(`[data-q="${q}"] .sl-num`).innerText());

describe('prestrain explorer', () => {
  it('loads with no console error and moving the slider changes the numbers and the chart', async () => {
    const { page, errors } = await openPage(h, '/prestrain/');
    await settled(page, 'prestrain');
    // The first demo material is the contact-spring copper: Hollomon K 530 MPa, n 0.44 (Callister,
    // Fundamentals of Materials Science and Engineering, 2nd ed., p. 199), E 115 GPa (Table B.2).
    const ry0 = await num(page, 'reloadYield');
    const chart0 = await page.locator('#cell-flow-chart').innerHTML();
    const rm0 = await num(page, 'tensileStrength');
    await page.locator('#prestrain-range').focus();
    // Move the slider from the keyboard: 100 steps of 0.001 up from 0.1 → 0.2.
    await page.fill('#prestrain-number', '0.2');
    await settled(page, 'prestrain');
    const ry1 = await num(page, 'reloadYield');
    const chart1 = await page.locator('#cell-flow-chart').innerHTML();
    expect(ry1).toBeGreaterThan(ry0);
    expect(chart1).not.toEqual(chart0);
    // Independent check of the shown numbers: Hollomon σ = K·ε^n by hand at ε̄ + 0.002 (offset
    // definition of Rp0.2, ISO 6892-1), as force over the formed section: × e^(−0.002) (constant
    // volume), and Considère Rm = K·n^n·exp(ε̄ − n) on the new section (Dieter, Mechanical
    // Metallurgy, §8-3); one decimal shown, so 0.05 MPa absolute on ~260 MPa.
    expectRelClose(ry1, 530 * 0.202 ** 0.44 * Math.exp(-0.002), 0.05 / 260, 'reload yield at 0.2');
    expectRelClose(rm0, 530 * 0.44 ** 0.44 * Math.exp(0.1 - 0.44), 0.05 / 300, 'Rm at 0.1');
    expectRelClose(await num(page, 'remainingElongation'), Math.expm1(0.44 - 0.2) * 100, 0.05 / 27, 'remaining uniform elongation');
    // And the page equals the core for the same state (the same module the runner uses).
    const core = stateProperties({ name: 'cu', elasticModulus: 115000, poissonRatio: 0.3, law: hollomon({ K: 530, n: 0.44 }) }, 0.2);
    expect(await num(page, 'yieldRatio')).toBe(Number(core.yieldRatio.toFixed(3)));
    // HV at the prestrain by Tabor's relation, by hand: 3·sin 68°·K·(ε̄ + 0.08)ⁿ/9.80665 (defaults: Tabor 1951,
    // from memory; Vickers geometry ISO 6507-1); one decimal shown, so 0.05 HV absolute on ~85 HV.
    expectRelClose(await num(page, 'hardnessHV'), (3 * Math.sin((68 * Math.PI) / 180) * 530 * 0.28 ** 0.44) / 9.80665, 0.05 / 85, 'HV at 0.2');
    expect(await page.locator('#hardness-note').innerText()).toMatch(/default c 2\.782.*release parts by measured hardness/);
    // The slider from the keyboard: ArrowRight steps the range input by its step.
    await page.locator('#prestrain-range').press('ArrowRight');
    await settled(page, 'prestrain');
    expect(await num(page, 'prestrain')).toBe(0.201);
    // The forming-mode slider maps the prestrain to reductions: rolling (plane strain) thickness
    // reduction 1 − exp(−ε̄·√3/2) (Marciniak, Duncan & Hu, Mechanics of Sheet Metal Forming, §3.4).
    await page.locator('#mode-range').press('ArrowRight');
    await settled(page, 'prestrain');
    const red = await page.locator('#reductions').innerText();
    expect(red).toContain(`${(-Math.expm1(-0.201 * Math.sqrt(3) / 2) * 100).toFixed(1)} %`);
    expect(await page.locator('.sl-cautions').isVisible()).toBe(true);
    // Every law side by side: the other laws are fitted to the demo law over the tensile range
    // (0.002 to εu = n = 0.44) and part ways beyond it. Voce saturates (σ → σ0 + Q, Voce 1948)
    // while Hollomon keeps rising, so at ε̄ = 1.4 the Voce row is below the Hollomon row.
    const spreadText = await page.locator('#law-spread').innerText();
    const from = Number(/from ε̄ ≈ ([\d.]+)/.exec(spreadText)?.[1]);
    expect(from).toBeGreaterThan(0.44); // past the end of the tested range, εu = n = 0.44
    await page.fill('#prestrain-number', '1.4');
    await settled(page, 'prestrain');
    const rowYield = async (law: string) => Number(await page.locator('#law-table tbody tr', { hasText: law }).first().locator('td').nth(3).innerText());
    expect(await rowYield('voce')).toBeLessThan(await rowYield('hollomon: K 530 MPa, n 0.44'));
    expectRelClose(await rowYield('hollomon: K 530 MPa, n 0.44'), 530 * 1.402 ** 0.44 * Math.exp(-0.002), 0.05 / 600, 'Hollomon at 1.4');
    // Law parameters read as an engineer writes them: no exponent noise such as 1.821e-18 (a fitted
    // parameter that collapsed onto its bound reads "0 (at bound)").
    const lawsText = await page.locator('#law-table').innerText();
    expect(lawsText).not.toMatch(/\de[-+]\d/);
    // The law box shows the law in use: the demo copper's E 115000 MPa and its Hollomon law, read-only.
    const box = JSON.parse(await page.locator('#law-text').inputValue()) as { elasticModulus: number; laws: { law: string; K: number; n: number }[] };
    expect(box.elasticModulus).toBe(115000);
    expect(box.laws).toEqual([{ law: 'hollomon', K: 530, n: 0.44 }]);
    expect(await page.locator('#law-text').getAttribute('readonly')).not.toBeNull();
    await page.screenshot({ path: `${SCREENSHOTS}/prestrain.png`, fullPage: true });
    expect(errors).toEqual([]);
  });

  it('a malformed typed law shows an error cell naming the field while the inputs keep working', async () => {
    const { page, errors } = await openPage(h, '/prestrain/');
    await settled(page, 'prestrain');
    await page.selectOption('#material-select', { label: 'a law typed in (JSON below)' });
    await settled(page, 'prestrain');
    // Until the user edits it, the typed box starts from the law last in use (the demo copper, E
    // 115000 MPa), editable: one law in the table, the same numbers as the demo's own law.
    expect(await page.locator('#law-text').getAttribute('readonly')).toBeNull();
    expect(JSON.parse(await page.locator('#law-text').inputValue()).elasticModulus).toBe(115000);
    expect(await page.locator('#law-table tbody tr').count()).toBe(1);
    // Two laws typed in: the side-by-side table shows both and where they part.
    await page.fill('#law-text', '{"elasticModulus": 70000, "laws": [{"law": "voce", "sigma0": 120, "Q": 160, "b": 12}, {"law": "hollomon", "K": 400, "n": 0.2}]}');
    await page.locator('#law-text').dispatchEvent('change');
    await settled(page, 'prestrain');
    expect(await page.locator('#law-table tbody tr').count()).toBe(2);
    // The user's text survives a visit to another material.
    await page.selectOption('#material-select', { index: 0 });
    await settled(page, 'prestrain');
    await page.selectOption('#material-select', { label: 'a law typed in (JSON below)' });
    await settled(page, 'prestrain');
    expect(JSON.parse(await page.locator('#law-text').inputValue()).elasticModulus).toBe(70000);
    await page.fill('#law-text', '{"elasticModulus": 70000, "laws": [{"law": "voce", "sigma0": -5, "Q": 100, "b": 10}]}');
    await page.locator('#law-text').dispatchEvent('change');
    await settled(page, 'prestrain');
    const err = await page.locator('#material-note .sl-error').innerText();
    expect(err).toContain('sigma0');
    expect(err).toContain('-5');
    // User text is escaped: markup typed in appears as text, no element is created.
    await page.fill('#law-text', '<img src=x onerror="window.__pwned=1">');
    await page.locator('#law-text').dispatchEvent('change');
    await settled(page, 'prestrain');
    expect(await page.locator('#material-note img').count()).toBe(0);
    expect(await page.evaluate(() => (window as any).__pwned)).toBeUndefined();
    expect(errors).toEqual([]);
  });
});
