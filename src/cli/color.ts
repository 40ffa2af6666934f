import type { Io } from './io.js';

/**
 * Whether the runner colours its terminal output. A non-empty `FORCE_COLOR` turns colour on even
 * when stdout is not a terminal (force-color.org), except `0` or `false`, which turn it off (the
 * reading of Node and of the supports-color package); otherwise a non-empty `NO_COLOR` turns it off
 * (no-color.org); otherwise colour follows whether stdout is a terminal. FORCE_COLOR winning over
 * NO_COLOR follows Node's documented rule (from memory: Node's CLI documentation of both variables).
 */
export function colorEnabled(env: Readonly<Record<string, string | undefined>>, isTTY: boolean): boolean {
  const force = env.FORCE_COLOR;
  if (force !== undefined && force !== '') return force !== '0' && force.toLowerCase() !== 'false';
  if (env.NO_COLOR !== undefined && env.NO_COLOR !== '') return false;
  return isTTY;
}

/** `colorEnabled` for this process's environment and the command's stdout. */
export function useColor(io: Io): boolean {
  return colorEnabled(process.env, io.isTTY);
}
