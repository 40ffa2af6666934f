import type { Command } from '../command.js';
import { analyze } from './analyze.js';
import { design } from './design.js';
import { run } from './run.js';
import { schema } from './schema.js';

/** Every runner command. Add a command: a file in this folder and one entry here. */
export const COMMANDS: readonly Command[] = [run, schema, design, analyze];
