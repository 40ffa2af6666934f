import { PlanError } from '../../plan/problems.js';
import { defineCommand } from '../command.js';
import type { Outcome } from '../batch.js';
import { useColor } from '../color.js';
import { EXTENSION, FORMATS, type Format } from '../formats.js';

const cliError = (path: string, message: string) => new PlanError([{ file: '(command line)', path, message }]);

const GLOB_CHARS = /[*?[\]{}]/;

/**
 * `run PLAN... [options]`. Plans are evaluated by src/cli/evaluate.ts (read, parse, --set, validate,
 * resolve, ledger, report — hooks on the plan, such as fitting a named record, belong there); heavy modules are imported only once the arguments are known to be
 * valid and only for the format asked for, to keep the start-up short.
 */
export const run = defineCommand({
  name: 'run',
  summary: 'evaluate plans (files or quoted globs) through their routes and check their targets',
  args: 'PLAN...',
  options: {
    format: { type: 'string', short: 'f', default: 'table', value: 'FORMAT', help: `report format, one of ${FORMATS.join(', ')}` },
    out: { type: 'string', short: 'o', value: 'DIR', help: 'write one report file per plan into this folder (created when missing)' },
    set: { type: 'string', multiple: true, default: [], value: 'PATH=VALUE', help: 'change one plan field before it is checked, e.g. steps[0].thickness=1.2' },
    sweep: { type: 'string', value: 'PATH=FROM:TO:STEP', help: 'evaluate one plan over a range of one field; one row per value' },
    jobs: { type: 'string', short: 'j', default: '1', value: 'N', help: 'plans (or scatter blocks) evaluated on N worker threads' },
    shard: { type: 'string', value: 'K/N', help: 'run only the K-th of N shares of the sorted plan list (1-based; one CI matrix job each; combine the reports with merge)' },
    'no-progress': { type: 'boolean', default: false, help: 'no progress bar (it shows only on a terminal, never under CI)' },
  },
  details: 'exit codes: 0 all targets met, 1 a target is not met, 2 invalid input, 3 internal error (the worst over all plans)',
  async run({ values, positionals }, io) {
    const format = values.format as Format;
    if (!FORMATS.includes(format)) throw cliError('--format', `got ${JSON.stringify(values.format)}, allowed one of ${FORMATS.join(', ')}`);
    if (!/^\d+$/.test(values.jobs!)) throw cliError('--jobs', `got ${JSON.stringify(values.jobs)}, allowed a whole number ≥ 1`);
    const { maxJobs } = await import('../jobs.js');
    const jobs = Number(values.jobs);
    if (jobs < 1 || jobs > maxJobs()) throw cliError('--jobs', `got ${jobs}, allowed 1 to ${maxJobs()}`);
    if (positionals.length === 0) throw cliError('PLAN', 'got no plan file, allowed one or more plan files or globs');
    const { parseSet, parseSweep } = await import('../overrides.js');
    const overrides = values.set!.map(parseSet);
    const sweep = values.sweep !== undefined ? parseSweep(values.sweep) : undefined;
    const { parseShard, shardOf } = await import('../shard.js');
    const shard = values.shard !== undefined ? parseShard(values.shard) : undefined;
    if (shard && sweep) throw cliError('--shard', `got --shard ${values.shard} with --sweep, allowed --shard for a list of plans (a sweep is one plan)`);
    const { checkOutDir } = await import('../out.js');
    if (values.out !== undefined) checkOutDir(values.out);

    // Plans: files as given, globs expanded (sorted, so the order is the same on every machine).
    const files: string[] = [];
    for (const p of positionals) {
      if (!GLOB_CHARS.test(p)) { files.push(p); continue; }
      const { globSync } = await import('tinyglobby');
      const found = globSync(p, { onlyFiles: true, expandDirectories: false }).sort();
      if (found.length === 0) throw cliError('PLAN', `the pattern ${JSON.stringify(p)} matched no file, allowed a pattern matching at least one plan`);
      files.push(...found);
    }
    // A shard: the K-th share of the sorted, de-duplicated list (src/cli/shard.ts). Its output always
    // has the batch form (a JSON array, one JUnit document, a summary table), whatever its size, so
    // that `merge` combines shards of 0, 1 or many plans alike.
    const planned = shard ? shardOf(files, shard) : files;
    if (shard) files.splice(0, files.length, ...planned);
    const color = useColor(io);
    const progressOn = !values['no-progress'];
    const { startProgress } = await import('../progress.js');

    if (sweep) {
      if (files.length !== 1) throw cliError('--sweep', `got ${files.length} plans, allowed exactly one plan with --sweep`);
      if (format === 'html' || format === 'junit') throw cliError('--format', `got ${format} with --sweep, allowed table, json, csv or md for a sweep`);
      const [{ readPlan }, sw] = await Promise.all([import('../evaluate.js'), import('../sweep.js')]);
      const { planOutputs, writeOutput } = await import('../out.js');
      const targets = values.out !== undefined ? planOutputs(values.out, files, `sweep.${EXTENSION[format]}`) : undefined;
      const src = await readPlan(files[0]!);
      const progress = await startProgress(sweep.values.length, 'sweep', progressOn);
      let res;
      try {
        res = await sw.runSweep(src, sweep, overrides, progress);
      } finally {
        progress.stop();
      }
      const text = format === 'json' ? sw.sweepJson(res) : format === 'csv' ? sw.sweepCsv(res) : format === 'md' ? sw.sweepMd(res) : sw.sweepTable(res);
      if (targets) {
        const target = targets.get(files[0]!)!;
        writeOutput(target, text);
        io.stdout(`wrote ${target}\n`);
      } else io.stdout(text);
      return res.rows.reduce((w, r) => Math.max(w, r.exit), 0);
    }

    // One plan: evaluated here; invalid input is thrown (exit 2) before anything is written.
    if (files.length === 1 && !shard) {
      const [{ readPlan, evaluateSource }, { render }, { planOutputs, writeOutput }] = await Promise.all([import('../evaluate.js'), import('../render.js'), import('../out.js')]);
      const target = values.out !== undefined ? planOutputs(values.out, files, EXTENSION[format]).get(files[0]!)! : undefined;
      // A scatter section is sampled on --jobs worker threads (the numbers do not depend on how many).
      const report = await evaluateSource(await readPlan(files[0]!), overrides, { threads: jobs, progressOn });
      const exit = report.allTargetsMet ? 0 : 1;
      if (target === undefined) io.stdout(await render(report, format, color));
      else {
        writeOutput(target, await render(report, format));
        io.stdout(`${files[0]}: ${exit === 0 ? 'all targets met' : 'a target is NOT met'}; wrote ${target}\n`);
      }
      return exit;
    }

    // A batch (several plans, or --out): each plan on the main thread or a worker, then one summary.
    if (values.out === undefined && (format === 'md' || format === 'html')) {
      throw cliError('--format', `got ${format} for ${shard ? `shard ${values.shard} (${files.length} plan${files.length === 1 ? '' : 's'})` : `${files.length} plans`} without --out, allowed table, json, csv or junit on stdout (or --out DIR for one file per plan)`);
    }
    const [{ runTasks }, summary, { planOutputs, writeOutput }] = await Promise.all([import('../batch.js'), import('../summary.js'), import('../out.js')]);
    const targets = values.out !== undefined ? planOutputs(values.out, files, EXTENSION[format]) : undefined;
    const progress = await startProgress(files.length, 'plans', progressOn);
    let outcomes;
    let written = 0;
    // With --out each report is written (atomically) as soon as it is ready, not held until the end:
    // the writes overlap the workers' computing, and a large batch does not keep every report in memory.
    const write = (o: Outcome) => {
      if (targets && o.output !== undefined) {
        writeOutput(targets.get(o.file)!, o.output);
        delete o.output;
        written++;
      }
    };
    try {
      outcomes = await runTasks(files.map((file) => ({ file, format, overrides, render: targets !== undefined })), jobs, progress, write);
    } finally {
      progress.stop();
    }
    io.stderr(summary.problemLines(outcomes));
    if (targets) {
      const n = written;
      io.stdout(summary.summaryTable(outcomes, color) + `wrote ${n} ${format} report${n === 1 ? '' : 's'} to ${values.out}\n`);
    } else if (format === 'json') {
      io.stdout(JSON.stringify(outcomes.map((o) => o.report ?? { file: o.file, invalid: o.problems ?? o.internal }), null, 2) + '\n');
    } else if (format === 'csv') {
      const { csvReport, csvLine, csvHeader } = await import('../../report/csv.js');
      const { extraStepFields } = await import('../../report/fields.js');
      const reports = outcomes.flatMap((o) => (o.report ? [o.report] : []));
      const extras = extraStepFields(reports.flatMap((r) => r.steps));
      const tempers = reports.some((r) => r.steps.some((s) => s.temper !== undefined));
      io.stdout(csvLine(csvHeader(extras, tempers)) + reports.map((r) => csvReport(r, { header: false, extras, tempers })).join(''));
    } else if (format === 'junit') {
      const { junitReport } = await import('../../report/junit.js');
      const { formatProblem } = await import('../../plan/problems.js');
      io.stdout(junitReport(outcomes.map((o) => (o.report ? { name: o.report.plan.name, report: o.report } : o.problems ? { name: o.file, invalid: o.problems.map(formatProblem).join('\n') } : { name: o.file, internal: o.internal ?? 'internal error' }))));
    } else io.stdout(summary.summaryTable(outcomes, color));
    return summary.worstExit(outcomes);
  },
});
