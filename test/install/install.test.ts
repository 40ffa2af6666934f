import { execFileSync, spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { stringify } from 'yaml';
import { CHROMIUM, CHROMIUM_ARGS, SCREENSHOTS } from '../notebooks/browser.js';

// Installs strainledger the way a user does (issue 13): `npm pack` of the built tree (dist/ is built
// by test/globalSetup.ts), `npm install` of the tarball into an empty project with npm's defaults
// (no install scripts of ours run there), then the README's CI commands, --version, run --help, an
// ESM import of each public entry, `tsc --noEmit` against the shipped declarations, a page built with
// vite that draws a ledger in Chromium, and `npm i -g` into a temporary prefix (never the machine's
// global one). Plans are INVENTED demo data (the repository's examples/).

const ROOT = join(import.meta.dirname, '..', '..');
const PKG = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { name: string; version: string };
const TMP = mkdtempSync(join(tmpdir(), 'sl-install-'));
const APP = join(TMP, 'forming-plans');
const GLOBAL = join(TMP, 'global');
const NODE_BIN = process.execPath.replace(/[/\\]node$/, '');

/** The environment of a user's shell: no npm_* variables inherited from `npm test`, no colour forcing. */
function userEnv(extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {};
  for (const [k, v] of Object.entries(process.env)) if (!/^npm_|^INIT_CWD$|^FORCE_COLOR$|^NO_COLOR$/i.test(k)) env[k] = v;
  return { ...env, CI: 'true', PATH: `${NODE_BIN}:${process.env.PATH ?? ''}`, ...extra };
}
const sh = (cmd: string, args: string[], cwd = APP, env = userEnv()): SpawnSyncReturns<string> =>
  spawnSync(cmd, args, { cwd, env, encoding: 'utf8', timeout: 180_000 });
const npm = (args: string[], cwd = APP) => {
  const r = sh('npm', args, cwd);
  if (r.status !== 0) throw new Error(`npm ${args.join(' ')} failed (${r.status}):\n${r.stderr}`);
  return r;
};
const npx = (...args: string[]) => sh('npx', ['--no-install', 'strainledger', ...args]);

let tarball = '';
let entries: string[] = [];
let installLog: SpawnSyncReturns<string> | undefined;

beforeAll(() => {
  // Pack the tree as it stands, through the package's own prepack/postpack (they keep `prepare` out of
  // the tarball's package.json); STRAINLEDGER_PACK_PREBUILT keeps the dist/ the global setup built.
  const packRun = sh('npm', ['pack', '--json', '--pack-destination', TMP], ROOT, userEnv({ STRAINLEDGER_PACK_PREBUILT: '1' }));
  if (packRun.status !== 0) throw new Error(`npm pack failed (${packRun.status}):\n${packRun.stderr}`);
  const packed = JSON.parse(packRun.stdout.slice(packRun.stdout.indexOf('['))) as { filename: string }[];
  tarball = join(TMP, packed[0]!.filename);
  entries = execFileSync('tar', ['-tzf', tarball], { encoding: 'utf8' }).split('\n').filter(Boolean);

  // The user's project: an empty package, the tarball installed with npm's defaults.
  mkdirSync(APP);
  writeFileSync(join(APP, 'package.json'), JSON.stringify({ name: 'forming-plans', version: '1.0.0', private: true, type: 'module' }, null, 2));
  installLog = npm(['install', '--prefer-offline', '--no-audit', '--no-fund', tarball]);

  // Plans in nested folders, as YAML, for the README's glob: one meets its targets, one does not.
  const plan = (file: string) => JSON.parse(readFileSync(join(ROOT, 'examples', file), 'utf8')) as Record<string, unknown>;
  mkdirSync(join(APP, 'plans', 'strip'), { recursive: true });
  mkdirSync(join(APP, 'plans', 'blanks'), { recursive: true });
  writeFileSync(join(APP, 'plans', 'strip', 'contact-spring.yaml'), stringify(plan('contact-spring-strip.json')));
  cpSync(join(ROOT, 'examples', 'bracket-stretch-specimen.yaml'), join(APP, 'plans', 'blanks', 'bracket.yaml'));
  mkdirSync(join(APP, 'bad'));
  writeFileSync(join(APP, 'bad', 'typo.yaml'), stringify({ ...plan('contact-spring-strip.json'), start: { thicknes: 2 } }));
}, 240_000);

afterAll(() => rmSync(TMP, { recursive: true, force: true }));

describe('the packed tarball', () => {
  it('holds the compiled entries with their declarations, the runner bundle, bin, schema, README and LICENSE', () => {
    const need = [
      'bin/strainledger.js', 'dist/runner/main.js', 'schema/report-v1.json', 'README.md', 'LICENSE', 'package.json',
      ...['core', 'plan', 'records', 'charts'].flatMap((e) => [`dist/${e}/index.js`, `dist/${e}/index.d.ts`]),
    ];
    for (const f of need) expect(entries, f).toContain(`package/${f}`);
    // Every compiled module of a public entry has its declaration beside it.
    const js = entries.filter((e) => /^package\/dist\/(core|plan|records|charts)\/.*\.js$/.test(e));
    expect(js.length).toBeGreaterThan(50);
    for (const f of js) expect(entries, f).toContain(f.replace(/\.js$/, '.d.ts'));
    // No sources, tests, notebooks or dependencies.
    expect(entries.filter((e) => /^package\/(src|test|notebooks|node_modules|bench)\//.test(e))).toEqual([]);
  });
  it('its package.json maps each public entry to types and code, needs no build at install, and is publishable', () => {
    const pkg = JSON.parse(execFileSync('tar', ['-xzOf', tarball, 'package/package.json'], { encoding: 'utf8' })) as Record<string, any>;
    for (const e of ['.', './plan', './records', './charts']) {
      expect(pkg.exports[e].types).toMatch(/^\.\/dist\/.*\.d\.ts$/);
      expect(entries).toContain(`package/${pkg.exports[e].types.slice(2)}`);
      expect(entries).toContain(`package/${pkg.exports[e].import.slice(2)}`);
    }
    expect(pkg.private).toBeUndefined();
    // No install-time scripts: npm would not run them for a dependency anyway, and npm 11 warns about
    // each (`prepare` included) in the user's project. The build runs on `prepack` instead.
    expect(Object.keys(pkg.scripts ?? {}).filter((s) => ['preinstall', 'install', 'postinstall', 'prepare'].includes(s))).toEqual([]);
    // Run-time dependencies are what the library imports; notebook and runner-bundle libraries are not.
    expect(Object.keys(pkg.dependencies).sort()).toEqual(['@observablehq/plot', 'csv-parse', 'simple-statistics', 'yaml', 'zod']);
  });
  it('installs without a warning about install scripts', () => {
    expect(installLog!.stdout + installLog!.stderr).not.toMatch(/install-scripts|allowScripts/);
  });
  it('npm publish --dry-run passes (nothing is published)', () => {
    const r = sh('npm', ['publish', '--dry-run', '--ignore-scripts'], ROOT);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout + r.stderr).toContain(`${PKG.name}@${PKG.version}`);
  });
});

describe('npx strainledger in the user project (the README\'s CI commands)', () => {
  it('--version prints the package version; run --help prints usage; exit 0', () => {
    const v = npx('--version');
    expect(v.status, v.stderr).toBe(0);
    expect(v.stdout).toBe(`strainledger ${PKG.version}\n`);
    const h = npx('run', '--help');
    expect(h.status, h.stderr).toBe(0);
    expect(h.stdout).toMatch(/^usage: strainledger run PLAN\.\.\. \[options\]/);
    expect(h.stdout).toContain('--format');
  });
  it("run 'plans/**/*.yaml' --jobs 2 --format junit --out reports: one JUnit file per plan, exit 1 (a target missed)", () => {
    const r = npx('run', 'plans/**/*.yaml', '--jobs', '2', '--format', 'junit', '--out', 'reports');
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr).not.toMatch(/\n\s+at |internal error/);
    const files = readdirSync(join(APP, 'reports')).sort();
    expect(files).toEqual(['bracket.junit.xml', 'contact-spring.junit.xml']);
    const failing = readFileSync(join(APP, 'reports', 'bracket.junit.xml'), 'utf8');
    expect(failing).toMatch(/<testsuites?[\s>]/);
    expect(failing).toMatch(/<failure/);
    expect(readFileSync(join(APP, 'reports', 'contact-spring.junit.xml'), 'utf8')).not.toMatch(/<failure/);
  });
  it('exit 0 when every plan meets its targets, 2 with a located message for an invalid plan', () => {
    expect(npx('run', 'plans/strip/*.yaml', '--format', 'junit', '--out', 'reports-ok').status).toBe(0);
    const bad = npx('run', 'bad/typo.yaml', '--format', 'json');
    expect(bad.status).toBe(2);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toMatch(/bad\/typo\.yaml:\d+:\d+.*start/);
    expect(bad.stderr).not.toMatch(/\n\s+at |internal error/);
  });
  it('the installed runner gives the repository runner\'s numbers for the same plan', () => {
    const installed = npx('run', 'plans/blanks/bracket.yaml', '--format', 'json');
    const repo = spawnSync(process.execPath, [join(ROOT, 'bin', 'strainledger.js'), 'run', join(APP, 'plans', 'blanks', 'bracket.yaml'), '--format', 'json'], { cwd: APP, encoding: 'utf8', env: userEnv() });
    const strip = (s: string) => { const j = JSON.parse(s); delete j.plan.file; return j; };
    expect(installed.status).toBe(repo.status);
    expect(strip(installed.stdout)).toEqual(strip(repo.stdout));
  });
});

describe('the library entries in the user project', () => {
  it('each public entry imports as ESM and computes (core ledger, YAML plan, record text, chart module)', () => {
    writeFileSync(join(APP, 'use.mjs'), `
import { evaluateRoute, makeLaw } from 'strainledger';
import { loadPlanText, runPlan, PlanError } from 'strainledger/plan';
import { parseRecordText } from 'strainledger/records';
import { strengthByStepChart, PALETTE } from 'strainledger/charts';
const law = makeLaw({ law: 'hollomon', K: 530, n: 0.44 });
const ledger = evaluateRoute({ material: { name: 'copper (INVENTED)', elasticModulus: 115000, poissonRatio: 0.3, law }, start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.5 }] });
const plan = loadPlanText(${JSON.stringify(readFileSync(join(ROOT, 'examples', 'bracket-stretch-specimen.yaml'), 'utf8'))}, 'bracket.yaml');
let refused = '';
try { loadPlanText('name: x', 'x.yaml'); } catch (e) { refused = e instanceof PlanError ? 'PlanError' : String(e); }
const rec = parseRecordText('strain,stress [MPa]\\n' + Array.from({ length: 20 }, (_, i) => (i * 0.001) + ',' + (i * 200)).join('\\n'), { file: 'r.csv' });
console.log(JSON.stringify({ yield: ledger.rows[0].reloadYield, planRows: runPlan(plan).rows.length, refused, rows: rec.stress.length, chart: typeof strengthByStepChart, ink: PALETTE.ink }));
`);
    const r = sh(process.execPath, ['use.mjs']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as Record<string, unknown>;
    // Hollomon σ = K·ε^n (Hollomon 1945) at ε̄ + 0.002, ε̄ = (2/√3)·ln(t0/t) for plane-strain rolling
    // (von Mises; DESIGN.md §4); reload yield = σ(ε̄ + 0.002)·e^(−0.002), the engineering 0.2 % proof
    // strength on the formed part's own section (DESIGN.md §2, DEVELOPERS.md conventions).
    // Closed form against the installed code, so only round-off separates them.
    const eps = (2 / Math.sqrt(3)) * Math.log(2 / 1.5) + 0.002;
    expect(Math.abs((out.yield as number) / (530 * eps ** 0.44 * Math.exp(-0.002)) - 1)).toBeLessThan(1e-12);
    expect(out).toMatchObject({ planRows: 2, refused: 'PlanError', rows: 20, chart: 'function', ink: expect.stringMatching(/^#/) });
  });
  it('a strict TypeScript file compiles with tsc --noEmit against the shipped declarations (nodenext and bundler resolution)', () => {
    writeFileSync(join(APP, 'typed.ts'), `
import { evaluateRoute, makeLaw, type Ledger, type LedgerRow, type RouteInput } from 'strainledger';
import { loadPlanText, type LoadedPlan, type PlanInput } from 'strainledger/plan';
import { parseRecordText, type TensileRecord } from 'strainledger/records';
import { strengthByStepChart, type LedgerChartStep } from 'strainledger/charts';
const route: RouteInput = { material: { name: 'copper (INVENTED)', elasticModulus: 115000, poissonRatio: 0.3, law: makeLaw({ law: 'hollomon', K: 530, n: 0.44 }) }, start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.5 }] };
const ledger: Ledger = evaluateRoute(route);
const rows: LedgerChartStep[] = ledger.rows.map((r: LedgerRow) => r);
const yieldMpa: number = rows[0]!.reloadYield;
const plan: LoadedPlan = loadPlanText('{}', 'p.json');
const input: PlanInput = { name: 'x', material: { name: 'm', elasticModulus: 1, flowCurve: { law: 'hollomon', K: 1, n: 0.1 } }, start: { thickness: 1 }, steps: [] };
const rec: TensileRecord = parseRecordText('', { file: 'r.csv' });
const chart: SVGSVGElement | HTMLElement = strengthByStepChart(rows, { stressUnit: 'MPa' });
// @ts-expect-error a stress is a number, not a string: the declarations carry real types, not any.
const wrong: string = yieldMpa;
export { plan, input, rec, chart, wrong };
`);
    const tsc = join(ROOT, 'node_modules', 'typescript', 'bin', 'tsc');
    for (const [module, resolution] of [['nodenext', 'nodenext'], ['esnext', 'bundler']]) {
      // A user's tsconfig: strict, no @types/node (a browser project). Under nodenext every .d.ts is
      // checked too (skipLibCheck false): ours and those of the dependencies they name.
      const config = `tsconfig.${resolution}.json`;
      writeFileSync(join(APP, config), JSON.stringify({ compilerOptions: { strict: true, noEmit: true, skipLibCheck: resolution !== 'nodenext', types: [], lib: ['es2022', 'dom'], target: 'es2022', module, moduleResolution: resolution }, files: ['typed.ts'] }));
      const r = sh(process.execPath, [tsc, '-p', config]);
      expect(r.status, `${resolution}: ${r.stdout}${r.stderr}`).toBe(0);
    }
  });
  it('a page built with vite imports strainledger and strainledger/charts and draws a ledger chart in Chromium', async () => {
    writeFileSync(join(APP, 'index.html'), '<!doctype html><html><head><meta charset="utf-8"><title>Strip ledger (INVENTED demo)</title></head><body><div id="chart"></div><script type="module" src="./page.js"></script></body></html>\n');
    writeFileSync(join(APP, 'page.js'), `
import { evaluateRoute, makeLaw } from 'strainledger';
import { strengthByStepChart } from 'strainledger/charts';
const law = makeLaw({ law: 'hollomon', K: 530, n: 0.44 });
const ledger = evaluateRoute({ material: { name: 'copper (INVENTED)', elasticModulus: 115000, poissonRatio: 0.3, law }, start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.6 }, { kind: 'roll', thickness: 1.2 }, { kind: 'anneal' }, { kind: 'roll', thickness: 0.9 }] });
document.getElementById('chart').append(strengthByStepChart(ledger.rows, { stressUnit: 'MPa', initialYield: ledger.initial.reloadYield, minYield: 300 }));
document.body.dataset.ready = String(ledger.rows.length);
`);
    // The repository's vite (8.3.8), rooted at the user's project: it resolves strainledger from there.
    const { build, preview } = await import('vite');
    await build({ root: APP, configFile: false, logLevel: 'error', cacheDir: join(TMP, 'vite-cache'), build: { outDir: join(APP, 'dist'), emptyOutDir: true } });
    expect(existsSync(join(APP, 'dist', 'index.html'))).toBe(true);
    const server = await preview({ root: APP, configFile: false, logLevel: 'error', preview: { port: 0, host: '127.0.0.1', strictPort: false }, build: { outDir: join(APP, 'dist') } });
    const browser = await chromium.launch({ executablePath: CHROMIUM, headless: true, args: CHROMIUM_ARGS });
    try {
      const page = await browser.newPage();
      const errors: string[] = [];
      page.on('pageerror', (e) => errors.push(e.message));
      await page.goto(server.resolvedUrls!.local[0]!);
      await page.waitForSelector('body[data-ready="4"]', { timeout: 20_000 });
      const svg = await page.evaluate(() => {
        const chart = document.querySelector('#chart');
        return { svgs: chart?.querySelectorAll('svg').length ?? 0, marks: chart?.querySelectorAll('svg path, svg circle, svg line, svg rect').length ?? 0, text: chart?.textContent ?? '' };
      });
      expect(errors).toEqual([]);
      expect(svg.svgs).toBeGreaterThan(0);
      expect(svg.marks).toBeGreaterThan(4);
      expect(svg.text).toContain('MPa');
      mkdirSync(SCREENSHOTS, { recursive: true });
      await page.screenshot({ path: join(SCREENSHOTS, 'install-user-page.png') });
    } finally {
      await browser.close();
      await new Promise<void>((res) => server.httpServer.close(() => res()));
    }
  });
});

describe('npm i -g of the tarball (into a temporary prefix)', () => {
  it('gives a working strainledger command', () => {
    npm(['install', '-g', '--prefix', GLOBAL, '--prefer-offline', '--no-audit', '--no-fund', tarball], TMP);
    const bin = join(GLOBAL, 'bin', 'strainledger');
    const v = sh(bin, ['--version']);
    expect(v.status, v.stderr).toBe(0);
    expect(v.stdout).toBe(`strainledger ${PKG.version}\n`);
    const r = sh(bin, ['run', 'plans/strip/contact-spring.yaml', '--format', 'json']);
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout).allTargetsMet).toBe(true);
  });
});

describe('npm install from git (a local bare clone of this repository\'s HEAD)', () => {
  // A git dependency has no dist/ (it is git-ignored): npm builds it in its clone only when the package
  // has a `prepare` script (npm then installs the devDependencies there and runs it). The tarball must
  // not carry `prepare` (npm 11 warns about it in the user's project), so `prepack` strips it from the
  // packed package.json and `postpack` restores it (scripts/pack-manifest.mjs).
  it('the repository has `prepare` (git) and the tarball has not (registry)', () => {
    const repo = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { scripts: Record<string, string> };
    expect(repo.scripts.prepare).toBe('npm run build');
    const packed = JSON.parse(execFileSync('tar', ['-xzOf', tarball, 'package/package.json'], { encoding: 'utf8' })) as { scripts?: Record<string, string> };
    expect(packed.scripts?.prepare).toBeUndefined();
  });
  it('installs, builds dist/ in npm\'s clone, and the runner and the library work', () => {
    const bare = join(TMP, 'strainledger.git');
    execFileSync('git', ['clone', '--quiet', '--bare', ROOT, bare]);
    const app = join(TMP, 'from-git');
    mkdirSync(app);
    writeFileSync(join(app, 'package.json'), JSON.stringify({ name: 'from-git', version: '1.0.0', private: true, type: 'module' }, null, 2));
    const r = sh('npm', ['install', '--prefer-offline', '--no-audit', '--no-fund', `git+file://${bare}`], app);
    expect(r.status, r.stderr).toBe(0);
    const pkgDir = join(app, 'node_modules', 'strainledger');
    for (const f of ['dist/runner/main.js', 'dist/core/index.js', 'dist/core/index.d.ts', 'bin/strainledger.js']) expect(existsSync(join(pkgDir, f)), f).toBe(true);
    const v = sh('npx', ['--no-install', 'strainledger', '--version'], app);
    expect(v.stdout).toBe(`strainledger ${PKG.version}\n`);
    cpSync(join(ROOT, 'examples', 'contact-spring-strip.json'), join(app, 'plan.json'));
    const run = sh('npx', ['--no-install', 'strainledger', 'run', 'plan.json', '--format', 'json'], app);
    expect(run.status, run.stderr).toBe(0);
    const mine = JSON.parse(spawnSync(process.execPath, [join(ROOT, 'bin', 'strainledger.js'), 'run', 'examples/contact-spring-strip.json', '--format', 'json'], { cwd: ROOT, encoding: 'utf8' }).stdout);
    expect(JSON.parse(run.stdout).steps.map((s: { reloadYield: number }) => s.reloadYield)).toEqual(mine.steps.map((s: { reloadYield: number }) => s.reloadYield));
    const lib = sh(process.execPath, ['--input-type=module', '-e', "import { hollomon } from 'strainledger'; console.log(hollomon({ K: 530, n: 0.44 }).stress(0.2).toFixed(3));"], app);
    expect(lib.stdout.trim(), lib.stderr).toBe((530 * 0.2 ** 0.44).toFixed(3)); // σ = Kε^n (Hollomon 1945)
  }, 300_000);
});
