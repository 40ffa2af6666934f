import { createHash } from 'node:crypto';
import { parseArgs } from 'node:util';
import { loadPlanText, runPlan } from '../../plan/load.js';
import { PlanError } from '../../plan/problems.js';
import { buildReport } from '../../report/build.js';
import { tableReport } from '../../report/table.js';
import type { Command } from '../command.js';
import { readText } from '../io.js';
import { TOOL } from '../version.js';

export const run: Command = {
  name: 'run',
  usage: 'run PLAN [--format table|json]   evaluate a plan; exit 0 all targets met, 1 a target missed, 2 invalid input',
  run(args, io) {
    const { values, positionals } = parseArgs({ args, allowPositionals: true, strict: true, options: { format: { type: 'string', default: 'table' } } });
    if (positionals.length !== 1) throw new PlanError([{ file: '(command line)', path: 'PLAN', message: `got ${positionals.length} plan files, allowed exactly one` }]);
    const format = values.format!;
    if (format !== 'table' && format !== 'json') throw new PlanError([{ file: '(command line)', path: '--format', message: `got ${JSON.stringify(format)}, allowed one of table, json` }]);
    const file = positionals[0]!;
    const text = readText(file);
    const plan = loadPlanText(text, file);
    const ledger = runPlan(plan);
    const report = buildReport(plan, ledger, { hash: createHash('sha256').update(text).digest('hex'), tool: TOOL });
    io.stdout(format === 'json' ? JSON.stringify(report, null, 2) + '\n' : tableReport(report, io.isTTY && !process.env.NO_COLOR));
    return report.allTargetsMet ? 0 : 1;
  },
};
