import { parseArgs } from 'node:util';
import { PlanError } from '../plan/problems.js';
import type { Command, CommandInput, OptionSpec, OptionSpecs } from './command.js';

/** Options every command understands, handled by the runner before the command runs. */
export const HELP_OPTION: OptionSpec = { type: 'boolean', short: 'h', help: 'print this help and exit' };

/**
 * Damerau–Levenshtein distance (optimal string alignment): insertions, deletions, substitutions and
 * swaps of two neighbouring letters each cost 1. Hand-written rather than a registry package: the
 * common edit-distance packages count a swap (`--fromat`) as 2, which hides the most frequent typo.
 */
export function editDistance(a: string, b: string): number {
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) => Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, d[i - 2]![j - 2]! + 1);
      d[i]![j] = v;
    }
  }
  return d[a.length]![b.length]!;
}

/**
 * The allowed names closest to `given`: those within an edit distance of max(1, ⌊length/3⌋), or that
 * start with what was typed (an abbreviation of at least 3 letters); nearest first, at most three.
 * @example suggest('fromat', ['format', 'out']) // ['format']
 */
export function suggest(given: string, allowed: readonly string[]): string[] {
  const g = given.toLowerCase();
  const limit = Math.max(1, Math.floor(g.length / 3));
  return allowed
    .map((name) => ({ name, d: editDistance(g, name.toLowerCase()), prefix: g.length >= 3 && name.toLowerCase().startsWith(g) }))
    .filter((c) => c.d <= limit || c.prefix)
    .sort((x, y) => x.d - y.d || x.name.localeCompare(y.name))
    .slice(0, 3)
    .map((c) => c.name);
}

/** "did you mean 'a' or 'b'?" or '' when nothing is close. */
export function didYouMean(given: string, allowed: readonly string[], quote = (s: string) => `'${s}'`): string {
  const s = suggest(given, allowed);
  return s.length === 0 ? '' : `did you mean ${s.map(quote).join(' or ')}? `;
}

/**
 * "did you mean" for an unknown short option `-x` (an edit distance means nothing between single
 * letters): a long option written with one dash (`-format` → `--format`), the same letter in the other
 * case (`-F` → `-f`), or the long options that start with the letter (`-s` → `--set`, `--shard`,
 * `--sweep`); at most three, '' when none fits.
 */
export function shortOptionHint(given: string, args: readonly string[], options: Readonly<Record<string, OptionSpec>>): string {
  const letter = given.replace(/^-/, '');
  const longs = Object.keys(options);
  const end = args.indexOf('--');
  // parseArgs reads `-format` as the group -f -o -r -m -a -t; the word itself says what was meant.
  for (const a of end < 0 ? args : args.slice(0, end)) {
    const m = /^-([a-zA-Z][\w-]+?)(=.*)?$/.exec(a);
    if (m && m[1]!.includes(letter)) {
      const near = suggest(m[1]!, longs);
      if (near.length > 0) return `did you mean ${near.map((n) => `'--${n}'`).join(' or ')} (two dashes)? `;
    }
  }
  const out: string[] = [];
  for (const [name, o] of Object.entries(options)) {
    if (o.short && o.short !== letter && o.short.toLowerCase() === letter.toLowerCase()) out.push(`-${o.short}`);
  }
  for (const name of longs) if (name.toLowerCase().startsWith(letter.toLowerCase()) && !out.includes(`--${name}`)) out.push(`--${name}`);
  return out.length === 0 ? '' : `did you mean ${out.slice(0, 3).map((n) => `'${n}'`).join(' or ')}? `;
}

function optionLabel(name: string, o: OptionSpec): string {
  const flag = `${o.short ? `-${o.short}, ` : '    '}--${name}`;
  return o.type === 'string' ? `${flag} ${o.value ?? 'VALUE'}` : flag;
}


function defaultNote(o: OptionSpec): string {
  if (o.default === undefined || o.default === false || (Array.isArray(o.default) && o.default.length === 0)) return '';
  return ` (default ${Array.isArray(o.default) ? o.default.join(',') : String(o.default)})`;
}

/** The one-line synopsis: `strainledger path PLAN_OR_MATERIAL --history STRAINS [options]`. */
export function synopsis(cmd: Command<OptionSpecs>): string {
  const required = Object.entries(cmd.options).filter(([, o]) => o.required).map(([n, o]) => (o.type === 'string' ? `--${n} ${o.value ?? 'VALUE'}` : `--${n}`));
  const optional = Object.values(cmd.options).some((o) => !o.required);
  return ['strainledger', cmd.name, ...(cmd.args ? [cmd.args] : []), ...required, ...(optional ? ['[options]'] : [])].join(' ');
}

