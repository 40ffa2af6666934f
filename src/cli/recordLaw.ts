import { readFileSync, statSync } from 'node:fs';
import { dirname, isAbsolute, resolve } from 'node:path';
import { analyzeRecord } from '../core/tensile/analyzeRecord.js';
import { LAW_PARAMETERS } from '../core/flow/params.js';
import type { LawName } from '../core/flow/types.js';
import type { Located } from '../plan/parse.js';
import { PlanError } from '../plan/problems.js';
import type { PlanDoc } from '../plan/schema.js';
import { unitsOf } from '../plan/units.js';
import { decodeRecordBytes } from '../records/decode.js';
import { parseRecordText } from '../records/parse.js';
import { readingWarnings, travelOptions, type RecordOptions, type TensileRecord } from '../records/builder.js';
import type { AnalyzeOptions } from '../core/tensile/analyzeRecord.js';

/** Largest record a plan may name (the plan path reads it whole; `analyze` streams). */
export const MAX_PLAN_RECORD_BYTES = 200 * 1024 * 1024;

/** A plan's `material.flowCurve` in the record form. */
export interface RecordFlowCurve {
  record: string;
  law: LawName;
  options?: RecordOptions;
}

export function isRecordFlowCurve(fc: unknown): fc is RecordFlowCurve {
  return typeof fc === 'object' && fc !== null && typeof (fc as { record?: unknown }).record === 'string';
}

/**
 * A plan whose `material.flowCurve` names a tensile record (`{ "record": "tensile.csv", "law": "swift" }`):
 * reads the record relative to the plan's folder, analyses it, fits the named law to its flow curve,
 * and returns the plan with the fitted parameters (in the plan's stress unit) and `fittedStrainRange`,
 * plus the provenance `fitted from FILE`. Plans with law parameters come back unchanged.
 * @throws PlanError located at `material.flowCurve.record` (missing file: exit 2).
 */
