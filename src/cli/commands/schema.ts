import { parseArgs } from 'node:util';
import type { Command } from '../command.js';

export const schema: Command = {
  name: 'schema',
  usage: 'schema [--report]               print the JSON Schema of the plan file (--report: of the JSON report, version 1)',
  async run(args, io) {
    const { values } = parseArgs({ args, strict: true, allowPositionals: false, options: { report: { type: 'boolean', default: false } } });
    const s = values.report ? (await import('../../report/schema.js')).reportJsonSchema() : (await import('../../plan/schema.js')).planJsonSchema();
    io.stdout(JSON.stringify(s, null, 2) + '\n');
    return 0;
  },
};
