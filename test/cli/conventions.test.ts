import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { editDistance, suggest, synopsis } from '../../src/cli/args.js';
import { colorEnabled } from '../../src/cli/color.js';
import type { Command, OptionSpecs } from '../../src/cli/command.js';
import { COMMANDS } from '../../src/cli/commands/index.js';
import { VERSION } from '../../src/cli/version.js';

// Command-line conventions (issue 13), checked on every command the runner lists, through the
// shipped runner (bin/ → dist/runner, built by test/globalSetup.ts). A command added to
// src/cli/commands/index.ts is covered here with no change to this file.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const PKG = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { version: string };
const cli = (args: string[], env: Record<string, string> = {}) => {
  const e: Record<string, string | undefined> = { ...process.env, CI: 'true', ...env };
  for (const k of ['FORCE_COLOR', 'NO_COLOR']) if (!(k in env)) delete e[k];
  return spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8', env: e });
};

/** A typo of `name`: its second and third letters swapped (the most common slip), else its last letter doubled. */
function typo(name: string): string {
  const t = name.length >= 3 ? name[0]! + name[2]! + name[1]! + name.slice(3) : name;
  return t === name ? name + name.slice(-1) : t;
}

describe('every command answers --help, -h and help COMMAND from its declared options', () => {
  it('the runner lists the commands it had before issue 13', () => {
    expect(COMMANDS.map((c) => c.name)).toEqual(expect.arrayContaining(['run', 'schema', 'design', 'analyze', 'tolerance-factor', 'path', 'kinematic']));
  });
  for (const entry of COMMANDS) {
    it(`${entry.name} --help prints its usage and every option on stdout, exit 0`, async () => {
      const cmd = (await entry.load()) as Command<OptionSpecs>;
      const r = cli([entry.name, '--help']);
      expect(r.status, r.stderr).toBe(0);
      expect(r.stderr).toBe('');
      expect(r.stdout.split('\n')[0]).toMatch(new RegExp(`^usage: strainledger ${entry.name}\\b`));
      expect(r.stdout).toContain(cmd.summary);
      for (const [name, o] of Object.entries(cmd.options)) {
        expect(r.stdout, name).toContain(`--${name}`);
        expect(r.stdout, name).toContain(o.help);
        expect(o.short === 'h' || o.short === 'V', `${entry.name} --${name} takes a reserved short name`).toBe(false);
      }
      expect(cli([entry.name, '-h']).stdout).toBe(r.stdout);
      // The overview prints COMMANDS' own copy of the synopsis and summary (it loads no command module).
      expect(entry.usage).toBe(synopsis(cmd));
      expect(entry.summary).toBe(cmd.summary);
      expect(cli(['help', entry.name]).stdout).toBe(r.stdout);
      // --help wins over other arguments, even invalid ones (nothing runs, nothing is written).
      const mixed = cli([entry.name, '--no-such-option', 'missing-file.json', '--help']);
      expect(mixed.status).toBe(0);
      expect(mixed.stdout).toBe(r.stdout);
    });
    it(`${entry.name} with a mistyped option: "did you mean" the declared one, allowed list, exit 2`, async () => {
      const cmd = (await entry.load()) as Command<OptionSpecs>;
      const names = Object.keys(cmd.options);
      expect(names.length).toBeGreaterThan(0);
      for (const name of names) {
        const wrong = typo(name);
        if (names.includes(wrong)) continue;
        const r = cli([entry.name, `--${wrong}`]);
        expect(r.status, `${name}: ${r.stderr}`).toBe(2);
        expect(r.stdout).toBe('');
        const first = r.stderr.split('\n')[0]!;
        expect(first).toContain(`strainledger ${entry.name}: unknown option '--${wrong}'`);
        expect(first).toMatch(new RegExp(`did you mean [^?]*'--${name}'`));
        expect(first).toContain(`allowed ${names.map((n) => `--${n}`).join(', ')}, --help`);
        expect(r.stderr).not.toMatch(/\n\s+at |internal error/);
      }
    });
    it(`${entry.name} with a mistyped short option (wrong case) or a long one written with one dash: "did you mean", exit 2`, async () => {
      const cmd = (await entry.load()) as Command<OptionSpecs>;
      const shorts = Object.values(cmd.options).flatMap((o) => (o.short ? [o.short] : []));
      for (const [name, o] of Object.entries(cmd.options)) {
        const other = o.short?.toUpperCase() === o.short ? o.short?.toLowerCase() : o.short?.toUpperCase();
        if (o.short && other && !shorts.includes(other) && other !== 'h' && other !== 'V') {
          const r = cli([entry.name, `-${other}`, 'x']);
          expect(r.status, `${name}: ${r.stderr}`).toBe(2);
          expect(r.stderr.split('\n')[0]).toMatch(new RegExp(`unknown option '-${other}'; did you mean [^?]*'-${o.short}'`));
        }
        if (name.length >= 3) {
          const r = cli([entry.name, `-${name}`, 'x']);
          expect(r.status, `-${name}: ${r.stderr}`).toBe(2);
          expect(r.stderr.split('\n')[0]).toMatch(new RegExp(`unknown option '-${name}'; did you mean [^?]*'--${name}'[^?]*\\(two dashes\\)\\?`));
          expect(r.stderr).not.toMatch(/\n\s+at |internal error/);
        }
      }
    });
    it(`${entry.name}: a required option shows in the synopsis and its absence is refused by name (exit 2)`, async () => {
      const cmd = (await entry.load()) as Command<OptionSpecs>;
      const help = cli([entry.name, '--help']).stdout.split('\n')[0]!;
      for (const [name, o] of Object.entries(cmd.options).filter(([, o]) => o.required)) {
        expect(help).toContain(`--${name}${o.type === 'string' ? ` ${o.value ?? 'VALUE'}` : ''}`);
        const r = cli([entry.name, ...(cmd.args ? cmd.args.split(' ').map(() => 'examples/hinge-tab-bend.json') : [])]);
        expect(r.status).toBe(2);
        expect(r.stderr).toContain(`--${name}: missing`);
      }
    });
  }
});

