/// <reference types="vite/client" />
import { cautionsPanel, h } from '../../src/cells/index.js';
import { loadPlanText, type LoadedPlan } from '../../src/plan/load.js';
import './style.css';

/** The notebooks, for the index page and the navigation bar. */
export const NOTEBOOKS = [
  { path: 'prestrain/', title: 'Prestrain explorer', blurb: 'Drag the prestrain: reload yield, tensile strength, elastic recovery and remaining uniform elongation follow, for every law side by side.' },
  { path: 'route/', title: 'Route planner', blurb: 'Edit a route of forming steps and anneals; the ledger, the targets and the cold-work window follow. Import and export plan files for the runner.' },
  { path: 'records/', title: 'Record bench', blurb: 'Drop a tensile-test record (CSV): properties, the elastic window, law fits with residuals and intervals; send a law to the route planner.' },
  { path: 'design/', title: 'Route designer', blurb: 'Give start and final size, pass and anneal limits and a property window: ranked routes with passes, anneals and the final temper reduction, each downloadable as a plan.' },
  { path: 'scatter/', title: 'Scatter', blurb: 'Heat-to-heat scatter of the stock through the route: histogram of the final yield with the target, the probability of meeting it and a lower tolerance bound, following the final-pass slider.' },
  { path: 'reversal/', title: 'Reversal and springback', blurb: 'A load path pulled then pushed back, with backstresses against isotropic hardening; the springback and residual stress of a bend, following the prestrain slider.' },
] as const;

/** Header with the navigation (current page marked) and the cautions at the top of every notebook. */
export function pageChrome(current: string, title: string): void {
  const base = import.meta.env.BASE_URL;
  const header = h('header', { class: 'sl-top' },
    h('h1', {}, title),
    h('nav', { 'aria-label': 'Notebooks' },
      h('a', { href: base }, 'all notebooks'),
      ...NOTEBOOKS.map((n) => h('a', { href: base + n.path, ...(n.path === current ? { 'aria-current': 'page' } : {}) }, n.title))));
  document.body.prepend(header);
  document.querySelector('main')?.prepend(cautionsPanel());
}

/** The invented demo plans shipped in examples/, as text (the same files the runner's demo uses). */
const EXAMPLES = import.meta.glob('../../examples/*.{json,yaml,yml}', { query: '?raw', import: 'default', eager: true }) as Record<string, string>;

/** The plan `npm run demo` runs; notebooks open with it. */
export const RUNNER_DEMO = 'examples/contact-spring-strip.json';

export interface DemoPlan {
  file: string;
  text: string;
  plan: LoadedPlan;
}

/** Every demo plan, loaded and validated like the runner does. */
export function demoPlans(): DemoPlan[] {
  // examples/ also holds files that are not plans (records, design files of other commands):
  // only the files that load as plans are offered.
  return Object.entries(EXAMPLES)
    .flatMap(([path, text]) => {
      const file = 'examples/' + path.split('/').pop()!;
      try {
        return [{ file, text, plan: loadPlanText(text, file) }];
      } catch {
        return [];
      }
    })
    // The runner's built-in demo (`npm run demo`) first, the others by name.
    .sort((a, b) => (b.file === RUNNER_DEMO ? 1 : 0) - (a.file === RUNNER_DEMO ? 1 : 0) || a.file.localeCompare(b.file));
}

/** Storage key of the material the record bench hands to the other notebooks. */
export const BENCH_MATERIAL_KEY = 'bench-material';
