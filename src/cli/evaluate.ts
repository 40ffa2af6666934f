import { createHash } from 'node:crypto';
import { statSync } from 'node:fs';
import { checkPlan } from '../plan/check.js';
import { formatOf, MAX_PLAN_BYTES, parseLocated, type Located } from '../plan/parse.js';
import { PlanError } from '../plan/problems.js';
import { resolvePlan, runPlan, withLocation, type LoadedPlan } from '../plan/resolve.js';
import type { PlanDoc } from '../plan/schema.js';
import { buildReport, type ReportV1 } from '../report/build.js';
import { readText } from './io.js';
import { applyOverride, showPath, type Override } from './overrides.js';
import { TOOL } from './version.js';
import type { ScatterSummary } from '../core/scatter/summarize.js';

// Start-up matters for a CI step (issue 4: at most twice `node -e 0`), so this module loads only
// what every valid JSON plan needs. The YAML package, zod (for the words of a refused plan), record
// fitting and the scatter sampler are imported when a plan needs them (bench/RESULTS.md, "Runner cold start").

/** A plan file read and parsed once (a sweep evaluates it many times). */
export interface PlanSource {
  file: string;
  text: string;
  loc: Located;
}

/**
 * Reads and parses a plan file. Refuses files over {@link MAX_PLAN_BYTES} before reading them,
 * invalid UTF-8, syntax errors and nesting too deep for the parser — each as a PlanError (exit 2).
 */
export async function readPlan(file: string): Promise<PlanSource> {
  let size = 0;
  try {
    size = statSync(file).size;
  } catch {
    /* readText reports a missing file */
  }
  if (size > MAX_PLAN_BYTES) throw new PlanError([{ file, path: '', message: `file is ${size} bytes; allowed at most ${MAX_PLAN_BYTES} bytes for a plan` }]);
  const text = readText(file);
  const yaml = formatOf(file) === 'yaml' ? (await import('../plan/yaml.js')).parseYamlLocated : undefined;
  try {
    return { file, text, loc: parseLocated(text, file, formatOf(file), yaml) };
  } catch (e) {
    // The YAML parser recurses: a hostile file nested thousands deep overflows the stack (as a
    // RangeError, or as a syntax error that says so), and aliases can expand without bound. (JSON is
    // read iteratively and refuses nesting deeper than MAX_JSON_DEPTH itself, with line and column.)
    const deep = e instanceof RangeError || (e instanceof PlanError && e.problems.some((p) => /call stack/i.test(p.message)));
    if (deep) throw new PlanError([{ file, path: '', message: 'nesting too deep to read; allowed a plan of plain objects and lists a few levels deep' }]);
    if (e instanceof Error && !(e instanceof PlanError) && /alias/i.test(e.message)) {
      throw new PlanError([{ file, path: '', message: `too many YAML alias expansions (${e.message}); allowed at most 100 alias uses` }]);
    }
    throw e;
  }
}

/** How a plan's scatter section is sampled by {@link evaluateSource}; without it the section is not sampled. */
export interface ScatterRun {
  threads: number;
  progressOn: boolean;
}

/** Most warnings from the records a plan names that its report lists among the cautions (then a count). */
export const MAX_RECORD_CAUTIONS = 20;

/**
 * A plan's document after `--set` overrides, validation and the runner's file hooks: a flow curve
 * named by a tensile record is fitted (src/cli/recordLaw.ts) and `scatter.records` become the law at
 * their means with spreads (src/cli/scatterRecords.ts); both modules load only for such plans.
 * @throws PlanError naming every problem (a `--set` value is marked as such).
 */
export async function planDocument(src: PlanSource, overrides: readonly Override[] = []): Promise<{ loc: Located; doc: PlanDoc; applied: string[]; source?: string; recordCautions: string[] }> {
  const loc: Located = overrides.length ? { data: structuredClone(src.loc.data), locate: src.loc.locate } : src.loc;
  const applied: string[] = [];
  for (const o of overrides) {
    const p = applyOverride(loc.data, o.path, o.value, '--set', src.file);
    applied.push(`${showPath(p)}=${JSON.stringify(o.value)}`);
  }
  let doc: PlanDoc;
  try {
    doc = await checkPlan(loc, src.file);
  } catch (e) {
    if (e instanceof PlanError && applied.length) {
      for (const p of e.problems) if (applied.some((a) => a.startsWith(p.path + '=') || p.path.startsWith(a.slice(0, a.indexOf('='))))) p.message += ' (value from --set)';
    }
    throw e;
  }
  let source: string | undefined;
  const recordCautions: string[] = [];
  if ('record' in doc.material.flowCurve) {
    const fitted = (await import('./recordLaw.js')).fitRecordFlowCurve(doc, src.file, loc);
    doc = fitted.doc;
    source = fitted.source;
    recordCautions.push(...(fitted.cautions ?? []));
  }
  if (doc.scatter?.records) {
    const fromRecords = (await import('./scatterRecords.js')).scatterFromRecordFiles(doc, src.file, loc);
    doc = fromRecords.doc;
    source = fromRecords.source ?? source;
    recordCautions.push(...(fromRecords.cautions ?? []));
  }
  // Many records (scatter.records takes up to 1000) would bury the report's own cautions: the first ones, and a count.
  if (recordCautions.length > MAX_RECORD_CAUTIONS) {
    const more = recordCautions.length - MAX_RECORD_CAUTIONS;
    recordCautions.splice(MAX_RECORD_CAUTIONS, more, `… and ${more} more warnings from the records: \`strainledger analyze FILE\` shows each record's own`);
  }
  return { loc, doc, applied, ...(source !== undefined ? { source } : {}), recordCautions };
}

/**
 * Evaluates a parsed plan with overrides: validate, resolve units, run the ledger, sample the scatter
 * section when `scatter` says how (on worker threads; the numbers do not depend on how many), build
 * report v1. The hash is the SHA-256 of the file's text, followed by one `--set` line per override.
 * @throws PlanError (exit 2) for invalid input, located in the plan file.
 */
export async function evaluateSource(src: PlanSource, overrides: readonly Override[] = [], scatter?: ScatterRun): Promise<ReportV1> {
  const { loc, doc, applied, source, recordCautions } = await planDocument(src, overrides);
  const plan: LoadedPlan = { ...resolvePlan(doc, src.file, loc), file: src.file, loc };
  if (source) plan.route.material.source = source;
  const ledger = runPlan(plan);
  let summary: ScatterSummary | undefined;
  if (scatter && plan.scatter) {
    const { sampleScatterWithProgress } = await import('./scatter-workers.js');
    summary = await withLocationAsync(src.file, src.loc, () => sampleScatterWithProgress(plan.scatter!, scatter.threads, scatter.progressOn));
  }
  const h = createHash('sha256').update(src.text);
  for (const a of applied) h.update(`\n--set ${a}`);
  const report = buildReport(plan, ledger, { hash: h.digest('hex'), tool: TOOL, ...(summary ? { scatter: summary } : {}), recordCautions });
  if (applied.length) report.plan = { ...report.plan, overrides: applied } as ReportV1['plan'];
  return report;
}

/** {@link withLocation} for an async step: core InputErrors become a PlanError located in the file. */
async function withLocationAsync<T>(file: string, loc: Located, fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (e) {
    return withLocation(file, loc, () => { throw e; });
  }
}

/** Reads, parses and evaluates one plan file. */
export async function evaluatePlanFile(file: string, overrides: readonly Override[] = []): Promise<ReportV1> {
  return evaluateSource(await readPlan(file), overrides);
}
