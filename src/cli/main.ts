import { formatProblem, PlanError } from '../plan/problems.js';
import { COMMANDS } from './commands/index.js';
import type { Io } from './io.js';

export type { Io } from './io.js';

/** Exit codes of the runner (DESIGN.md §5). */
export const EXIT = { ok: 0, targetMissed: 1, invalid: 2, internal: 3 } as const;

/** The usage text of every command (loads every command module; only for `help` and argument errors). */
export async function usage(): Promise<string> {
  const cmds = await Promise.all(COMMANDS.map((c) => c.load()));
  return ['usage:', ...cmds.map((c) => `  strainledger ${c.usage}`), '  strainledger help                this text'].join('\n');
}

/** The runner: returns the exit code; never throws, never prints a stack trace for bad input. */
export async function main(argv: string[], io: Io): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === 'help' || name === '--help' || name === '-h') {
    io.stdout((await usage()) + '\n');
    return name === undefined ? EXIT.invalid : EXIT.ok;
  }
  const entry = COMMANDS.find((c) => c.name === name);
  if (!entry) {
    io.stderr(`strainledger: unknown command ${JSON.stringify(name)}; allowed ${COMMANDS.map((c) => c.name).join(', ')}, help\n`);
    return EXIT.invalid;
  }
  try {
    const cmd = await entry.load();
    return await cmd.run(rest, io);
  } catch (e) {
    if (e instanceof PlanError) {
      io.stderr(e.problems.map(formatProblem).join('\n') + '\n');
      return EXIT.invalid;
    }
    const code = (e as { code?: string }).code;
    if (typeof code === 'string' && code.startsWith('ERR_PARSE_ARGS')) {
      io.stderr(`strainledger ${name}: ${(e as Error).message}\n${await usage()}\n`);
      return EXIT.invalid;
    }
    io.stderr(`strainledger: internal error: ${(e as Error).message}\n`);
    return EXIT.internal;
  }
}
