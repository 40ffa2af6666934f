// Real-browser test of the route planner's temper column, temper target and grain-growth warning
// against the runner on the same exported plan.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openPage, settled, startHarness, REPO, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
let tmp: string;
beforeAll(async () => { h = await startHarness(); tmp = mkdtempSync(join(tmpdir(), 'sl-route-temper-')); });
afterAll(async () => { await h?.close(); rmSync(tmp, { recursive: true, force: true }); });

type Page = import('playwright-core').Page;
const column = (page: Page, col: string) => page.$$eval(`#ledger-table tbody td[data-col="${col}"]`, (tds) => tds.map((td) => td.textContent));

async function exportAndRun(page: Page, name: string): Promise<{ status: number | null; report: any }> {
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export')]);
  const file = join(tmp, name);
  await download.saveAs(file);
  const run = spawnSync(process.execPath, [join(REPO, 'bin', 'strainledger.js'), 'run', file, '--format', 'json'], { encoding: 'utf8' });
  return { status: run.status, report: JSON.parse(run.stdout) };
}

describe('route planner: tempers', () => {
  it('the INVENTED terminal-strip demo shows the runner\'s tempers, the temper target and the grain-growth warning', async () => {
    const { page, errors, context } = await openPage(h, '/route/');
    await settled(page, 'route');
    await page.selectOption('#demo-select', { label: 'examples/terminal-strip-temper.json (INVENTED)' });
    await page.click('#load-demo');
    await settled(page, 'route');
    const { status, report } = await exportAndRun(page, 'temper.json');
    expect(status).toBe(0);
    const shown = await column(page, 'temper');
    // The runner's JSON through the report's own wording: designation and whole per cent toward the next temper.
    expect(shown).toEqual(report.steps.map((s: any) => (s.temper ? `${s.temper.designation} (${Math.floor(s.temper.towardNext * 100)} % of the way to ${s.temper.next})` : '—')));
    expect(shown.at(-1)).toMatch(/^H02 /);
    expect(await page.locator('[data-target="temper"]').innerText()).toMatch(/^met — temper H02 \(half hard\): .*; H02 wanted, H02 reached; H02 runs from 20\.7 to 29\.4 % thickness reduction; margin to its lower boundary/);
    expect((await column(page, 'warnings'))[1]).toMatch(/grain growth/);
    expect(await page.locator('#temper-caution').innerText()).toMatch(/Tempers are named from the predicted state/);
    await page.screenshot({ path: join(SCREENSHOTS, 'route-tempers.png'), fullPage: true });

    // Ask for H04: the page and the runner both say it is missed.
    await page.fill('#target-temper', 'H04');
    await settled(page, 'route');
    expect(await page.locator('[data-target="temper"]').innerText()).toMatch(/^NOT met — temper H04 \(hard\): .*; H04 wanted, H02 reached; H04 runs from 37\.1 /);
    const missed = await exportAndRun(page, 'temper-h04.json');
    expect(missed.status).toBe(1);
    expect(missed.report.targets.find((t: any) => t.name === 'temper').met).toBe(false);

    // No temper system: the column goes away and the target is refused with its field named.
    await page.fill('#target-temper', '');
    await page.selectOption('#material-temper-system', '');
    await settled(page, 'route');
    expect(await page.locator('#ledger-table thead').innerText()).not.toContain('temper');
    expect(errors).toEqual([]);
    await context.close();
  });
});
