// Notebook latency over every slider of every notebook, headless Chromium (Debian's
// /usr/bin/chromium, --disable-gpu), in one run so the numbers sit side by side under one load.
//
// Per sample: a slider's `input` event is dispatched at t0; a MutationObserver on the whole page
// records the time of every DOM change; once the notebook has settled (`Notebook.idle()`) and the
// page has then stayed quiet for QUIET_MS, the sample's latency is (time of the last mutation − t0).
// Two kinds of samples per slider:
//   random — a seeded pseudo-random value anywhere in the slider's range, after a random 0–20 ms
//            pause, so events land at every phase of the frame;
//   drag   — consecutive small moves (1–3 slider steps), each one animation frame after the page
//            went quiet from the previous one, as a pointer drag that does not wait for a rest.
// A notebook that answers a move with a quick preview and refines it later (scatter: the full Monte
// Carlo once the slider rests) fires `strainledger:refine` before the refined answer: the latency is
// then the last DOM change before that event, and the refined answer's time is reported beside it
// ("full answer", random samples only; drags move on before the slider rests).
// Computation-only time = the time spent inside the notebook's cell functions for that sample
// (Notebook.profile), which includes building chart DOM off-page but not layout or paint.
//
// Run: npm run build (not needed for the notebooks) && node bench/notebook-latency.mjs [notebook ...]
// (a notebook name may carry a query, e.g. `reversal?redraw design?sync`: the old behaviour, for an A/B)
// Options via env: SAMPLES (per kind per slider, default 40).
import { loadavg } from 'node:os';
import { openNotebook, startNotebooks } from './browser.mjs';

const SAMPLES = Number(process.env.SAMPLES ?? 40);
const QUIET_MS = 40;
const ALL = ['prestrain', 'route', 'records', 'reversal', 'scatter', 'design'];
const wanted = process.argv.slice(2).length ? process.argv.slice(2) : ALL;

