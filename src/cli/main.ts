import { formatProblem, PlanError } from '../plan/problems.js';
import { commandHelp, didYouMean, parseCommandArgs, synopsis, UsageError } from './args.js';
import type { Command, OptionSpecs } from './command.js';
import { COMMANDS } from './commands/index.js';
import type { Io } from './io.js';
import { TOOL } from './version.js';

export type { Io } from './io.js';

/** Exit codes of the runner (DESIGN.md §5). */
export const EXIT = { ok: 0, targetMissed: 1, invalid: 2, internal: 3 } as const;

const NAMES = [...COMMANDS.map((c) => c.name), 'help'];
const GLOBAL_OPTIONS = ['--help', '-h', '--version', '-V'];

/** The overview: every command's synopsis and summary, from `COMMANDS` (no command module is loaded). */
export async function usage(): Promise<string> {
  return [
    `usage: strainledger COMMAND [options]   (${TOOL})`,
    '',
    'commands:',
    ...COMMANDS.flatMap((c) => [`  ${c.usage}`, `      ${c.summary}`]),
    '  strainledger help [COMMAND]',
    '      this text, or one command\'s options (same as strainledger COMMAND --help)',
    '',
    'options: -h, --help (on every command), -V, --version',
    'exit codes: 0 done (every target met), 1 a target is not met, 2 invalid input, 3 internal error',
    '',
  ].join('\n');
}

function unknownCommand(name: string, io: Io): number {
  const what = name.startsWith('-') ? 'option' : 'command';
  const allowed = name.startsWith('-') ? GLOBAL_OPTIONS : NAMES;
  io.stderr(`strainledger: unknown ${what} ${JSON.stringify(name)}; ${didYouMean(name, allowed, (s) => JSON.stringify(s))}allowed ${allowed.join(', ')}\n`);
  return EXIT.invalid;
}

/** The runner: returns the exit code; never throws, never prints a stack trace for bad input. */
export async function main(argv: string[], io: Io): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined) {
    io.stderr(await usage());
    return EXIT.invalid;
  }
  if (name === '--version' || name === '-V') {
    io.stdout(`${TOOL}\n`);
    return EXIT.ok;
  }
  if (name === 'help' || name === '--help' || name === '-h') {
    const topic = rest[0];
    if (topic === undefined) {
      io.stdout(await usage());
      return EXIT.ok;
    }
    const entry = COMMANDS.find((c) => c.name === topic);
    if (!entry) return unknownCommand(topic, io);
    io.stdout(commandHelp((await entry.load()) as Command<OptionSpecs>));
    return EXIT.ok;
  }
  const entry = COMMANDS.find((c) => c.name === name);
  if (!entry) return unknownCommand(name, io);
  let cmd: Command<OptionSpecs> | undefined;
  try {
    cmd = (await entry.load()) as Command<OptionSpecs>;
    const input = parseCommandArgs(cmd, rest);
    if (input === 'help') {
      io.stdout(commandHelp(cmd));
      return EXIT.ok;
    }
    return await cmd.run(input, io);
  } catch (e) {
    if (e instanceof UsageError && cmd) {
      io.stderr(`strainledger ${name}: ${e.message}\nusage: ${synopsis(cmd)}\n(strainledger ${name} --help lists every option)\n`);
      return EXIT.invalid;
    }
    if (e instanceof PlanError) {
      io.stderr(e.problems.map(formatProblem).join('\n') + '\n');
      return EXIT.invalid;
    }
    io.stderr(`strainledger: internal error: ${(e as Error).message}\n`);
    return EXIT.internal;
  }
}
