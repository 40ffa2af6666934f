import { LAW_NAMES, LAW_PARAMETERS } from '../../core/flow/params.js';
import type { LawName } from '../../core/flow/types.js';
import type { LawFit } from '../../core/fit/types.js';
import type { LawComparison } from '../../core/fit/fitAllLaws.js';
import type { TensileAnalysis } from '../../core/tensile/types.js';
import type { AnalyzeOptions } from '../../core/tensile/analyzeRecord.js';
import { statSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { PlanError } from '../../plan/problems.js';
import { unitsOf } from '../../plan/units.js';
import { CAUTIONS } from '../../report/cautions.js';
import { formatLawParam } from '../../report/numbers.js';
import { noiseStatement } from '../../report/noise.js';
import { sig4 } from '../../core/numeric/sig4.js';
import type { RecordOptions, TensileRecord } from '../../records/builder.js';
import { readingWarnings, travelOptions } from '../../records/builder.js';
import type { Role } from '../../records/columns.js';
import { defineCommand } from '../command.js';

const cliError = (path: string, message: string) => new PlanError([{ file: '(command line)', path, message }]);

/** Version of the `analyze --format json` contract. */
export const ANALYZE_VERSION = 1;

function num(name: string, v: string | undefined, lo: number, hi: number): number | undefined {
  if (v === undefined) return undefined;
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x) || x < lo || x > hi) throw cliError(`--${name}`, `got ${JSON.stringify(v)}, allowed a number in [${lo}, ${hi}]`);
  return x;
}

/** The JSON of one record's analysis (contract fields first, then the detail). */
export function analysisJson(rec: TensileRecord, a: TensileAnalysis, residuals: boolean): Record<string, unknown> {
  const fit = (f: LawFit) => ({
    law: f.law, params: f.params, standardErrors: f.standardErrors, intervals95: f.intervals95, standardErrorsIndependent: f.standardErrorsIndependent, basis: f.basis, rmse: f.rmse, r2: f.r2, aic: f.aic, bic: f.bic,
    converged: f.converged, iterations: f.iterations, strainRange: f.strainRange, points: f.points, ...(residuals ? { residuals: f.residuals } : {}),
  });
  return {
    record: { file: rec.file, name: rec.name, rows: rec.rows, basis: rec.basis, columns: rec.columns, geometry: rec.geometry, layout: rec.layout, ...(rec.test ? { test: rec.test } : {}) },
    elasticModulus: a.elasticModulus,
    proofStrength: a.proofStrength,
    upperYield: a.upperYield,
    lowerYield: a.lowerYield,
    yieldPointElongationPct: a.yieldPointElongationPct,
    tensileStrength: a.tensileStrength,
    uniformElongationPct: a.uniformElongationPct,
    totalElongationPct: a.totalElongationPct,
    lowerBounds: a.lowerBounds,
    nValue: a.nValue,
    K: a.K,
    fits: a.fits ? a.fits.fits.map(fit) : [],
    // Cycle fields keep their names (true stress, true strain: `basis`); `engineering` gives the test-report basis.
    cycles: a.cycles.map((c) => ({ basis: c.basis, unloadModulus: c.unloadModulus, permanentStrain: c.permanentStrain, recoveredStrain: c.recoveredStrain, reloadProofStrength: c.reloadProofStrength, unloadStress: c.unloadStress, engineering: c.engineering })),
    warnings: [...readingWarnings(rec, a).map((message) => ({ code: 'import', message })), ...a.warnings],
    proofOffsetPct: a.proofOffsetPct,
    proofStrengths: a.proofStrengths,
    totalExtensionStrength: a.totalExtensionStrength,
    uniformTotalElongationPct: a.uniformTotalElongationPct,
    elasticModulusSource: a.elasticModulusSource,
    measuredModulus: a.measuredModulus,
    measuredModulusInterval95: a.measuredModulusInterval95,
    machineCompliance: a.machineCompliance ?? null,
    parallelLengthRatio: a.parallelLengthRatio ?? null,
    noise: a.noise,
    noiseLag1: a.noiseLag1 ?? 0,
    forceMaximum: a.forceMaximum,
    elasticWindow: a.elasticWindow,
    toeStrain: a.toeStrain,
    fracture: a.fracture,
    strainChannelEnd: a.strainChannelEnd,
    strainSteps: a.strainSteps,
    stressSteps: a.stressSteps,
    rateChange: a.rateChange,
    yieldPlateau: a.yieldPlateau,
    forceTop: a.forceTop,
    nFit: a.nFit,
    bestLaw: a.fits?.best ?? null,
    goodLaws: a.fits?.goodLaws ?? [],
    extrapolation: a.fits?.extrapolation ?? [],
    modulusDecay: a.modulusDecay,
  };
}

