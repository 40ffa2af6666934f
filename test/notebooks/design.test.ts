// Real-browser test of the route designer (Debian's Chromium via playwright-core).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openPage, settled, startHarness, REPO, SCREENSHOTS, type Harness } from './browser.js';
import { designRoute } from '../../src/core/index.js';
import { loadDesignSpecText } from '../../src/plan/designSpec.js';
import { designInput } from '../../notebooks/design/request.js';

let h: Harness;
let tmp: string;
beforeAll(async () => { h = await startHarness(); tmp = mkdtempSync(join(tmpdir(), 'sl-design-nb-')); });
afterAll(async () => { await h?.close(); rmSync(tmp, { recursive: true, force: true }); });

const EXAMPLE = join(REPO, 'examples', 'design-fencing-wire.yaml');
const cli = (...args: string[]) => spawnSync(process.execPath, [join(REPO, 'bin', 'strainledger.js'), ...args], { cwd: REPO, encoding: 'utf8' });

describe('route designer', () => {
  it('shows the same ranked routes as `strainledger design`, follows the pass slider, and a downloaded route runs with every target met', async () => {
    const { page, errors } = await openPage(h, '/design/');
    await settled(page, 'design');
    expect(await page.locator('.sl-cautions').isVisible()).toBe(true);
    expect(await page.locator('#cell-spec-note').innerText()).toContain('INVENTED');
    const json = JSON.parse(cli('design', EXAMPLE, '--format', 'json').stdout);
    const items = page.locator('#routes > li');
    expect(await items.count()).toBe(json.routes.length);
    const first = await items.first().innerText();
    expect(first).toContain(`${json.routes[0].anneals} anneal, ${json.routes[0].passes} passes`);
    // The sizes the page shows are the runner's plan sizes (3 decimals in mm).
    const sizes = json.routes[0].plan.steps.map((s: { kind: string; diameter?: number }) => (s.kind === 'anneal' ? 'anneal' : s.diameter!.toFixed(3)));
    expect(first).toContain(['5.500', ...sizes].join(' → '));
    await page.screenshot({ path: `${SCREENSHOTS}/design.png`, fullPage: true });

    // Download route 1 and run it headless.
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('button[data-route="1"]')]);
    const f = join(tmp, 'route1.json');
    await download.saveAs(f);
    const run = cli('run', f, '--format', 'json');
    expect(run.status, run.stderr).toBe(0);
    expect(JSON.parse(readFileSync(f, 'utf8')).steps.length).toBe(json.routes[0].plan.steps.length);

    // A smaller reduction per pass needs more passes: at 20 % the fewest is ⌈2·ln(5.5/2.5)/−ln 0.8⌉ = 8.
    await page.fill('#pass-number', '20');
    await page.locator('#pass-number').press('Tab');
    await settled(page, 'design');
    expect(await items.first().innerText()).toMatch(/, (8|9|10) passes/);
    expect(errors).toEqual([]);
  });

  it("a slider move marks the routes on screen as updating at once; when it rests, the worker's routes are the core's designRoute for those values", async () => {
    const { page, errors } = await openPage(h, '/design/');
    await settled(page, 'design');
    // Catch the state right after the move: the previous routes, marked as updating (the search of
    // 8 % on the fencing-wire demo takes tens of ms in the worker).
    // Every state the page shows from the move on is recorded (a MutationObserver, so a worker that answers
    // within the first frame on a fast machine cannot hide the 'updating' state): the first one must be
    // 'updating' with its note.
    const during = await page.evaluate(() => {
      const seen: { state: string | null; note: string; t: number }[] = [];
      const look = () => seen.push({ state: document.getElementById('routes')?.getAttribute('data-resolution') ?? null, note: document.getElementById('cell-summary')?.textContent ?? '', t: performance.now() });
      const mo = new MutationObserver(look);
      mo.observe(document.body, { subtree: true, childList: true, attributes: true, attributeFilter: ['data-resolution'] });
      (window as unknown as { __designStates: typeof seen; __designObserver: MutationObserver }).__designStates = seen;
      (window as unknown as { __designObserver: MutationObserver }).__designObserver = mo;
      const r = document.getElementById('pass-range') as HTMLInputElement;
      const t0 = performance.now();
      r.value = '8';
      r.dispatchEvent(new Event('input', { bubbles: true }));
      return new Promise<{ t0: number; frame: number }>((res) => requestAnimationFrame((frame) => res({ t0, frame })));
    });
    await settled(page, 'design');
    const states = await page.evaluate(() => {
      const w = window as unknown as { __designStates: { state: string | null; note: string; t: number }[]; __designObserver: MutationObserver };
      w.__designObserver.disconnect();
      return w.__designStates.filter((x, i, a) => i === 0 || x.state !== a[i - 1]!.state);
    });
    const first = states.find((x) => x.state !== null);
    expect(first?.state, JSON.stringify(states)).toBe('updating');
    expect(first!.note).toContain('Updating: these routes are for the previous slider values');
    // …and the full answer comes after it.
    expect(states.at(-1)?.state).toBe('full');
    expect(during.t0).toBeLessThanOrEqual(first!.t);
    expect(await page.getAttribute('#routes', 'data-resolution')).toBe('full');
    expect(await page.locator('#cell-summary').innerText()).not.toContain('Updating');
    // Reference: the core's search in Node on the same file and values (the runner's function).
    const spec = loadDesignSpecText(readFileSync(EXAMPLE, 'utf8'), 'design-spec.yaml');
    const ref = designRoute(designInput(spec, 8, 0.2));
    const items = page.locator('#routes > li');
    expect(await items.count()).toBe(ref.routes.length);
    for (let i = 0; i < ref.routes.length; i++) {
      const r = ref.routes[i]!;
      const text = await items.nth(i).innerText();
      expect(text).toContain(`${r.anneals} anneal${r.anneals === 1 ? '' : 's'}, ${r.passes} passes`);
      expect(text).toContain(`final reduction ${r.finalReductionPct.toFixed(1)} %`);
      expect(text).toContain(`final reload yield Rp0.2 ${r.ledger.rows.at(-1)!.reloadYield.toFixed(1)} MPa`);
    }
    expect(await page.locator('#cell-summary').innerText()).toContain(`${ref.candidatesTried} candidate schedules`);
    expect(errors).toEqual([]);
  });

  it('an infeasible specification names the binding limit; an invalid one shows the error cell with the line', async () => {
    const { page } = await openPage(h, '/design/');
    await settled(page, 'design');
    const text = readFileSync(EXAMPLE, 'utf8');
    await page.fill('#spec-text', text.replace('final: { diameter: 2.5 }', 'final: { diameter: 5.2 }'));
    await page.locator('#spec-text').dispatchEvent('change');
    await settled(page, 'design');
    expect(await page.locator('#binding').innerText()).toMatch(/binding limit is total reduction/);
    await page.fill('#spec-text', text.replace('maxPassReductionPct: 30', 'maxPassReductionPct: 130'));
    await page.locator('#spec-text').dispatchEvent('change');
    await settled(page, 'design').catch(() => undefined);
    const err = page.locator('#cell-spec-note [role="alert"]');
    await err.waitFor();
    expect(await err.innerText()).toMatch(/limits\.maxPassReductionPct/);
    // The user's text is kept (autosaved) across a reload.
    await page.reload();
    await settled(page, 'design').catch(() => undefined);
    expect(await page.locator('#spec-text').inputValue()).toContain('maxPassReductionPct: 130');
    await page.click('#spec-reset');
  });
});
