import type { Io } from './io.js';

/**
 * One option of a command, declared once: the parser (node:util parseArgs), `--help`, and the
 * "did you mean" suggestions all read this declaration.
 */
export interface OptionSpec {
  type: 'string' | 'boolean';
  /** One-letter alias, e.g. 'o' for `-o`. `h` and `V` are reserved (help, version). */
  short?: string;
  /** Repeatable: every value is collected in an array (in the order given). */
  multiple?: boolean;
  default?: string | boolean | string[];
  /** Placeholder for a string option's value in the help text, e.g. 'DIR' (default 'VALUE'). */
  value?: string;
  /** The command cannot run without it: shown in the synopsis, and refused (exit 2) when missing. */
  required?: boolean;
  /** What the option does, in one line: units, allowed values, default. */
  help: string;
}

export type OptionSpecs = Readonly<Record<string, OptionSpec>>;

type OptionValue<S extends OptionSpec> = S['type'] extends 'boolean'
  ? (S['multiple'] extends true ? boolean[] : boolean)
  : (S['multiple'] extends true ? string[] : string);

/** The parsed options: an option with a default is always present, others may be undefined. */
export type OptionValues<O extends OptionSpecs> = {
  [K in keyof O]: O[K] extends { default: unknown } ? OptionValue<O[K]> : OptionValue<O[K]> | undefined;
};

/** What a command's `run` receives: the options already checked against its declaration. */
export interface CommandInput<O extends OptionSpecs> {
  values: OptionValues<O>;
  positionals: string[];
}

/**
 * One runner command. Each lives in `src/cli/commands/<name>.ts` (declared with `defineCommand`)
 * and is listed by name in `commands/index.ts`. The runner parses the arguments from `options`
 * before `run` is called; `--help`/`-h` and unknown options are handled there, for every command.
 */
export interface Command<O extends OptionSpecs = OptionSpecs> {
  name: string;
  /** One line for the command overview (`strainledger help`): what the command does. */
  summary: string;
  /** The positional arguments in the synopsis, e.g. 'PLAN...'; omitted when the command takes none. */
  args?: string;
  /** Further help paragraphs (exit codes, notes), printed after the options. */
  details?: string;
  options: O;
  /** Runs the command; returns the exit code (0 ok, 1 a target missed, 2 invalid input). Throws PlanError for invalid input. */
  run(input: CommandInput<O>, io: Io): number | Promise<number>;
}

/** Declares a command with its option types inferred from the declaration (no casts in `run`). */
export function defineCommand<const O extends OptionSpecs>(c: Command<O>): Command<O> {
  return c;
}