describe('strainledger with no command, help, --version and mistyped commands', () => {
  it('--version and -V print the package version on stdout, exit 0 (package.json is the source)', () => {
    expect(VERSION).toBe(PKG.version);
    for (const flag of ['--version', '-V']) {
      const r = cli([flag]);
      expect(r.status).toBe(0);
      expect(r.stdout).toBe(`strainledger ${PKG.version}\n`);
    }
  });
  it('help, --help and -h print the overview naming every command, exit 0', () => {
    const r = cli(['help']);
    expect(r.status).toBe(0);
    for (const c of COMMANDS) expect(r.stdout).toContain(`strainledger ${c.name}`);
    expect(cli(['--help']).stdout).toBe(r.stdout);
    expect(cli(['-h']).stdout).toBe(r.stdout);
  });
  it('no command at all: the overview on stderr, exit 2 (unchanged exit code)', () => {
    const r = cli([]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('commands:');
  });
  for (const c of COMMANDS) {
    it(`a mistyped command "${typo(c.name)}" suggests "${c.name}", lists the commands, exit 2`, () => {
      const r = cli([typo(c.name)]);
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toContain(`unknown command "${typo(c.name)}"; did you mean`);
      expect(r.stderr).toContain(`"${c.name}"`);
      expect(r.stderr).toContain(`allowed ${COMMANDS.map((x) => x.name).join(', ')}, help`);
    });
  }
  it('help for an unknown command suggests the near one, exit 2', () => {
    const r = cli(['help', 'analyse']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('did you mean "analyze"');
  });
  it('a command far from every name gets the allowed list without a guess', () => {
    const r = cli(['frobnicate']);
    expect(r.status).toBe(2);
    expect(r.stderr).not.toContain('did you mean');
    expect(r.stderr).toContain('allowed run,');
  });
});

describe('editDistance(a, b) and suggest(given, allowed)', () => {
  // Optimal-string-alignment distances: the worked example "CA" → "ABC" is 3 under this variant
  // (2 under unrestricted Damerau–Levenshtein) — Wikipedia, "Damerau–Levenshtein distance",
  // section on the optimal string alignment distance (from memory). "kitten" → "sitting" is 3,
  // the classic Levenshtein example (same article's Levenshtein companion page; from memory).
  it('counts substitutions, insertions, deletions and adjacent swaps', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3);
    expect(editDistance('CA', 'ABC')).toBe(3);
    expect(editDistance('fromat', 'format')).toBe(1);
    expect(editDistance('', 'abc')).toBe(3);
    expect(editDistance('same', 'same')).toBe(0);
  });
  it('suggests near names and abbreviations, nearest first, none when nothing is close', () => {
    expect(suggest('fromat', ['format', 'out', 'jobs'])).toEqual(['format']);
    expect(suggest('--outt', ['--out', '--format'])).toEqual(['--out']);
    expect(suggest('tol', ['run', 'tolerance-factor'])).toEqual(['tolerance-factor']);
    expect(suggest('xyzzy', ['run', 'schema'])).toEqual([]);
  });
});

describe('colour follows NO_COLOR and FORCE_COLOR', () => {
  it('colorEnabled(env, isTTY): FORCE_COLOR wins, then NO_COLOR, then the terminal', () => {
    expect(colorEnabled({}, true)).toBe(true);
    expect(colorEnabled({}, false)).toBe(false);
    expect(colorEnabled({ NO_COLOR: '1' }, true)).toBe(false);
    expect(colorEnabled({ NO_COLOR: '' }, true)).toBe(true);
    expect(colorEnabled({ FORCE_COLOR: '1' }, false)).toBe(true);
    expect(colorEnabled({ FORCE_COLOR: '0' }, true)).toBe(false);
    expect(colorEnabled({ FORCE_COLOR: '1', NO_COLOR: '1' }, false)).toBe(true);
  });
  it('the table report is coloured under FORCE_COLOR and plain under NO_COLOR (not a terminal here)', () => {
    const plan = join(ROOT, 'examples', 'contact-spring-strip.json');
    const forced = cli(['run', plan, '--format', 'table'], { FORCE_COLOR: '1' });
    const plain = cli(['run', plan, '--format', 'table'], { NO_COLOR: '1' });
    const neither = cli(['run', plan, '--format', 'table']);
    expect([forced.status, plain.status]).toEqual([neither.status, neither.status]);
    // eslint-disable-next-line no-control-regex
    const ansi = /\x1b\[[0-9;]*m/;
    expect(forced.stdout).toMatch(ansi);
    expect(plain.stdout).not.toMatch(ansi);
    expect(neither.stdout).not.toMatch(ansi);
    expect(forced.stdout.replace(/\x1b\[[0-9;]*m/g, '')).toBe(plain.stdout);
  });
});
