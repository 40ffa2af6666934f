import { it } from 'vitest';
import { openPage, startHarness } from './browser.js';
it('debug', async () => {
  const h = await startHarness();
  const { page, errors } = await openPage(h, process.env.DBG_PATH ?? '/route/');
  await page.waitForTimeout(3000);
  console.log('ERRORS', errors);
  console.log((await page.locator('main').innerText()).slice(0, 800));
  await h.close();
});
