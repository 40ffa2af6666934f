import { fitKinematic, KINEMATIC_FIT_BOUNDS, type KinematicFit } from '../../core/path/fitKinematic.js';
import { trueCurve } from '../../core/tensile/trueCurve.js';
import { loadPlanOrMaterial } from '../../plan/material.js';
import { PlanError } from '../../plan/problems.js';
import { withLocation } from '../../plan/resolve.js';
import { readRecordFile } from '../../records/node.js';
import { CAUTIONS } from '../../report/cautions.js';
import { defineCommand } from '../command.js';
import { readText, writeFileAtomic } from '../io.js';
import { sig4 } from '../../core/numeric/sig4.js';

const CLI = '(command line)';

/**
 * `strainledger kinematic PLAN_OR_MATERIAL RECORD [--backstresses 1|2|3] [--values engineering|true]
 * [--format table|json] [--material-out FILE]`: fits Armstrong–Frederick backstresses (C, γ) to a
 * record with a reversal or tension–compression loops (src/core/path/fitKinematic.ts), the material's
 * flow curve and E kept. The record is read like a tensile record (src/records: columns by name,
 * units, metadata), signed: compression negative. `--material-out` writes the material with the
 * fitted `kinematic` block (atomically), ready for a plan. Exit 0 fitted; 1 the fit did not converge;
 * 2 invalid input.
 */