/** The full `--help` text of a command, derived from its declaration. */
export function commandHelp(cmd: Command<OptionSpecs>): string {
  const rows = [...Object.entries(cmd.options), ['help', HELP_OPTION] as const].map(([name, o]) => [optionLabel(name, o), o.help + (o.multiple ? ' (repeatable)' : '') + defaultNote(o)] as const);
  const width = Math.min(32, Math.max(...rows.map(([l]) => l.length)));
  const lines = rows.map(([l, h]) => (l.length > width ? `  ${l}\n  ${' '.repeat(width)}  ${h}` : `  ${l.padEnd(width)}  ${h}`));
  return [`usage: ${synopsis(cmd)}`, '', cmd.summary, '', 'options:', ...lines, ...(cmd.details ? ['', cmd.details] : []), ''].join('\n');
}

/** Every long option name of a command, with `--`, for messages. */
export function optionNames(cmd: Command<OptionSpecs>): string[] {
  return [...Object.keys(cmd.options), 'help'].map((n) => `--${n}`);
}

/** An argument error: message first line, the command's synopsis and a pointer to its help after it. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/**
 * Parses a command's arguments against its declared options (node:util parseArgs, strict).
 * Returns `'help'` when `--help`/`-h` was given (anywhere before `--`, even beside other mistakes).
 * @throws UsageError naming the unknown or malformed option, with the closest allowed names.
 */
export function parseCommandArgs<O extends OptionSpecs>(cmd: Command<O>, args: string[]): CommandInput<O> | 'help' {
  const options = { ...cmd.options, help: HELP_OPTION } as Record<string, OptionSpec>;
  // Parser config: only the keys parseArgs knows (help texts stay out of it).
  const config = Object.fromEntries(Object.entries(options).map(([k, o]) => [k, { type: o.type, ...(o.short ? { short: o.short } : {}), ...(o.multiple ? { multiple: true } : {}), ...(o.default !== undefined ? { default: o.default } : {}) }]));
  const loose = parseArgs({ args, options: config, strict: false, allowPositionals: true, tokens: true });
  // A long option written with one dash (`-format json`) parses as `-f` with the value "ormat" (and
  // `-shard` as a group holding -h): say what was meant, before --help is honoured.
  const end = args.indexOf('--');
  for (const a of end < 0 ? args : args.slice(0, end)) {
    const m = /^-([a-zA-Z][\w-]{2,})(=.*)?$/.exec(a);
    const near = m ? suggest(m[1]!, Object.keys(options)) : [];
    if (near.length > 0) throw new UsageError(`unknown option '${a.replace(/=.*$/, '')}'; did you mean ${near.map((n) => `'--${n}'`).join(' or ')} (two dashes)? allowed ${optionNames(cmd).join(', ')}`);
  }
  if (loose.tokens.some((t) => t.kind === 'option' && t.name === 'help')) return 'help';
  for (const t of loose.tokens) {
    if (t.kind !== 'option' || t.name in options) continue;
    const given = t.rawName;
    const long = t.rawName.startsWith('--');
    const allowed = long ? optionNames(cmd) : [...Object.values(options).flatMap((o) => (o.short ? [`-${o.short}`] : []))];
    const hint = long ? didYouMean(given, allowed) : shortOptionHint(given, args, options);
    throw new UsageError(`unknown option '${given}'; ${hint}allowed ${optionNames(cmd).join(', ')}`);
  }
  try {
    const { values, positionals } = parseArgs({ args, options: config, strict: true, allowPositionals: cmd.args !== undefined });
    delete (values as Record<string, unknown>).help;
    for (const [name, o] of Object.entries(cmd.options)) {
      if (o.required && (values as Record<string, unknown>)[name] === undefined) {
        throw new PlanError([{ file: '(command line)', path: `--${name}`, message: `missing; allowed ${o.help}` }]);
      }
    }
    return { values: { ...values } as CommandInput<O>['values'], positionals };
  } catch (e) {
    const code = (e as { code?: string }).code ?? '';
    if (code === 'ERR_PARSE_ARGS_UNEXPECTED_POSITIONAL') {
      const p = loose.positionals[0] ?? '';
      throw new UsageError(`unexpected argument ${JSON.stringify(p)}; ${cmd.name} takes no file arguments, only options`);
    }
    if (code.startsWith('ERR_PARSE_ARGS')) throw new UsageError((e as Error).message.split('. To specify')[0]!);
    throw e;
  }
}
