import { defineCommand } from '../command.js';

export const schema = defineCommand({
  name: 'schema',
  summary: 'print the JSON Schema of the plan file (or of the JSON report)',
  options: {
    report: { type: 'boolean', default: false, help: 'the schema of the JSON report (version 1) instead of the plan file' },
  },
  async run({ values }, io) {
    const s = values.report ? (await import('../../report/schema.js')).reportJsonSchema() : (await import('../../plan/schema.js')).planJsonSchema();
    io.stdout(JSON.stringify(s, null, 2) + '\n');
    return 0;
  },
});
