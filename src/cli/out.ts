import { mkdirSync, realpathSync, statSync } from 'node:fs';
import { basename, join, resolve } from 'node:path';
import { PlanError } from '../plan/problems.js';
import { writeFileAtomic } from './io.js';

const outErr = (dir: string, message: string) => new PlanError([{ file: dir, path: '--out', message }]);

/**
 * Checks an output folder before any work: it must be a folder or not exist yet (then it is created
 * when the first file is written). A path that is a file is invalid input.
 */
export function checkOutDir(dir: string): string {
  const abs = resolve(dir);
  let st;
  try {
    st = statSync(abs);
  } catch {
    return abs;
  }
  if (!st.isDirectory()) throw outErr(dir, 'is a file, not a folder; allowed a folder (created when missing)');
  return abs;
}

/** The output file name of a plan: its base name without extension, plus the format's extension. */
export function outName(planFile: string, ext: string): string {
  return `${basename(planFile).replace(/\.(json|ya?ml)$/i, '')}.${ext}`;
}

function real(p: string): string {
  try {
    return realpathSync(p);
  } catch {
    return resolve(p);
  }
}

/**
 * Plans the files a run writes: one per plan, inside `dir` only (base names, never paths), never
 * over an input file, no two plans writing the same file, no target that is a folder.
 * @throws PlanError (exit 2) before anything is written.
 */
export function planOutputs(dir: string, inputs: readonly string[], ext: string): Map<string, string> {
  const abs = checkOutDir(dir);
  const inputSet = new Set(inputs.map(real));
  const out = new Map<string, string>();
  const taken = new Map<string, string>();
  for (const f of inputs) {
    const target = join(abs, outName(f, ext));
    if (inputSet.has(real(target))) throw outErr(dir, `writing ${target} would overwrite the input ${f}; allowed an output folder that holds no input plan of the same name`);
    const prev = taken.get(target);
    if (prev !== undefined) throw outErr(dir, `plans ${prev} and ${f} would both write ${target}; allowed plans with distinct file names`);
    try {
      if (statSync(target).isDirectory()) throw outErr(dir, `${target} is a folder; allowed a path for a report file`);
    } catch (e) {
      if (e instanceof PlanError) throw e;
    }
    taken.set(target, f);
    out.set(f, target);
  }
  return out;
}

/** Writes one output file atomically (temp file in the same folder, fsync, rename), creating the folder. */
export function writeOutput(target: string, data: string): void {
  mkdirSync(resolve(target, '..'), { recursive: true });
  writeFileAtomic(target, data);
}

/**
 * Checks a single output file before any work: it may exist (it is replaced atomically) but must not
 * be a folder. @throws PlanError (exit 2) naming `--out`.
 */
export function checkOutFile(file: string): void {
  try {
    if (statSync(resolve(file)).isDirectory()) throw new PlanError([{ file, path: '--out', message: 'is a folder; allowed a path for the merged report file' }]);
  } catch (e) {
    if (e instanceof PlanError) throw e;
  }
}

/** The same file on disk: same resolved real path (a symlink or `./` spelling of an input is caught). */
function sameFile(a: string, b: string): boolean {
  const real = (p: string) => { try { return realpathSync(resolve(p)); } catch { return resolve(p); } };
  return real(a) === real(b);
}

/**
 * Refuses an output file that is one of the command's inputs, before any work (never lose a user's
 * data): PlanError naming the option, the path and what is allowed. `replaceable` inputs may be replaced
 * when the user asks with `allowFlag` (`allowed` true); the others never (a record, or a plan whose
 * route the output would drop).
 */
export function refuseInputAsOutput(option: string, out: string, inputs: readonly { file: string; what: string; replaceable?: boolean }[], allowFlag?: { name: string; allowed: boolean }): void {
  for (const i of inputs) {
    if (!sameFile(out, i.file)) continue;
    if (i.replaceable && allowFlag?.allowed) continue;
    const how = i.replaceable && allowFlag ? `a new file, or ${allowFlag.name} to replace the ${i.what} on purpose` : 'a new file';
    throw new PlanError([{ file: '(command line)', path: option, message: `got ${JSON.stringify(out)}, which is the ${i.what} read by this command; allowed ${how}` }]);
  }
}
