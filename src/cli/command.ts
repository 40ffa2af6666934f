import type { Io } from './io.js';

/** One runner command. Each lives in `src/cli/commands/<name>.ts` and is listed in `commands/index.ts`. */
export interface Command {
  name: string;
  /** One line for the usage text: arguments and what it does. */
  usage: string;
  /** Runs the command; returns the exit code (0 ok, 1 a target missed, 2 invalid input). Throws PlanError for invalid input. */
  run(args: string[], io: Io): number | Promise<number>;
}