/** A material block to paste into a plan (`material` of the plan file), stresses in the plan's unit. */
export function materialBlock(name: string, E: number, fit: LawFit, system: 'SI' | 'US', decay: TensileAnalysis['modulusDecay'], source: string): Record<string, unknown> {
  const u = unitsOf(system);
  const law: Record<string, unknown> = { law: fit.law };
  for (const p of LAW_PARAMETERS[fit.law]) law[p.name] = p.kind === 'stress' ? +u.fromMPa(fit.params[p.name]!).toPrecision(8) : +fit.params[p.name]!.toPrecision(8);
  return {
    name: `${name} (fitted from ${source}; check against the material certificate)`.slice(0, 200),
    elasticModulus: +u.fromMPa(E).toPrecision(6),
    flowCurve: law,
    fittedStrainRange: [+fit.strainRange[0].toPrecision(6), +fit.strainRange[1].toPrecision(6)],
    ...(decay && decay.converged && decay.Ea < decay.E0 ? { modulusDecay: { Ea: +u.fromMPa(decay.Ea).toPrecision(6), xi: +decay.xi.toPrecision(6) } } : {}),
  };
}

function chooseFit(c: LawComparison | null, law: LawName | undefined, where: string): LawFit {
  const f = c?.fits.find((x) => x.law === (law ?? c.best));
  if (!f) throw cliError(where, `no ${law ?? 'converged'} fit to take a material block from; allowed a record with a plastic flow curve`);
  if (!f.converged) throw cliError('--law', `the ${f.law} fit did not converge; allowed a law whose fit converged (${c!.fits.filter((x) => x.converged).map((x) => x.law).join(', ')})`);
  return f;
}

const fmt = (x: number | null | undefined, d = 1) => (x === null || x === undefined ? '—' : x.toFixed(d));

/** A fitted parameter as an engineer writes it (report/numbers.ts): `0 (at bound)` for a collapsed one. */
function paramText(law: LawName, name: string, v: number): string {
  const info = LAW_PARAMETERS[law].find((p) => p.name === name);
  return info ? formatLawParam(info, v) : sig4(v);
}

