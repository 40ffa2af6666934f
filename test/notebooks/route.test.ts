// Real-browser test of the route planner: editing, export → runner parity, autosave/restore, undo.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openPage, settled, startHarness, REPO, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
let tmp: string;
beforeAll(async () => { h = await startHarness(); tmp = mkdtempSync(join(tmpdir(), 'sl-route-')); });
afterAll(async () => { await h?.close(); rmSync(tmp, { recursive: true, force: true }); });

type Page = import('playwright-core').Page;
const ledgerCells = (page: Page) => page.$$eval('#ledger-table tbody tr', (trs) => trs.map((tr) =>
  Object.fromEntries([...tr.querySelectorAll('td')].map((td) => [td.getAttribute('data-col'), td.textContent]))));

type Report = { steps: Record<string, any>[]; targets: { name: string; met: boolean; predicted: number }[] };

/** Exports the plan through the page's own button (a real download) and runs the runner on it. */
async function exportAndRun(page: Page, name: string): Promise<Report> {
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export')]);
  const file = join(tmp, name);
  await download.saveAs(file);
  const run = spawnSync(process.execPath, [join(REPO, 'bin', 'strainledger.js'), 'run', file, '--format', 'json'], { encoding: 'utf8' });
  expect([0, 1], `runner exit ${run.status}: ${run.stderr}`).toContain(run.status); // 0 all targets met, 1 some not met; 2 invalid input
  return JSON.parse(run.stdout) as Report;
}

/** Every ledger number and target on the page equals the runner's, to the displayed precision. */
async function expectParity(page: Page, report: Report, shown: Record<string, string | null>[]): Promise<void> {
  // Stresses to 0.1 MPa or 0.01 ksi, % to 0.1, angles to 0.01° (src/report/numbers.ts DISPLAY_DIGITS).
  const sd = (report as unknown as { units: { stress: string } }).units.stress === 'ksi' ? 2 : 1;
  const digits: Record<string, number> = { strainIncrement: 4, accumulatedStrain: 4, coldWorkPct: 1, reloadYield: sd, tensileStrength: sd, yieldRatio: 3, remainingUniformElongationPct: 1 };
  expect(shown.length).toBe(report.steps.length);
  report.steps.forEach((s, i) => {
    for (const [k, d] of Object.entries(digits)) expect(shown[i]![k], `step ${i + 1} ${k}`).toBe((s[k] as number).toFixed(d));
    expect(shown[i]!.elasticRecoveryPct, `step ${i + 1} recovery`).toBe((s.elasticRecoveryStrain * 100).toFixed(3));
    expect(shown[i]!.hardnessHV, `step ${i + 1} HV`).toBe((s.hardnessHV as number).toFixed(1));
  });
  for (const t of report.targets) {
    const li = await page.locator(`[data-target="${t.name}"]`).innerText();
    expect(li).toContain(t.met ? 'met' : 'NOT met');
    const hv = t.name === 'minHardnessHV' || t.name === 'maxHardnessHV';
    const td = t.name === 'maxSpringbackDeg' ? 2 : t.name === 'minRemainingElongationPct' || hv ? 1 : sd;
    const unit = t.name === 'maxSpringbackDeg' ? '°' : t.name === 'minRemainingElongationPct' ? ' %' : hv ? ' HV' : ` ${(report as unknown as { units: { stress: string } }).units.stress}`;
    expect(li).toContain(`predicted ${t.predicted.toFixed(td)}${unit}`);
    expect(li).toContain(t.met ? `margin ${t.margin.toFixed(td)}${unit}` : `short by ${(-t.margin).toFixed(td)}${unit}`);
  }
}

