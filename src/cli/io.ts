import { randomBytes } from 'node:crypto';
import { closeSync, fsyncSync, openSync, readFileSync, renameSync, rmSync, writeSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { PlanError } from '../plan/problems.js';

/** Where a command writes: injected so tests can capture output. */
export interface Io {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
  isTTY: boolean;
}

/** Writes a file atomically: a temporary file beside it, fsync, then rename over the target. */
export function writeFileAtomic(path: string, data: string): void {
  const tmp = join(dirname(path), `.${randomBytes(6).toString('hex')}.tmp`);
  try {
    const fd = openSync(tmp, 'wx');
    try {
      writeSync(fd, data);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    renameSync(tmp, path);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
}

/** Reads a text file as UTF-8, refusing invalid UTF-8 (so no character is silently replaced). */
export function readText(file: string): string {
  let buf: Buffer;
  try {
    buf = readFileSync(file);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new PlanError([{ file, path: '', message: code === 'ENOENT' ? 'file not found' : code === 'EISDIR' ? 'is a folder, not a file' : `cannot read (${code})` }]);
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(buf);
  } catch {
    throw new PlanError([{ file, path: '', message: 'invalid UTF-8 byte sequence; allowed UTF-8 text' }]);
  }
}