function tableText(rec: TensileRecord, a: TensileAnalysis): string {
  const lines: string[] = [];
  lines.push(`${rec.file}${rec.test ? `, test ${rec.test.index} of ${rec.test.of} (samples ${rec.test.fromSample}–${rec.test.toSample})` : ''}  (${rec.rows} rows, ${rec.basis})`);
  const w = a.elasticWindow;
  const [ci0, ci1] = a.measuredModulusInterval95;
  if (a.elasticModulusSource === 'given') {
    lines.push(`  E            ${fmt(a.elasticModulus / 1000, 1)} GPa (given)   measured ${fmt(a.measuredModulus / 1000, 1)} GPa, 95 % ${fmt(ci0 / 1000, 1)}–${fmt(ci1 / 1000, 1)}` +
      (a.machineCompliance ? ` (machine and specimen; compliance ${a.machineCompliance.toExponential(2)} /MPa taken out${a.parallelLengthRatio ? `, plastic travel over Lc, L0/Lc ${fmt(a.parallelLengthRatio, 3)}` : ''})` : ''));
  }
  else lines.push(`  E            ${fmt(a.elasticModulus / 1000, 1)} GPa   95 % ${fmt(ci0 / 1000, 1)}–${fmt(ci1 / 1000, 1)} GPa, band ${fmt(w.fromStress, 0)}–${fmt(w.toStress, 0)} MPa, ${w.points} points, R² ${w.r2.toFixed(5)}`);
  lines.push(`  noise        ${noiseStatement(a)}`);
  lines.push(`  Rp${a.proofOffsetPct}        ${fmt(a.proofStrength)} MPa   Rp0.5 ${fmt(a.proofStrengths[1]?.stress)}   Rp1 ${fmt(a.proofStrengths[2]?.stress)}   Rt0.5 ${fmt(a.totalExtensionStrength)}`);
  if (a.upperYield !== null) lines.push(`  ReH / ReL    ${fmt(a.upperYield)} / ${fmt(a.lowerYield)} MPa   Ae ${fmt(a.yieldPointElongationPct, 2)} %`);
  else if (a.yieldPlateau) lines.push(`  ReH          none clear of the noise; yield plateau at ${fmt(a.yieldPlateau.level)} MPa from ${fmt(a.yieldPlateau.startStrain * 100, 2)} to ${fmt(a.yieldPlateau.endStrain * 100, 2)} % (laws fitted from its end)`);
  else lines.push('  ReH          none (continuous yielding)');
  // Lower bounds (a record that stops before maximum force, or whose strain channel ends before fracture) are
  // marked ≥ (the warning below says why).
  const ge = (k: TensileAnalysis['lowerBounds'][number]) => (a.lowerBounds.includes(k) ? '≥ ' : '');
  lines.push(`  Rm           ${ge('tensileStrength')}${fmt(a.tensileStrength)} MPa${a.forceTop ? '   (from the force after the strain channel ended)' : ''}`);
  const agCi = a.forceMaximum.uniformElongationInterval95;
  const agHow = ge('tensileStrength') ? '   (the record ends before maximum force)'
    : ge('uniformElongationPct') ? '   (the strain channel ends before maximum force)'
      : (a.forceMaximum.lawUniformElongation?.pct != null ? `   (Ag where the fitted laws reach maximum force, which the samples near the top do not rule out; 95 % range ${fmt(agCi[0], 2)}–${fmt(agCi[1], 2)} %)`
        : `   (Ag from the samples near the top, 95 % range ${fmt(agCi[0], 2)}–${fmt(agCi[1], 2)} %)`) + (!ge('totalElongationPct') ? '' : a.strainChannelEnd ? '; A: the strain channel ends before fracture' : '; A: the test was stopped before fracture');
  lines.push(`  Ag / Agt / A ${ge('uniformElongationPct')}${fmt(a.uniformElongationPct, 2)} / ${ge('uniformTotalElongationPct')}${fmt(a.uniformTotalElongationPct, 2)} / ${ge('totalElongationPct')}${fmt(a.totalElongationPct, 2)} %${agHow}`);
  // The basis of every stress, as a certificate reader checks it first (docs/bases-and-units.md).
  lines.push(`  basis        Rp, Rt, ReH/ReL, Rm: engineering (force / original section); n, K and the laws: true stress on true plastic strain`);
  lines.push(`  n, K         ${fmt(a.nValue, 4)}, ${fmt(a.K, 0)} MPa (ISO 10275)`);
  if (a.fits) {
    lines.push('  law             RMSE MPa   R²        AIC      converged  parameters');
    for (const f of a.fits.fits) {
      const ps = Object.entries(f.params).map(([k, v]) => `${k}=${paramText(f.law, k, v)}${f.standardErrors[k] != null ? `±${+f.standardErrors[k]!.toPrecision(2)}` : f.basis.held.includes(k) ? ' (held)' : ''}`).join(' ');
      lines.push(`  ${f.law.padEnd(15)} ${fmt(f.rmse, 2).padStart(8)}   ${f.r2.toFixed(5)}  ${fmt(f.aic, 0).padStart(7)}  ${(f.converged ? 'yes' : 'NO').padEnd(9)}  ${ps}`);
    }
    const b0 = a.fits.fits[0]?.basis;
    if (b0) {
      lines.push(b0.blockSize > 1
        ? `  fitted on ${b0.fittedPoints} averages of ${b0.blockSize} consecutive points (flow curve of ${a.fits.fits[0]!.points}); RMSE, R², AIC on the full curve`
        : `  fitted on all ${a.fits.fits[0]!.points} points of the flow curve`);
      const held = a.fits.fits.filter((f) => f.basis.held.length > 0);
      if (held.length) lines.push(`  held, not fitted: ${held.map((f) => f.basis.held.map((k) => `${f.law} ${k} = ${paramText(f.law, k, f.params[k]!)}`).join(', ')).join('; ')} (one flow curve does not determine it; the other parameters are fitted)`);
      lines.push(`  ± is a standard error widened for correlated residuals by √(n/n_eff), n_eff = n(1 − ρ)/(1 + ρ) from the lag-1 autocorrelation ρ: ${a.fits.fits.map((f) => `${f.law} ρ ${f.basis.lag1Autocorrelation.toFixed(2)}`).join(', ')}`);
    }
    for (const e of a.fits.extrapolation) lines.push(`  at εp ${e.strain.toPrecision(3)} (${e.note}): spread ${e.spreadPct.toFixed(1)} % over laws that fit well`);
  }
  for (const c of a.cycles) lines.push(`  cycle at ${fmt(c.engineering.unloadStress)} MPa eng. (${fmt(c.unloadStress)} true): chord E ${fmt(c.unloadModulus / 1000, 1)} GPa, permanent ${(c.engineering.permanentStrain * 100).toFixed(3)} % eng. (${(c.permanentStrain * 100).toFixed(3)} % true), recovered ${(c.recoveredStrain * 100).toFixed(3)} % true, reload Rp0.2 ${fmt(c.engineering.reloadProofStrength)} MPa eng. (${fmt(c.reloadProofStrength)} true)`);
  for (const m of readingWarnings(rec, a)) lines.push(`  warning: ${m}`);
  for (const m of a.warnings) lines.push(`  warning: ${m.message}`);
  return lines.join('\n') + '\n';
}

