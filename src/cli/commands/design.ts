import { mkdirSync, statSync } from 'node:fs';
import { basename, join } from 'node:path';
import type { DesignResult, DesignedRoute } from '../../core/process/designRoute.js';
import { loadDesignSpecText, routeToPlan, runDesign, type LoadedDesignSpec } from '../../plan/designSpec.js';
import { PlanError } from '../../plan/problems.js';
import { CAUTIONS } from '../../report/cautions.js';
import { defineCommand } from '../command.js';
import { readText, writeFileAtomic } from '../io.js';

const cliError = (path: string, message: string) => new PlanError([{ file: '(command line)', path, message }]);
const f = (x: number, d = 4) => String(+x.toPrecision(d));

/** One proposed route in the JSON output: summary, explanations, final properties and the runnable plan. */
function routeJson(spec: LoadedDesignSpec, r: DesignedRoute) {
  const u = spec.units;
  const last = r.ledger.rows[r.ledger.rows.length - 1]!;
  return {
    rank: r.rank,
    anneals: r.anneals,
    passes: r.passes,
    finalReductionPct: r.finalReductionPct,
    finalStrain: r.finalStrain,
    margins: { window: r.windowMargin, passes: r.passMargin, anneal: r.annealMargin },
    governingPassLimit: r.governingPassLimit,
    annealNotes: r.annealNotes.map((n) => ({ afterPass: n.afterPass, size: +u.fromMm(n.size).toPrecision(10), strainBefore: n.strainBefore, reason: n.reason })),
    final: {
      reloadYield: u.fromMPa(last.reloadYield),
      tensileStrength: u.fromMPa(last.tensileStrength),
      remainingUniformElongationPct: last.remainingUniformElongationPct,
      hardnessHV: last.hardnessHV,
    },
    plan: routeToPlan(spec, r.steps, r.rank),
  };
}

function table(spec: LoadedDesignSpec, res: DesignResult): string {
  const u = spec.units;
  const out: string[] = [`design: ${spec.doc.name}`, `total strain ${f(res.totalStrain)}; at most ${f(res.maxStrainBeforeAnneal)} between anneals; at most ${f(res.passStrainLimit)} per pass; window: ${res.window.note}`, `${res.candidatesTried} candidate schedules run through the ledger`];
  if (!res.feasible) {
    out.push('', `NO ROUTE: the binding limit is ${res.binding!.limit}`, `  ${res.binding!.explanation}`);
  }
  for (const r of res.routes) {
    const last = r.ledger.rows[r.ledger.rows.length - 1]!;
    const sizes = r.steps.map((s) => (s.kind === 'anneal' ? 'anneal' : f(u.fromMm((s.kind === 'draw' ? s.diameter : (s as { thickness?: number }).thickness)!), 5))).join(' → ');
    out.push('', `route ${r.rank}: ${r.anneals} anneal(s), ${r.passes} passes; final reduction ${f(r.finalReductionPct, 3)} %; margins window ${f(r.windowMargin * 100, 3)} %, passes ${f(r.passMargin * 100, 3)} % (${r.governingPassLimit} governs), anneal ${f(r.annealMargin * 100, 3)} %`);
    out.push(`  sizes (${u.length}): ${f(u.fromMm(spec.spec.startSize), 5)} → ${sizes}`);
    out.push(`  final: reload yield ${f(u.fromMPa(last.reloadYield))} ${u.stress}, tensile ${f(u.fromMPa(last.tensileStrength))} ${u.stress}, remaining uniform elongation ${f(last.remainingUniformElongationPct, 3)} %, hardness ${f(last.hardnessHV, 4)} HV (Tabor estimate)${last.temper !== undefined ? `, temper ${last.temper?.designation ?? 'none of the system'}` : ''}`);
    for (const n of r.annealNotes) out.push(`  after pass ${n.afterPass}: ${n.reason}`);
  }
  out.push('', 'Cautions:', ...CAUTIONS.map((c) => `  - ${c}`));
  return out.join('\n') + '\n';
}

/**
 * `design SPEC [--format table|json] [--out DIR]`: proposes ranked routes for a design specification
 * (src/plan/designSpec.ts) and can write each as a plan file the `run` command runs.
 * Exit 0 when at least one route is found, 1 when the specification is valid but no route meets it
 * (the binding limit is explained), 2 for invalid input.
 */
export const design = defineCommand({
  name: 'design',
  summary: 'propose ranked routes (passes, anneals, final temper reduction) for a design specification',
  args: 'SPEC',
  details: 'exit codes: 0 routes found, 1 none feasible (the binding limit is explained), 2 invalid input',
  options: {
    format: { type: 'string', default: 'table', value: 'FORMAT', help: 'output, one of table, json' },
    out: { type: 'string', value: 'DIR', help: 'write each proposed route as a plan file SPEC-route-RANK.json into DIR' },
  },
  run({ values, positionals }, io) {
    if (positionals.length !== 1) throw cliError('SPEC', `got ${positionals.length} specification files, allowed exactly one`);
    const format = values.format!;
    if (format !== 'table' && format !== 'json') throw cliError('--format', `got ${JSON.stringify(format)}, allowed one of table, json`);
    if (values.out !== undefined) {
      let dirOk = false;
      try { dirOk = statSync(values.out).isDirectory(); } catch { dirOk = false; }
      if (!dirOk) {
        try { mkdirSync(values.out, { recursive: true }); } catch (e) { throw cliError('--out', `cannot create folder ${JSON.stringify(values.out)} (${(e as NodeJS.ErrnoException).code}), allowed a writable folder`); }
      }
    }
    const file = positionals[0]!;
    const spec = loadDesignSpecText(readText(file), file);
    const res = runDesign(spec);
    const written: string[] = [];
    if (values.out !== undefined) {
      const stem = basename(file).replace(/\.(json|ya?ml)$/i, '');
      for (const r of res.routes) {
        const target = join(values.out, `${stem}-route-${r.rank}.json`);
        writeFileAtomic(target, JSON.stringify(routeToPlan(spec, r.steps, r.rank), null, 2) + '\n');
        written.push(target);
      }
    }
    if (format === 'json') {
      io.stdout(JSON.stringify({
        designVersion: 1,
        spec: { name: spec.doc.name, file, units: spec.units.system },
        feasible: res.feasible,
        candidatesTried: res.candidatesTried,
        ledgerRuns: res.ledgerRuns,
        totalStrain: res.totalStrain,
        maxStrainBeforeAnneal: res.maxStrainBeforeAnneal,
        passStrainLimit: res.passStrainLimit,
        window: res.window,
        ...(res.binding ? { binding: res.binding } : {}),
        routes: res.routes.map((r) => routeJson(spec, r)),
        written,
        cautions: [...CAUTIONS],
      }, null, 2) + '\n');
    } else {
      io.stdout(table(spec, res) + (written.length ? `\nwrote ${written.join(', ')}\n` : ''));
    }
    return res.feasible ? 0 : 1;
  },
});
