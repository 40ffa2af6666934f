import { planJsonSchema } from '../../plan/schema.js';
import type { Command } from '../command.js';

export const schema: Command = {
  name: 'schema',
  usage: 'schema                          print the JSON Schema of the plan file',
  run(_args, io) {
    io.stdout(JSON.stringify(planJsonSchema(), null, 2) + '\n');
    return 0;
  },
};