export function fitRecordFlowCurve(doc: PlanDoc, planFile: string, loc?: Located): { doc: PlanDoc; source?: string; cautions?: string[] } {
  const fc = doc.material.flowCurve as unknown;
  if (!isRecordFlowCurve(fc)) return { doc };
  const at = (field: string) => ({ file: planFile, ...(loc?.locate(['material', 'flowCurve', field]) ?? {}), path: `material.flowCurve.${field}` });
  const path = isAbsolute(fc.record) ? fc.record : resolve(dirname(planFile), fc.record);
  let text: string;
  try {
    const size = statSync(path).size;
    if (size > MAX_PLAN_RECORD_BYTES) throw new PlanError([{ ...at('record'), message: `the record ${fc.record} is ${size} bytes; allowed at most ${MAX_PLAN_RECORD_BYTES} for a plan (fit it with \`strainledger analyze --material-block\` instead)` }]);
    text = decodeRecordBytes(readFileSync(path), path);
  } catch (e) {
    if (e instanceof PlanError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'file not found' : code === 'EISDIR' ? 'is a folder, not a record file' : `cannot read (${code})`;
    throw new PlanError([{ ...at('record'), message: `got ${JSON.stringify(fc.record)} (${path}): ${why}; allowed a tensile record file, relative to the plan's folder` }]);
  }
  const rec = parseRecordText(text, { ...(fc.options ?? {}), file: path });
  const travel = planTravelOptions(rec, doc, 'material.flowCurve.options.parallelLength');
  if (typeof travel === 'string') throw new PlanError([{ ...at('record'), message: `the record ${fc.record} ${travel}` }]);
  const a = analyzeRecord(rec, { laws: [fc.law], ...travel.options });
  const fit = a.fits?.fits[0];
  if (!fit) throw new PlanError([{ ...at('record'), message: `the record ${fc.record} has too few points on its plastic flow curve to fit ${fc.law}; allowed a record that yields and hardens to a maximum force` }]);
  if (!fit.converged) throw new PlanError([{ ...at('law'), message: `the ${fc.law} fit to ${fc.record} did not converge; allowed a law that fits the record (try another law, or \`strainledger analyze ${fc.record}\`)` }]);
  const units = unitsOf(doc.units);
  const law: Record<string, unknown> = { law: fc.law };
  for (const p of LAW_PARAMETERS[fc.law]) law[p.name] = p.kind === 'stress' ? units.fromMPa(fit.params[p.name]!) : fit.params[p.name]!;
  const material = { ...doc.material, flowCurve: law, fittedStrainRange: doc.material.fittedStrainRange ?? fit.strainRange } as PlanDoc['material'];
  return { doc: { ...doc, material }, source: `fitted from ${fc.record}${travel.note ? ` (${travel.note})` : ''}`, cautions: recordCautions(fc.record, readingWarnings(rec, a), a.warnings) };
}

/**
 * Warnings about a record that bear on a law fitted to it, as cautions for the plan's report: every warning from
 * reading it (columns chosen, a strain unit guessed, rows left out, a channel held or ended, the machine's travel),
 * and the analysis's except those on properties the plan does not take from the record (ReH, Rp0.2, Ag, a fracture
 * the record does not show: the plan's values come from the law). Each names the file.
 * @example recordCautions('t.csv', [], [{ code: 'maxAtEnd', message: 'the test stopped before maximum force' }]) // ['record t.csv: the test stopped before maximum force']
 */
export function recordCautions(file: string, readWarnings: readonly string[], analysisWarnings: readonly { code: string; message: string }[]): string[] {
  const NOT_FOR_THE_LAW = new Set(['uncertainAg', 'uncertainReH', 'uncertainRp', 'noProofPoint', 'noFractureDrop', 'flatTop', 'unloadedBeforeFracture', 'nRange']);
  return [...readWarnings, ...analysisWarnings.filter((w) => !NOT_FOR_THE_LAW.has(w.code)).map((w) => w.message)].map((m) => `record ${file}: ${m}`);
}

/**
 * How a plan reads a record whose extension is the machine's travel (crosshead, stroke; `rec.machineTravel`): the
 * compliance of the machine and grips is taken out with the plan's own `material.elasticModulus` (the specimen's
 * Young's modulus), and the plastic part is spread over the parallel length Lc (the record's metadata or
 * `options.parallelLength`), as `strainledger analyze --modulus --parallel-length` does. Read as it is, such a record
 * counts the plastic stretch of all of Lc over L0 (+20 % strain for Lc = 1.2 L0) and the law fitted to it is wrong
 * by as much. An extensometer's record is analysed as it is (its own E): no options, no note.
 * @returns the analysis options and a note for the report's `material.source`, or the reason the record cannot be
 * used (no parallel length known), to be located by the caller.
 */
export function planTravelOptions(rec: Pick<TensileRecord, 'machineTravel' | 'geometry' | 'columns'>, doc: PlanDoc, lengthOption?: string): { options: AnalyzeOptions; note?: string } | string {
  const travel = travelOptions(rec);
  if (!travel.machineTravel) return { options: {} };
  const column = rec.columns.extension?.name ?? 'extension';
  if (!travel.travelLengths) {
    const L0 = rec.geometry?.gaugeLength;
    const range = `the specimen's parallel length Lc in mm, from the gauge length${L0 ? ` ${L0} mm` : ''} to 10 times it`;
    const ways = lengthOption ? `${lengthOption} (${range}) or a metadata line such as "Parallel length: 30 mm" in the record` : `a metadata line such as "Parallel length: 30 mm" in the record (${range})`;
    return `takes its extension from the machine's travel (column ${JSON.stringify(column)}), not an extensometer, and names no parallel length: allowed with ${ways}; or an extensometer record`;
  }
  const units = unitsOf(doc.units);
  const E = doc.material.elasticModulus;
  return {
    options: { ...travel, elasticModulus: units.toMPa(E) },
    note: `extension from the machine's travel, column ${JSON.stringify(column)}: its compliance taken out with material.elasticModulus ${+E.toPrecision(6)} ${units.stress} and the plastic part spread over the parallel length ${travel.travelLengths.parallelLength} mm, gauge length ${travel.travelLengths.gaugeLength} mm`,
  };
}
