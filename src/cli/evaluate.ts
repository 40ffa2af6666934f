import { createHash } from 'node:crypto';
import { statSync } from 'node:fs';
import { formatOf, runPlan, type LoadedPlan } from '../plan/load.js';
import { MAX_PLAN_BYTES, parseLocated, validatePlan, type Located } from '../plan/parse.js';
import { PlanError } from '../plan/problems.js';
import { resolvePlan } from '../plan/resolve.js';
import { buildReport, type ReportV1 } from '../report/build.js';
import { readText } from './io.js';
import { fitRecordFlowCurve } from './recordLaw.js';
import { scatterFromRecordFiles } from './scatterRecords.js';
import { applyOverride, showPath, type Override } from './overrides.js';
import { TOOL } from './version.js';
import type { ScatterSummary } from '../core/scatter/summarize.js';

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
export function readPlan(file: string): PlanSource {
  let size = 0;
  try {
    size = statSync(file).size;
  } catch {
    /* readText reports a missing file */
  }
  if (size > MAX_PLAN_BYTES) throw new PlanError([{ file, path: '', message: `file is ${size} bytes; allowed at most ${MAX_PLAN_BYTES} bytes for a plan` }]);
  const text = readText(file);
  try {
    return { file, text, loc: parseLocated(text, file, formatOf(file)) };
  } catch (e) {
    // The parsers recurse: a hostile file nested thousands deep overflows the stack (as a RangeError,
    // or as a syntax error that says so), and YAML aliases can expand without bound.
    const deep = e instanceof RangeError || (e instanceof PlanError && e.problems.some((p) => /call stack/i.test(p.message)));
    if (deep) throw new PlanError([{ file, path: '', message: 'nesting too deep to read; allowed a plan of plain objects and lists a few levels deep' }]);
    if (e instanceof Error && !(e instanceof PlanError) && /alias/i.test(e.message)) {
      throw new PlanError([{ file, path: '', message: `too many YAML alias expansions (${e.message}); allowed at most 100 alias uses` }]);
    }
    throw e;
  }
}

/**
 * Evaluates a parsed plan with overrides: validate, resolve units, run the ledger, build report v1.
 * The hash is the SHA-256 of the file's text, followed by one `--set` line per override when given.
 */
export function evaluateSource(src: PlanSource, overrides: readonly Override[] = [], scatter?: ScatterSummary): ReportV1 {
  const loc: Located = overrides.length ? { data: structuredClone(src.loc.data), locate: src.loc.locate } : src.loc;
  const applied: string[] = [];
  for (const o of overrides) {
    const p = applyOverride(loc.data, o.path, o.value, '--set', src.file);
    applied.push(`${showPath(p)}=${JSON.stringify(o.value)}`);
  }
  let doc;
  try {
    doc = validatePlan(loc, src.file);
  } catch (e) {
    if (e instanceof PlanError && applied.length) {
      for (const p of e.problems) if (applied.some((a) => a.startsWith(p.path + '=') || p.path.startsWith(a.slice(0, a.indexOf('='))))) p.message += ' (value from --set)';
    }
    throw e;
  }
  // Hook for plans whose material names a tensile record instead of law parameters (records issue):
  // replace `doc` by the plan with fitted parameters here, before units are resolved.
  // Issue 3 hook (tensile records): a flowCurve naming a record file is fitted here, in the CLI layer
  // (the plan layer reads no files); the fitted law replaces it and the material records its source.
  const fitted = fitRecordFlowCurve(doc, src.file, loc);
  doc = fitted.doc;
  // Issue 8 hook: scatter.records (several specimens) become the law at their means plus spreads and correlations.
  const fromRecords = scatterFromRecordFiles(doc, src.file, loc);
  doc = fromRecords.doc;
  const plan: LoadedPlan = { ...resolvePlan(doc, src.file, loc), file: src.file, loc };
  if (fitted.source) plan.route.material.source = fitted.source;
  if (fromRecords.source) plan.route.material.source = fromRecords.source;
  const ledger = runPlan(plan);
  const h = createHash('sha256').update(src.text);
  for (const a of applied) h.update(`\n--set ${a}`);
  const report = buildReport(plan, ledger, { hash: h.digest('hex'), tool: TOOL, ...(scatter ? { scatter } : {}) });
  if (applied.length) report.plan = { ...report.plan, overrides: applied } as ReportV1['plan'];
  return report;
}

/** Reads, parses and evaluates one plan file. */
export function evaluatePlanFile(file: string, overrides: readonly Override[] = []): ReportV1 {
  return evaluateSource(readPlan(file), overrides);
}