describe('route planner', () => {
  it('hardness: the HV column, the hardness targets in HV and the hardness band, as the runner gives them', async () => {
    const { page, errors, context } = await openPage(h, '/route/');
    await settled(page, 'route');
    await page.selectOption('#demo-select', { label: 'examples/hardness-steel-strip.json (INVENTED)' });
    await page.click('#load-demo');
    await settled(page, 'route');
    expect(await page.locator('#ledger-table thead').innerText()).toContain('HV (Tabor estimate)');
    const report = await exportAndRun(page, 'hardness.json');
    await expectParity(page, report, await ledgerCells(page));
    expect(await page.locator('[data-target="minHardnessHV"]').innerText()).toMatch(/minimum hardness \(HV\): predicted [\d.]+ HV, limit 140\.0 HV/);
    // The chart draws the 140–170 HV band (a filled rect) and labels it with both ends.
    const chart = page.locator('#cell-hardness-chart');
    expect(await chart.locator('svg rect').count()).toBeGreaterThan(0);
    expect(await chart.innerText()).toContain('hardness target 140–170 HV');
    expect(await page.locator('#hardness-basis').innerText()).toMatch(/fitted to 4 readings, 95 % interval/);
    // Editing the hardness target moves the verdict, as for the other targets.
    await page.fill('#target-maxHardnessHV', '150');
    await settled(page, 'route');
    expect(await page.locator('[data-target="maxHardnessHV"]').innerText()).toContain('NOT met');
    await page.screenshot({ path: join(SCREENSHOTS, 'route-hardness.png'), fullPage: true });
    expect(errors).toEqual([]);
    await context.close();
  });

  it('a US-unit demo plan (ksi, in) shows the runner\'s numbers in ksi', async () => {
    const { page, errors, context } = await openPage(h, '/route/');
    await settled(page, 'route');
    await page.selectOption('#demo-select', { label: 'examples/fencing-wire-us.json (INVENTED)' });
    await page.click('#load-demo');
    await settled(page, 'route');
    expect(await page.locator('#ledger-table thead').innerText()).toContain('ksi');
    await expectParity(page, await exportAndRun(page, 'us.json'), await ledgerCells(page));
    expect(errors).toEqual([]);
    await context.close();
  });

  it('a plan with a scatter section: the nominal route as the runner gives it, no sampling on the page, the section kept in the export', async () => {
    const { page, errors, context } = await openPage(h, '/route/');
    await settled(page, 'route');
    await page.selectOption('#demo-select', { label: 'examples/clip-strip-scatter.json (INVENTED)' });
    await page.click('#load-demo');
    await settled(page, 'route');
    const report = await page.evaluate(async () => (await (window as unknown as { strainledger: Record<string, { value(n: string): Promise<unknown> }> }).strainledger.route!.value('report')) as Record<string, unknown>);
    expect(report.scatter).toBeUndefined();
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export')]);
    const file = join(tmp, 'scatter.json');
    await download.saveAs(file);
    expect(JSON.parse(readFileSync(file, 'utf8')).scatter.samples).toBe(20000);
    const run = spawnSync(process.execPath, [join(REPO, 'bin', 'strainledger.js'), 'run', file, '--format', 'json'], { encoding: 'utf8' });
    const fromRunner = JSON.parse(run.stdout) as Report & { scatter: unknown };
    expect(fromRunner.scatter).toBeDefined(); // the runner samples it
    await expectParity(page, fromRunner, await ledgerCells(page));
    expect(errors).toEqual([]);
    await context.close();
  });

  it('an edited route, exported and run through the runner, gives the numbers the page shows', async () => {
    const { page, errors } = await openPage(h, '/route/');
    await settled(page, 'route');
    const before = await ledgerCells(page);
    expect(before.length).toBe(5); // the contact-spring demo route (INVENTED)
    // Independent check of the first pass, rolling 2.0 → 1.6 mm: plane strain ε̄ = (2/√3)·ln(t0/t)
    // (Marciniak, Duncan & Hu, Mechanics of Sheet Metal Forming, §3.4); reload yield Hollomon
    // 530·(ε̄ + 0.002)^0.44 MPa (Callister's copper K and n; offset 0.002, ISO 6892-1). Shown to
    // 4 and 1 decimals, so exact agreement of the rounded strings is the right tolerance.
    const eps1 = (2 / Math.sqrt(3)) * Math.log(2 / 1.6);
    expect(before[0]!.accumulatedStrain).toBe(eps1.toFixed(4));
    // Rp0.2 on the rolled section: σ(ε̄ + 0.002)·e^(−0.002) (ISO 6892-1 offset, constant volume).
    expect(before[0]!.reloadYield).toBe((530 * (eps1 + 0.002) ** 0.44 * Math.exp(-0.002)).toFixed(1));
    expect(before[0]!.coldWorkPct).toBe('20.0'); // %CW = (t0 − t)/t0 for strip (Callister)
    const chart0 = await page.locator('#cell-strength-chart svg').last().innerHTML();
    // Edit: step 2 becomes a 30 % reduction, a new 12.5 % roll pass is added and moved up one place.
    await page.fill('#step-1-value', '30');
    await page.locator('#step-1-value').press('Tab');
    await page.selectOption('#add-kind-select', 'roll');
    await page.click('#add-step');
    await page.fill('#step-5-value', '12.5');
    await page.locator('#step-5-value').press('Tab');
    await page.fill('#target-minYield', '350');
    await page.locator('#target-minYield').press('Tab');
    await page.click('#step-5-up');
    await settled(page, 'route');
    const shown = await ledgerCells(page);
    expect(shown.length).toBe(6);
    expect(shown).not.toEqual(before);
    expect(await page.locator('#cell-strength-chart svg').last().innerHTML()).not.toEqual(chart0);
    const report = await exportAndRun(page, 'edited.json');
    expect(report.steps.length).toBe(6);
    await expectParity(page, report, shown);
    // Undo the last edit (the move up) and the route goes back.
    await page.click('#undo');
    await settled(page, 'route');
    const undone = await ledgerCells(page);
    expect(undone[5]!.kind).toBe(shown[4]!.kind);
    expect(undone[4]!.reloadYield).not.toBe(shown[4]!.reloadYield);
    await page.screenshot({ path: `${SCREENSHOTS}/route.png`, fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });

  it('reloading the page restores the edited route, and an invalid value shows an error cell while the editor keeps it', async () => {
    const { page, errors, context } = await openPage(h, '/route/');
    await settled(page, 'route');
    await page.fill('#step-0-value', '1.7');
    await page.selectOption('#step-0-field', 'thickness');
    await settled(page, 'route');
    const edited = await ledgerCells(page);
    await page.reload();
    await settled(page, 'route');
    expect(await page.locator('#import-status').innerText()).toContain('Restored');
    expect(await ledgerCells(page)).toEqual(edited);
    // An out-of-range value: the error names the field and the allowed range; the entry stays.
    await page.fill('#step-0-value', '-3');
    await settled(page, 'route');
    const msg = await page.locator('#cell-validation .sl-error').innerText();
    expect(msg).toContain('steps[0].thickness');
    expect(await page.inputValue('#step-0-value')).toBe('-3');
    await page.reload();
    await settled(page, 'route');
    expect(await page.inputValue('#step-0-value')).toBe('-3'); // nothing the user typed is lost
    await page.fill('#step-0-value', '1.7');
    await settled(page, 'route');
    expect(await page.locator('#cell-validation .sl-error').count()).toBe(0);
    // Importing a malformed plan keeps the route on screen and says what is wrong.
    await page.setInputFiles('#import-file', { name: 'broken.json', mimeType: 'application/json', buffer: Buffer.from('{ "name": "x", "material": { "name": "m", "elasticModulus": -1, "flowCurve": { "law": "hollomon", "K": 500, "n": 0.2 } }, "steps": [] }') });
    await expect.poll(() => page.locator('#import-status .sl-error').count()).toBe(1);
    expect(await page.locator('#import-status').innerText()).toContain('elasticModulus');
    expect(await ledgerCells(page)).toEqual(edited);
    expect(errors).toEqual([]);
    await context.close();
  });
});
