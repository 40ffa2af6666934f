import type { Command } from '../command.js';

/** A command known by name, loaded only when it runs (keeps start-up to the one command used). */
export interface CommandEntry {
  name: string;
  load(): Promise<Command>;
}

/**
 * Every runner command. Add a command: a file in this folder and one entry here,
 * `{ name: 'x', load: async () => (await import('./x.js')).x }`. Commands are imported lazily: a
 * static import here would load every command's modules (and their libraries) on every start.
 */
export const COMMANDS: readonly CommandEntry[] = [
  { name: 'run', load: async () => (await import('./run.js')).run },
  { name: 'merge', load: async () => (await import('./merge.js')).merge },
  { name: 'schema', load: async () => (await import('./schema.js')).schema },
  { name: 'design', load: async () => (await import('./design.js')).design },
  { name: 'analyze', load: async () => (await import('./analyze.js')).analyze },
  { name: 'tolerance-factor', load: async () => (await import('./tolerance-factor.js')).toleranceFactor },
  { name: 'path', load: async () => (await import('./path.js')).path },
  { name: 'kinematic', load: async () => (await import('./kinematic.js')).kinematic },
];
