// Real-browser test of the notebook index page.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openPage, startHarness, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

describe('notebook index', () => {
  it('lists the notebooks, each link answering 200, shows the cautions, and logs no console error', async () => {
    const { page, errors } = await openPage(h, '/');
    const links = page.locator('#notebook-list a');
    // Other notebooks are added by later issues; these three must be there.
    const titles = await links.allInnerTexts();
    for (const t of ['Prestrain explorer', 'Route planner', 'Record bench']) expect(titles).toContain(t);
    expect(await page.locator('.sl-cautions').innerText()).toContain('not test results');
    await page.screenshot({ path: `${SCREENSHOTS}/index.png`, fullPage: true });
    // The server has no single-page fallback (appType 'mpa'), so 200 means the page exists.
    expect((await page.request.get(`${h.base}/no-such-notebook/`)).status()).toBe(404);
    for (const href of await links.evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).href))) {
      const r = await page.request.get(href);
      expect(r.status(), href).toBe(200);
    }
    expect(errors).toEqual([]);
  });
});