const nb = await startNotebooks();
const q = (xs, p) => { if (!xs.length) return NaN; const s = [...xs].sort((a, b) => a - b); return s[Math.min(s.length - 1, Math.ceil(p * s.length) - 1)]; };
const f = (x) => (Number.isFinite(x) ? x.toFixed(1) : '–');
const rows = [];
const loads = [loadavg()[0]];
try {
  for (const name of wanted) {
    // A name may carry a query for an A/B in the same run: `design?sync` (route search on the
    // page's thread), `reversal?redraw` (Plot redraws on every move), the old behaviour of each.
    const [base, query] = name.split('?');
    const page = await openNotebook(nb, base, query);
    const sliders = await page.evaluate(() => [...document.querySelectorAll('.sl-slider input[type=range], .sl-step-slider input[type=range]')].map((r) => r.id));
    if (sliders.length === 0) { rows.push({ name, slider: '(no sliders)' }); await page.close(); continue; }
    for (const id of sliders) {
      const r = await page.evaluate(async ({ n, id, samples, quietMs }) => {
        const nb = window.strainledger[n];
        const range = document.getElementById(id);
        const min = Number(range.min), max = Number(range.max), step = Number(range.step) || 1;
        const label = range.getAttribute('aria-label')?.replace(/ \(slider\)$/, '') ?? document.querySelector(`label[for="${id}"]`)?.textContent ?? id;
        let seed = 12345;
        const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
        const snap = (v) => Math.min(max, Math.max(min, min + Math.round((v - min) / step) * step));
        const frame = () => new Promise((res) => requestAnimationFrame(() => res()));
        let last = 0, first = 0, count = 0, refineAt = null;
        const mo = new MutationObserver(() => { const t = performance.now(); last = t; if (refineAt === null) first = t; count++; });
        mo.observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
        const onRefine = () => { refineAt = performance.now(); };
        window.addEventListener('strainledger:refine', onRefine);
        const quiet = async () => {
          for (;;) {
            const seen = count;
            await new Promise((res) => setTimeout(res, quietMs));
            if (count === seen) break;
          }
        };
        // rest = true: wait for everything the move starts (the notebook idle, a refined answer
        // included); rest = false (drag): wait only until the page is quiet, then move on.
        const one = async (value, rest) => {
          nb.profile = new Map();
          count = 0;
          refineAt = null;
          const t0 = performance.now();
          last = first = t0;
          range.value = String(value);
          range.dispatchEvent(new Event('input', { bubbles: true }));
          if (rest) await nb.idle();
          await quiet();
          const compute = [...nb.profile.values()].reduce((a, b) => a + b, 0);
          const cells = Object.fromEntries(nb.profile);
          nb.profile = null;
          return { dom: first - t0, full: refineAt === null ? null : last - t0, compute, cells, changed: count > 0 };
        };
        // Warm-up (JIT, chart code paths), not counted.
        for (let i = 0; i < 8; i++) await one(snap(min + rand() * (max - min)), true);
        const random = [], drag = [];
        for (let i = 0; i < samples; i++) {
          await new Promise((res) => setTimeout(res, rand() * 20));
          random.push(await one(snap(min + rand() * (max - min)), true));
        }
        let v = snap(min + (max - min) * 0.3), dir = 1;
        for (let i = 0; i < samples; i++) {
          await frame();
          let nv = snap(v + dir * step * (1 + Math.floor(rand() * 3)));
          if (nv >= max || nv <= min) { dir = -dir; nv = snap(v + dir * step); }
          v = nv;
          drag.push(await one(v, false));
        }
        mo.disconnect();
        window.removeEventListener('strainledger:refine', onRefine);
        await nb.idle();
        return { label, random, drag };
      }, { n: base, id, samples: SAMPLES, quietMs: QUIET_MS });
      loads.push(loadavg()[0]);
      const all = [...r.random, ...r.drag];
      const cellTotals = {};
      for (const s of all) for (const [k, v] of Object.entries(s.cells)) cellTotals[k] = (cellTotals[k] ?? 0) + v / all.length;
      const top = Object.entries(cellTotals).sort((a, b) => b[1] - a[1]).slice(0, 3).map(([k, v]) => `${k} ${v.toFixed(1)}`).join(', ');
      rows.push({
        name, slider: r.label,
        randMed: q(r.random.map((s) => s.dom), 0.5), randP95: q(r.random.map((s) => s.dom), 0.95),
        dragMed: q(r.drag.map((s) => s.dom), 0.5), dragP95: q(r.drag.map((s) => s.dom), 0.95),
        p95: q(all.map((s) => s.dom), 0.95), max: Math.max(...all.map((s) => s.dom)), computeMed: q(all.map((s) => s.compute), 0.5), computeP95: q(all.map((s) => s.compute), 0.95),
        unchanged: all.filter((s) => !s.changed).length, n: all.length, top,
        fullMed: q(r.random.filter((s) => s.full !== null).map((s) => s.full), 0.5), fullP95: q(r.random.filter((s) => s.full !== null).map((s) => s.full), 0.95),
      });
      process.stderr.write(`${name} / ${r.label}: p95 ${f(rows.at(-1).p95)} ms\n`);
    }
    await page.close();
  }
} finally {
  await nb.close();
}
console.log(`notebook latency: input event → last DOM change, ${SAMPLES} random + ${SAMPLES} drag samples per slider, headless Chromium --disable-gpu, 1280×800, ${new Date().toISOString()}`);
console.log(`load average (1 min) during the run: min ${Math.min(...loads).toFixed(1)}, max ${Math.max(...loads).toFixed(1)} (2 cores)`);
console.log('');
console.log('| notebook | slider | random median | random p95 | drag median | drag p95 | all p95 | all max | ≤ 16 ms p95 | computation median / p95 | slowest cells (mean ms) | full answer median / p95 |');
console.log('|---|---|---:|---:|---:|---:|---:|---:|---|---:|---|---:|');
for (const r of rows) {
  if (r.p95 === undefined) { console.log(`| ${r.name} | ${r.slider} | | | | | | | | | | |`); continue; }
  console.log(`| ${r.name} | ${r.slider} | ${f(r.randMed)} | ${f(r.randP95)} | ${f(r.dragMed)} | ${f(r.dragP95)} | ${f(r.p95)} | ${f(r.max)} | ${r.p95 <= 16 ? 'met' : 'NOT met'} | ${f(r.computeMed)} / ${f(r.computeP95)} | ${r.top} | ${Number.isFinite(r.fullMed) ? `${f(r.fullMed)} / ${f(r.fullP95)}` : '–'} |`);
}
