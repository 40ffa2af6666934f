// Real-browser test of the notebook index page.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openPage, startHarness, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

describe('notebook index', () => {
  it('lists every notebook with a working link, shows the cautions, and logs no console error', async () => {
    const { page, errors } = await openPage(h, '/');
    const links = page.locator('#notebook-list a');
    expect(await links.allInnerTexts()).toEqual(['Prestrain explorer', 'Route planner', 'Record bench']);
    expect(await page.locator('.sl-cautions').innerText()).toContain('not test results');
    await page.screenshot({ path: `${SCREENSHOTS}/index.png`, fullPage: true });
    for (const href of await links.evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).href))) {
      const r = await page.request.get(href);
      expect(r.status(), href).toBe(200);
    }
    expect(errors).toEqual([]);
  });
});