export const kinematic = defineCommand({
  name: 'kinematic',
  summary: "fit Armstrong–Frederick backstresses (C, γ) to a record with a reversal; the material's flow curve and E are kept",
  args: 'PLAN_OR_MATERIAL RECORD',
  details: 'exit codes: 0 fitted, 1 the fit did not converge, 2 invalid input',
  options: {
    backstresses: { type: 'string', default: '1', value: '1|2|3', help: 'number of Armstrong–Frederick backstresses to fit' },
    values: { type: 'string', default: 'engineering', value: 'engineering|true', help: 'how the record gives stress and strain (engineering values are converted at constant volume)' },
    format: { type: 'string', default: 'table', value: 'FORMAT', help: 'output, one of table, json' },
    'material-out': { type: 'string', value: 'FILE', help: 'write the material with its fitted kinematic block to FILE (atomically); never the record or a plan read, nor the material file unless --replace-input' },
    'replace-input': { type: 'boolean', default: false, help: 'let --material-out replace the material file it read (a material file only: a plan would lose its route)' },
  },
  async run({ values, positionals }, io) {
    if (positionals.length !== 2) throw new PlanError([{ file: CLI, path: 'PLAN_OR_MATERIAL RECORD', message: `got ${positionals.length} files, allowed exactly two: the material (or a plan) and the record` }]);
    const k = values.backstresses!;
    if (!/^[123]$/.test(k)) throw new PlanError([{ file: CLI, path: '--backstresses', message: `got ${JSON.stringify(k)}, allowed 1, 2 or 3` }]);
    const kind = values.values!;
    if (kind !== 'engineering' && kind !== 'true') throw new PlanError([{ file: CLI, path: '--values', message: `got ${JSON.stringify(kind)}, allowed engineering (a lab export: converted at constant volume) or true` }]);
    const format = values.format!;
    if (format !== 'table' && format !== 'json') throw new PlanError([{ file: CLI, path: '--format', message: `got ${JSON.stringify(format)}, allowed one of table, json` }]);
    const [materialFile, recordFile] = positionals as [string, string];
    const plan = loadPlanOrMaterial(readText(materialFile), materialFile);
    const isPlan = plan.doc.name !== `material from ${materialFile}`; // loadPlanOrMaterial names a bare material so
    if (values['material-out'] !== undefined) {
      const { refuseInputAsOutput } = await import('../out.js');
      refuseInputAsOutput('--material-out', values['material-out'], [
        { file: materialFile, what: isPlan ? 'plan (its route and targets would be lost)' : 'material file', replaceable: !isPlan },
        { file: recordFile, what: 'record' },
      ], { name: '--replace-input', allowed: values['replace-input']! });
    }
    const u = plan.units;
    const rec = await readRecordFile(recordFile, { stressUnit: u.stress });
    // The machine's travel: its compliance (a spring in series, nonlinear at low force) is in every unloading and
    // reloading, which is what the backstresses are fitted to — refused, not corrected.
    if (rec.machineTravel) throw new PlanError([{ file: recordFile, path: rec.columns.extension?.name ?? 'extension', message: `the extension is the machine's travel, not an extensometer: its compliance is in every unloading and reloading the backstresses are fitted to; allowed a record from an extensometer or a strain gauge` }]);
    if (kind === 'engineering') {
      for (let i = 0; i < rec.strain.length; i++) {
        if (!(rec.strain[i]! > -1)) throw new PlanError([{ file: recordFile, path: `strain[${i}]`, message: `got ${rec.strain[i]}, allowed an engineering strain > −1 (fraction)` }]);
      }
    }
    const { strain, stress } = kind === 'engineering' ? trueCurve(rec.strain, rec.stress) : { strain: rec.strain, stress: rec.stress };
    const m = plan.route.material;
    const fit: KinematicFit = withLocation(recordFile, undefined, () => fitKinematic(m, strain, stress, { backstresses: Number(k) }));
    const S = u.fromMPa;
    const backstresses = fit.kinematic.backstresses.map((b, i) => ({
      C: S(b.C), gamma: b.gamma, saturation: S(b.C / b.gamma),
      standardError: { C: fit.standardErrors[i]!.C === null ? null : S(fit.standardErrors[i]!.C!), gamma: fit.standardErrors[i]!.gamma },
      interval95: {
        C: fit.intervals95[i]!.C === null ? null : fit.intervals95[i]!.C!.map(S) as [number, number],
        gamma: fit.intervals95[i]!.gamma,
      },
    }));
    const cautions = [
      'The backstresses describe this record\'s reversals; other prestrains, strain ranges or paths (bending, multiaxial) may need other values.',
      ...CAUTIONS,
    ];
    if (values['material-out'] !== undefined) {
      const doc = structuredClone((plan.doc as { material: Record<string, unknown> }).material);
      doc.kinematic = { backstresses: backstresses.map((b) => ({ C: +b.C.toPrecision(6), gamma: +b.gamma.toPrecision(6) })) };
      writeFileAtomic(values['material-out'], JSON.stringify({ units: u.system, ...doc }, null, 2) + '\n');
    }
    if (format === 'json') {
      io.stdout(JSON.stringify({
        material: m.name, record: recordFile, values: kind, units: { stress: u.stress, strain: 'true (logarithmic), dimensionless' },
        model: 'Armstrong–Frederick backstresses on the material\'s flow curve (src/core/path/fitKinematic.ts)',
        bounds: { C: KINEMATIC_FIT_BOUNDS.C.map(S), gamma: KINEMATIC_FIT_BOUNDS.gamma },
        backstresses,
        rmse: S(fit.rmse), r2: fit.r2, aic: fit.aic, bic: fit.bic, points: fit.points, iterations: fit.iterations, converged: fit.converged,
        warnings: fit.warnings, cautions,
      }, null, 2) + '\n');
    } else {
      const lines = [
        `kinematic fit of ${m.name} to ${recordFile} (${fit.points} points, ${kind === 'engineering' ? 'engineering values converted to true' : 'true values'})`,
        ...backstresses.map((b, i) => `  backstress ${i + 1}: C = ${+b.C.toPrecision(5)} ${u.stress}${b.standardError.C === null ? '' : ` ± ${+b.standardError.C.toPrecision(2)}`}, γ = ${+b.gamma.toPrecision(5)}${b.standardError.gamma === null ? '' : ` ± ${+b.standardError.gamma.toPrecision(2)}`}, saturation C/γ = ${sig4(b.saturation)} ${u.stress}`),
        `  RMSE ${+S(fit.rmse).toPrecision(3)} ${u.stress}, R² ${fit.r2.toFixed(5)}, ${fit.iterations} iterations${fit.converged ? '' : ', NOT converged'}`,
        ...fit.warnings.map((w) => `  warning: ${w.message}`),
        ...(values['material-out'] !== undefined ? [`wrote ${values['material-out']}`] : []),
        'cautions:',
        ...cautions.map((c) => `  - ${c}`),
      ];
      io.stdout(lines.join('\n') + '\n');
    }
    return fit.converged ? 0 : 1;
  },
});
