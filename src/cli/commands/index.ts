import type { Command } from '../command.js';
import { run } from './run.js';
import { schema } from './schema.js';

/** Every runner command. Add a command: a file in this folder and one entry here. */
export const COMMANDS: readonly Command[] = [run, schema];
