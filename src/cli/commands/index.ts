import type { Command } from '../command.js';

/** A command known by name, loaded only when it runs (keeps start-up to the one command used). */
export interface CommandEntry {
  name: string;
  /** The command's synopsis and summary as `strainledger help` prints them, so the overview loads no command module. */
  usage: string;
  summary: string;
  load(): Promise<Command>;
}

/**
 * Every runner command. Add a command: a file in this folder and one entry here,
 * `{ name: 'x', usage, summary, load: async () => (await import('./x.js')).x }`. Commands are imported
 * lazily: a static import here would load every command's modules (and their libraries) on every start.
 * `usage` and `summary` repeat what the command declares (`synopsis(cmd)`, `cmd.summary`) so that the
 * overview loads nothing; test/cli/conventions.test.ts fails when they differ.
 */
export const COMMANDS: readonly CommandEntry[] = [
  { name: 'run', usage: 'strainledger run PLAN... [options]', summary: 'evaluate plans (files or quoted globs) through their routes and check their targets', load: async () => (await import('./run.js')).run },
  { name: 'merge', usage: 'strainledger merge REPORT... [options]', summary: 'combine the JSON reports or the JUnit files of the shards of one run (run --shard K/N) into the one document a single run writes', load: async () => (await import('./merge.js')).merge },
  { name: 'schema', usage: 'strainledger schema [options]', summary: 'print the JSON Schema of the plan file (or of the JSON report)', load: async () => (await import('./schema.js')).schema },
  { name: 'design', usage: 'strainledger design SPEC [options]', summary: 'propose ranked routes (passes, anneals, final temper reduction) for a design specification', load: async () => (await import('./design.js')).design },
  { name: 'analyze', usage: 'strainledger analyze RECORD... [options]', summary: 'tensile records: standard properties (E, Rp0.2, Rm, Ag, n-value) and every law fitted with statistics', load: async () => (await import('./analyze.js')).analyze },
  { name: 'tolerance-factor', usage: 'strainledger tolerance-factor --n N [options]', summary: 'one-sided normal tolerance factor k (x̄ − k·s is the lower bound) and the distribution-free rank', load: async () => (await import('./tolerance-factor.js')).toleranceFactor },
  { name: 'path', usage: 'strainledger path PLAN_OR_MATERIAL --history STRAINS [options]', summary: 'stress–strain points of a strain history (1-D return mapping, with the material\'s backstresses when it has them)', load: async () => (await import('./path.js')).path },
  { name: 'kinematic', usage: 'strainledger kinematic PLAN_OR_MATERIAL RECORD [options]', summary: 'fit Armstrong–Frederick backstresses (C, γ) to a record with a reversal; the material\'s flow curve and E are kept', load: async () => (await import('./kinematic.js')).kinematic },
];
