import { readFileSync, statSync } from 'node:fs';
import { dirname, isAbsolute, resolve } from 'node:path';
import { InputError } from '../core/errors.js';
import { LAW_PARAMETERS } from '../core/flow/params.js';
import type { LawName } from '../core/flow/types.js';
import { scatterFromSpecimens } from '../core/scatter/fromSpecimens.js';
import { analyzeSpecimens } from '../core/tensile/analyzeSpecimens.js';
import type { Located } from '../plan/parse.js';
import { PlanError } from '../plan/problems.js';
import type { PlanDoc } from '../plan/schema.js';
import { unitsOf } from '../plan/units.js';
import { decodeRecordBytes } from '../records/decode.js';
import { parseRecordText } from '../records/parse.js';
import { readingWarnings } from '../records/builder.js';
import { MAX_PLAN_RECORD_BYTES, planTravelOptions, recordCautions } from './recordLaw.js';

/**
 * A plan whose `scatter.records` names tensile records of several specimens: reads them (relative
 * to the plan's folder), fits the law of `material.flowCurve` to each (`analyzeSpecimens`), and
 * returns the plan with the law at the specimen means, `scatter.params` holding each parameter's
 * sd and `scatter.correlation` the specimens' correlations (core `scatterFromSpecimens`), all in
 * the plan's units. Runs in the CLI layer (the plan layer reads no files), after a record-form
 * flow curve has been fitted. Plans without `scatter.records` come back unchanged.
 * @throws PlanError located at `scatter.records[i]` (unreadable file, record that cannot be fitted)
 * or `scatter.params` / `scatter.correlation` (spreads given twice).
 */
export function scatterFromRecordFiles(doc: PlanDoc, planFile: string, loc?: Located): { doc: PlanDoc; source?: string; notes?: string[]; cautions?: string[] } {
  const sc = doc.scatter;
  if (!sc?.records) return { doc };
  const at = (path: (string | number)[], message: string) =>
    new PlanError([{ file: planFile, ...(loc?.locate(path) ?? {}), path: path.map((p) => (typeof p === 'number' ? `[${p}]` : p)).join('.').replace(/\.\[/g, '['), message }]);
  const fc = doc.material.flowCurve as { law?: unknown };
  const law = fc.law as LawName;
  if (typeof law !== 'string' || !LAW_PARAMETERS[law]) throw at(['material', 'flowCurve', 'law'], 'with scatter.records, allowed a law name here (its parameters come from the records)');
  const records = sc.records.map((f, i) => {
    const path = isAbsolute(f) ? f : resolve(dirname(planFile), f);
    let text: string;
    try {
      const size = statSync(path).size;
      if (size > MAX_PLAN_RECORD_BYTES) throw at(['scatter', 'records', i], `the record ${f} is ${size} bytes; allowed at most ${MAX_PLAN_RECORD_BYTES}`);
      text = decodeRecordBytes(readFileSync(path), path);
    } catch (e) {
      if (e instanceof PlanError) throw e;
      const code = (e as NodeJS.ErrnoException).code;
      throw at(['scatter', 'records', i], `got ${JSON.stringify(f)} (${path}): ${code === 'ENOENT' ? 'file not found' : `cannot read (${code})`}; allowed a tensile record file, relative to the plan's folder`);
    }
    const rec = parseRecordText(text, { file: path });
    // A record from the machine's travel: compliance out with material.elasticModulus, plastic part over Lc (recordLaw.ts).
    const travel = planTravelOptions(rec, doc);
    if (typeof travel === 'string') throw at(['scatter', 'records', i], `the record ${f} ${travel}`);
    return { name: f, rec, travel };
  });
  let spec;
  const cautions: string[] = [];
  try {
    const set = analyzeSpecimens(records.map((r) => ({ ...r.rec, name: r.name })), { law, laws: [law], recordOptions: records.map((r) => r.travel.options) });
    set.specimens.forEach((s, i) => cautions.push(...recordCautions(s.name, readingWarnings(records[i]!.rec, s.analysis), s.analysis.warnings)));
    if (!set.lawParameters) throw new InputError('scatter.records', sc.records.length, `records whose ${law} fits converge`);
    spec = scatterFromSpecimens(set.lawParameters);
  } catch (e) {
    if (e instanceof InputError) throw at(['scatter', 'records'], e.message.replace(/^scatter\.records: /, ''));
    throw e;
  }
  const units = unitsOf(doc.units);
  const params: Record<string, { sd: number }> = { ...(sc.params as Record<string, { sd: number }>) };
  const flowCurve: Record<string, unknown> = { law };
  for (const p of LAW_PARAMETERS[law]) {
    const toPlan = (x: number) => (p.kind === 'stress' ? units.fromMPa(x) : x);
    flowCurve[p.name] = toPlan(spec.mean[p.name]!);
    if (sc.params[p.name]) throw at(['scatter', 'params', p.name], 'given with scatter.records; allowed only for parameters the records do not give (the records give every law parameter)');
    if (spec.sd[p.name]! > 0) params[p.name] = { sd: toPlan(spec.sd[p.name]!) };
  }
  const correlation: Record<string, number> = { ...sc.correlation };
  const names = new Set(LAW_PARAMETERS[law].map((p) => p.name));
  for (const key of Object.keys(sc.correlation)) {
    const [a, b] = key.split(',').map((s) => s.trim());
    if (names.has(a!) && names.has(b!)) throw at(['scatter', 'correlation', key], 'given with scatter.records; allowed only for pairs with a start size (the records give the law parameters\' correlations)');
  }
  Object.assign(correlation, spec.correlation);
  const { records: _r, ...rest } = sc;
  const material = { ...doc.material, flowCurve } as PlanDoc['material'];
  return {
    doc: { ...doc, material, scatter: { ...rest, params, correlation } },
    source: `mean of ${spec.specimens} specimen fits (${sc.records.join(', ')})${spec.notes.length ? `; ${spec.notes.join('; ')}` : ''}${records.map((r) => (r.travel.note ? `; ${r.name}: ${r.travel.note}` : '')).join('')}`,
    notes: spec.notes,
    cautions,
  };
}
