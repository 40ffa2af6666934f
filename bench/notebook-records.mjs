// Record bench, drop to settled: an INVENTED 100,000-point record (bench/records-gen.mjs) dropped
// on the record bench in headless Chromium (Debian's /usr/bin/chromium, --disable-gpu), timed from
// the `drop` event to every cell settled and the result painted (properties, fits, charts). Parsing
// and fitting run in the page's web worker; the page thread's longest task during that time
// (PerformanceObserver 'longtask') and the longest gap between animation frames say whether the
// page froze. 1 warm-up drop, then 5 timed drops alternating two file names (each is recomputed).
// Run after `npm run build`: node bench/notebook-records.mjs
import { loadavg } from 'node:os';
import { openNotebook, startNotebooks } from './browser.mjs';
import { inventedRecord } from './records-gen.mjs';

const ROWS = Number(process.env.ROWS ?? 100_000);
const rec = inventedRecord(ROWS);
let text = 'Strain [%],Stress [MPa]\n';
for (let i = 0; i < rec.strain.length; i++) text += `${(rec.strain[i] * 100).toFixed(6)},${rec.stress[i].toFixed(4)}\n`;

const nb = await startNotebooks();
try {
  const page = await openNotebook(nb, 'records');
  const result = await page.evaluate(async ({ text, drops }) => {
    const nb = window.strainledger.records;
    const painted = () => new Promise((resolve) => requestAnimationFrame(() => {
      const ch = new MessageChannel();
      ch.port1.onmessage = () => resolve(performance.now());
      ch.port2.postMessage(0);
    }));
    const name = () => document.getElementById('cell-record-name').textContent;
    const drop = (file) => {
      const d = new DataTransfer();
      d.items.add(new File([text], file, { type: 'text/csv' }));
      document.getElementById('record-drop').dispatchEvent(new DragEvent('drop', { dataTransfer: d, bubbles: true, cancelable: true }));
    };
    let longest = 0;
    const obs = new PerformanceObserver((l) => { for (const e of l.getEntries()) longest = Math.max(longest, e.duration); });
    obs.observe({ type: 'longtask' });
    const out = [];
    for (let i = 0; i <= drops; i++) {
      const file = `invented-${i % 2 ? 'b' : 'a'}-${i}.csv`;
      longest = 0;
      let gap = 0, last = performance.now(), watching = true;
      const watch = () => requestAnimationFrame((t) => { gap = Math.max(gap, t - last); last = t; if (watching) watch(); });
      watch();
      const t0 = performance.now();
      drop(file);
      // The drop reads the file asynchronously before the notebook sees it: wait for the new name.
      while (!name().includes(file.replace(/\.csv$/, ''))) await new Promise((r) => setTimeout(r, 1));
      await nb.idle();
      const t2 = await painted();
      watching = false;
      await new Promise((r) => setTimeout(r, 50));
      if (i > 0) out.push({ ms: t2 - t0, longTask: longest, frameGap: gap });
    }
    obs.disconnect();
    return { out, rows: document.getElementById('record-summary').textContent, laws: document.querySelectorAll('#fits-table tbody tr').length, errors: document.querySelectorAll('.sl-error').length };
  }, { text, drops: 5 });
  const med = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  const f = (x) => x.toFixed(0);
  console.log(`record bench, drop of an INVENTED ${rec.strain.length}-point record (${(text.length / 1048576).toFixed(1)} MB) → settled and painted, headless Chromium --disable-gpu, ${new Date().toISOString()}`);
  console.log(`  ${result.rows.trim()}; ${result.laws} law fits shown; ${result.errors} error cells`);
  console.log(`  drop → settled and painted: median ${f(med(result.out.map((r) => r.ms)))} ms over ${result.out.length} drops (${result.out.map((r) => f(r.ms)).join(', ')})`);
  console.log(`  page thread: longest task ${f(Math.max(...result.out.map((r) => r.longTask)))} ms, longest gap between frames ${f(Math.max(...result.out.map((r) => r.frameGap)))} ms`);
  console.log(`  load average ${loadavg().map((x) => x.toFixed(1)).join(' ')} (2 cores)`);
  console.log(`  aim: drop → settled ≤ 1000 ms: ${med(result.out.map((r) => r.ms)) <= 1000 ? 'met' : 'NOT met'}`);
} finally {
  await nb.close();
}