export const analyze = defineCommand({
  name: 'analyze',
  summary: 'tensile records: standard properties (E, Rp0.2, Rm, Ag, n-value) and every law fitted with statistics',
  args: 'RECORD...',
  details: 'exit codes: 0 analysed, 2 invalid record or option',
  options: {
    format: { type: 'string', default: 'table', value: 'FORMAT', help: 'output, one of table, json' },
    law: { type: 'string', value: 'LAW', help: `the law for the material block, one of ${LAW_NAMES.join(', ')} (default: the best by AIC)` },
    'material-block': { type: 'boolean', default: false, help: 'print a plan `material` block from the fit, ready to paste into a plan' },
    'material-out': { type: 'string', value: 'FILE', help: 'write that material block to FILE (atomically)' },
    units: { type: 'string', default: 'SI', value: 'SI|US', help: 'units of the material block: SI (MPa) or US (ksi)' },
    offset: { type: 'string', value: 'PCT', help: 'proof-strength offset in percent strain, 0.01 to 5 (default 0.2: Rp0.2)' },
    'n-range': { type: 'string', value: 'FROM,TO', help: 'engineering strain range (fractions) of the n-value fit, e.g. 0.1,0.2' },
    'check-strain': { type: 'string', multiple: true, default: [], value: 'X', help: 'true plastic strain at which the fitted laws are compared when extrapolated' },
    disagreement: { type: 'string', value: 'PCT', help: 'spread between good laws, in percent, above which they are reported as disagreeing (default 10)' },
    modulus: { type: 'string', value: 'MPA', help: "Young's modulus in MPa to use instead of the one fitted to the record" },
    residuals: { type: 'boolean', default: false, help: 'include each fit\'s residuals in the JSON output' },
    threads: { type: 'string', value: 'N', help: 'threads for the law fits of a large record, 1 or 2 (default: 2 on a machine with four or more cores, two of them free, when the records hold 4 MB or more; else 1); the results are the same either way' },
    column: { type: 'string', multiple: true, default: [], value: 'ROLE=NAME', help: 'which column holds a role (strain, stress, force, extension, time), by header name or number' },
    delimiter: { type: 'string', value: ', ; tab space', help: 'field separator of the record; space: columns aligned by runs of spaces (default: detected)' },
    decimal: { type: 'string', value: '. ,', help: 'decimal mark of the record (default: detected)' },
    'stress-unit': { type: 'string', value: 'UNIT', help: 'unit of the stress column when the record does not say, e.g. MPa, ksi' },
    'force-unit': { type: 'string', value: 'UNIT', help: 'unit of the force column when the record does not say, e.g. N, kN, lbf' },
    'length-unit': { type: 'string', value: 'UNIT', help: 'unit of the extension column and sizes when the record does not say, e.g. mm, in' },
    'strain-unit': { type: 'string', value: 'fraction|percent|permille|microstrain', help: 'unit of the strain column when the record does not say (or says wrongly)' },
    area: { type: 'string', value: 'MM2', help: 'specimen cross-section (for a force column), in mm²' },
    diameter: { type: 'string', value: 'MM', help: 'round specimen diameter (for a force column), in mm' },
    width: { type: 'string', value: 'MM', help: 'flat specimen width (with --thickness), in mm' },
    thickness: { type: 'string', value: 'MM', help: 'flat specimen thickness (with --width), in mm' },
    'gauge-length': { type: 'string', value: 'MM', help: 'extensometer gauge length (for an extension column), in mm' },
    'parallel-length': { type: 'string', value: 'MM', help: "specimen's parallel length Lc, in mm: with the machine's travel as the extension and --modulus, Ag and A are read over it" },
  },
  async run({ values, positionals }, io) {
    if (positionals.length === 0) throw cliError('RECORD', 'got no record file, allowed one or more tensile record files (CSV or tab-separated)');
    const format = values.format!;
    if (format !== 'json' && format !== 'table') throw cliError('--format', `got ${JSON.stringify(format)}, allowed one of json, table`);
    const unitsText = values.units!;
    if (unitsText !== 'SI' && unitsText !== 'US') throw cliError('--units', `got ${JSON.stringify(unitsText)}, allowed SI or US`);
    const units: 'SI' | 'US' = unitsText;
    let law: LawName | undefined;
    if (values.law !== undefined) {
      if (!(LAW_NAMES as string[]).includes(values.law)) throw cliError('--law', `got ${JSON.stringify(values.law)}, allowed one of ${LAW_NAMES.join(', ')}`);
      law = values.law as LawName;
    }
    const ropts: RecordOptions = {};
    if (values.delimiter !== undefined) {
      const d = values.delimiter === 'tab' || values.delimiter === '\\t' ? '\t' : values.delimiter === 'space' ? ' ' : values.delimiter;
      if (d !== ',' && d !== ';' && d !== '\t' && d !== ' ') throw cliError('--delimiter', `got ${JSON.stringify(values.delimiter)}, allowed , ; tab or space (columns aligned by runs of spaces)`);
      ropts.delimiter = d;
    }
    if (values.decimal !== undefined) {
      if (values.decimal !== '.' && values.decimal !== ',') throw cliError('--decimal', `got ${JSON.stringify(values.decimal)}, allowed . or ,`);
      ropts.decimal = values.decimal;
    }
    if (values['stress-unit'] !== undefined) ropts.stressUnit = values['stress-unit'];
    if (values['force-unit'] !== undefined) ropts.forceUnit = values['force-unit'];
    if (values['length-unit'] !== undefined) ropts.lengthUnit = values['length-unit'];
    if (values['strain-unit'] !== undefined) {
      const s = values['strain-unit'];
      if (!['fraction', 'percent', '%', 'permille', '‰', 'microstrain', 'µε'].includes(s)) throw cliError('--strain-unit', `got ${JSON.stringify(s)}, allowed fraction, percent, permille (‰) or microstrain (µε)`);
      ropts.strainUnit = s === 'fraction' ? '-' : s === 'percent' || s === '%' ? '%' : s === 'permille' || s === '‰' ? '‰' : 'µε';
    }
    for (const [k, name] of [['area', 'area'], ['diameter', 'diameter'], ['width', 'width'], ['thickness', 'thickness'], ['gauge-length', 'gaugeLength'], ['parallel-length', 'parallelLength']] as const) {
      const v = num(k, values[k], 1e-9, 1e9);
      if (v !== undefined) (ropts as Record<string, unknown>)[name] = v;
    }
    const cols: Partial<Record<Role, string | number>> = {};
    for (const c of values.column!) {
      const m = /^(strain|stress|force|extension|time)=(.+)$/.exec(c);
      if (!m) throw cliError('--column', `got ${JSON.stringify(c)}, allowed ROLE=NAME or ROLE=NUMBER with ROLE one of strain, stress, force, extension, time`);
      cols[m[1] as Role] = /^\d+$/.test(m[2]!) ? Number(m[2]) : m[2]!;
    }
    if (Object.keys(cols).length) ropts.columns = cols;
    const offset = num('offset', values.offset, 0.01, 5);
    const disagreement = num('disagreement', values.disagreement, 0, 1000);
    const modulus = num('modulus', values.modulus, 1, 1e7);
    const checkStrains = values['check-strain']!.map((s) => num('check-strain', s, 1e-6, 20)!);
    let nRange: [number, number] | undefined;
    if (values['n-range'] !== undefined) {
      const m = /^\s*([0-9.eE+-]+)\s*,\s*([0-9.eE+-]+)\s*$/.exec(values['n-range']);
      const a = m ? Number(m[1]) : NaN, b = m ? Number(m[2]) : NaN;
      if (!(a >= 0 && b > a && b <= 5)) throw cliError('--n-range', `got ${JSON.stringify(values['n-range'])}, allowed FROM,TO engineering strains (fractions) with 0 ≤ FROM < TO ≤ 5, e.g. 0.1,0.2`);
      nRange = [a, b];
    }

    const threads = num('threads', values.threads, 1, 2);
    if (threads !== undefined && !Number.isInteger(threads)) throw cliError('--threads', `got ${JSON.stringify(values.threads)}, allowed 1 or 2`);
    // A second thread for the law fits of large records, started now so it is ready when the fits begin.
    let recordBytes = 0;
    for (const f of positionals) { try { recordBytes += statSync(f).size; } catch { /* the reader words it */ } }
    // Default: two threads for records of 4 MB or more (about 200,000 rows) only on a machine with four or more cores,
    // two of them free (load average < cores − 1.5, as `make -l` reads it). On two cores the helper competes with
    // the engine's own background threads (optimising compiler, garbage collector): measured slower there, idle or
    // busy (eighth session, `perf stat -r 10`: 1,000,000 rows 0.524 s on one thread against 0.563 s on two; 250,000
    // rows 0.365 against 0.379; at load 4, 0.66 against 0.80 s; bench/RESULTS.md). Not measured on four cores. The
    // results are the same either way.
    const cores = availableParallelism();
    const wanted = threads !== undefined ? threads === 2 : cores >= 4 && recordBytes >= 4 * 1024 * 1024 && loadavg()[0]! < cores - 1.5;
    const helper = wanted ? (await import('../fitThreads.js')).startFitHelper(60_000, threads === 2) : null;
    try {
      return await analyzeWith(helper?.fitLaws);
    } finally {
      await helper?.close();
    }

    async function analyzeWith(fitLaws: AnalyzeOptions['fitLaws'] | undefined): Promise<number> {
    const [{ readRecordFile }, { analyzeRecord }, { summarizeSpecimens }, { withRecordLocation, withStrainUnitHint }] = await Promise.all([
      import('../../records/node.js'), import('../../core/tensile/analyzeRecord.js'), import('../../core/tensile/analyzeSpecimens.js'), import('../recordErrors.js'),
    ]);
    const read: TensileRecord[] = [];
    for (const f of positionals) read.push(await readRecordFile(f, { ...ropts, file: f }));
    // A material block is a plan's input: from the machine's travel it needs the specimen's modulus (the travel's own
    // slope is the machine's and grips' compliance, E read 33–43 GPa on the open 42CrMoS4 steel records) and the
    // parallel length (else the law is fitted to the plastic stretch of all of Lc over L0), as a plan naming the record does.
    const blockFlag = values['material-out'] !== undefined ? '--material-out' : values['material-block'] ? '--material-block' : null;
    if (blockFlag) {
      for (const r of read) {
        const t = travelOptions(r);
        if (!t.machineTravel || (modulus !== undefined && t.travelLengths)) continue;
        const missing = [modulus === undefined ? "--modulus MPA (the specimen's Young's modulus: the travel's own slope is the machine's and grips' compliance)" : '',
          t.travelLengths ? '' : `--parallel-length MM (the specimen's parallel length Lc, from the gauge length${r.geometry?.gaugeLength ? ` ${r.geometry.gaugeLength} mm` : ''} to 10 times it; or a metadata line such as "Parallel length: 30 mm")`].filter(Boolean);
        throw cliError(blockFlag, `the record ${r.file} takes its extension from the machine's travel (column ${JSON.stringify(r.columns.extension?.name ?? 'extension')}), not an extensometer; a material block from it is allowed with ${missing.join(' and ')}`);
      }
    }
    const aopts = {
      ...(fitLaws ? { fitLaws } : {}),
      ...(offset !== undefined ? { proofOffsetPct: offset } : {}),
      ...(nRange ? { nRange } : {}),
      ...(checkStrains.length ? { checkStrains } : {}),
      ...(disagreement !== undefined ? { disagreementPct: disagreement } : {}),
      ...(modulus !== undefined ? { elasticModulus: modulus } : {}),
    };
    const analyse = (r: TensileRecord) => withRecordLocation(r, () => withStrainUnitHint(r, () => analyzeRecord(r, { ...aopts, ...travelOptions(r) })));
    // A file that holds several tests (the record starts over) becomes one record per test, each a specimen.
    const { splitTests } = await import('../splitTests.js');
    const parts = read.flatMap((r) => splitTests(r, analyse(r), analyse));
    const records = parts.map((p) => p.record), analyses = parts.map((p) => p.analysis);
    let block: Record<string, unknown> | undefined;
    let out: Record<string, unknown>;
    if (records.length === 1) {
      const r = records[0]!, a = analyses[0]!;
      out = { analyzeVersion: ANALYZE_VERSION, ...analysisJson(r, a, values.residuals!), cautions: CAUTIONS };
      if (values['material-block'] || values['material-out'] !== undefined) block = materialBlock(r.name, a.elasticModulus, chooseFit(a.fits, law, '--material-block'), units, a.modulusDecay, r.file.replace(/^.*[\\/]/, ''));
    } else {
      // Each record was analysed above with every law (as analyzeSpecimens would, with laws: LAW_NAMES): summarised
      // from those analyses, not analysed a second time.
      const set = withRecordLocation(positionals.join(', '), () => summarizeSpecimens(records.map((r, i) => ({ name: r.name, analysis: analyses[i]! })), { law: law ?? 'swift', laws: LAW_NAMES }));
      out = {
        analyzeVersion: ANALYZE_VERSION,
        records: records.map((r, i) => analysisJson(r, set.specimens[i]!.analysis, values.residuals!)),
        summary: set.summary,
        lawParameters: set.lawParameters,
        jointFit: set.jointFit ? { best: set.jointFit.best, fits: set.jointFit.fits.map((f) => ({ law: f.law, params: f.params, standardErrors: f.standardErrors, rmse: f.rmse, r2: f.r2, aic: f.aic, converged: f.converged, strainRange: f.strainRange, points: f.points })), extrapolation: set.jointFit.extrapolation } : null,
        warnings: set.jointFit?.warnings ?? [],
        cautions: CAUTIONS,
      };
      if (values['material-block'] || values['material-out'] !== undefined) {
        const E = set.summary.elasticModulus!.mean;
        block = materialBlock(`${records.length} specimens`, E, chooseFit(set.jointFit, law, '--material-block'), units, null, `${records.length} records, joint fit`);
      }
    }
    if (values['material-out'] !== undefined) {
      (await import('../out.js')).refuseInputAsOutput('--material-out', values['material-out'], positionals.map((f) => ({ file: f, what: 'record' })));
      const { writeFileAtomic } = await import('../io.js');
      writeFileAtomic(values['material-out'], JSON.stringify(block, null, 2) + '\n');
    }
    if (values['material-block']) {
      io.stdout(JSON.stringify(block, null, 2) + '\n');
      return 0;
    }
    if (format === 'json') io.stdout(JSON.stringify(out, null, 2) + '\n');
    else {
      let text = records.map((r, i) => tableText(r, analyses[i]!)).join('\n');
      if (records.length > 1) {
        const s = out.summary as Record<string, { mean: number; sd: number | null; n: number; lowerBoundsLeftOut: number }>;
        text += '\nover specimens (mean ± sd; lower bounds left out):\n';
        for (const [k, v] of Object.entries(s)) text += `  ${k.padEnd(26)} ${v.mean.toPrecision(6)} ± ${v.sd === null ? '—' : v.sd.toPrecision(3)}  (n = ${v.n}${v.lowerBoundsLeftOut ? `; ${v.lowerBoundsLeftOut} lower bound${v.lowerBoundsLeftOut > 1 ? 's' : ''} left out` : ''})\n`;
      }
      text += '\n' + CAUTIONS.map((c) => `caution: ${c}`).join('\n') + '\n';
      io.stdout(text);
    }
    return 0;
    }
  },
});
