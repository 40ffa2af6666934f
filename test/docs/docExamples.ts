import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import ts from 'typescript';

/**
 * The documented-examples convention (DEVELOPERS.md, "Shards, merge and the docs test"):
 * - a fenced ```sh block holds commands run from the repository root, one per line (a line ending in
 *   `\` continues); `strainledger` means `node bin/strainledger.js` (so does `npx strainledger`);
 *   a line's expected exit code, when not 0, is a trailing comment `# exit 1` (or `# exit 2`);
 *   lines of one block share one shell (a variable set on one line is seen by the next);
 * - a block fenced ```sh no-run is not run (installs, servers, files the reader has and we do not);
 * - a fenced ```ts block is an ES module importing from `strainledger`, `strainledger/plan`,
 *   `strainledger/records` or `strainledger/charts`; it is compiled (types stripped) and run with Node,
 *   and the package resolves itself by name through its `exports` (dist/, built by globalSetup).
 * Every other fence (json, yaml, text, …) is not run here.
 */
export interface DocBlock {
  file: string;
  /** 1-based line of the opening fence. */
  line: number;
  lang: 'sh' | 'ts';
  body: string;
}

export const ROOT = join(import.meta.dirname, '..', '..');

/** The runnable blocks of one Markdown text, in order. */
export function extractBlocks(text: string, file: string): DocBlock[] {
  const lines = text.split('\n');
  const out: DocBlock[] = [];
  for (let i = 0; i < lines.length; i++) {
    const open = /^\s*(`{3,})\s*([\w-]*)\s*(.*)$/.exec(lines[i]!);
    if (!open) continue;
    const fence = open[1]!;
    const lang = open[2]!;
    const info = open[3]!.trim();
    let j = i + 1;
    while (j < lines.length && !new RegExp(`^\\s*${fence}\\s*$`).test(lines[j]!)) j++;
    const body = lines.slice(i + 1, j).join('\n');
    if ((lang === 'sh' || lang === 'ts') && info !== 'no-run') out.push({ file, line: i + 1, lang, body });
    i = j;
  }
  return out;
}

/** One command of a sh block: its text (continuations joined), its first line in the file, its expected exit code. */
export function shCommands(b: DocBlock): { cmd: string; line: number; exit: number }[] {
  const lines = b.body.split('\n');
  const out: { cmd: string; line: number; exit: number }[] = [];
  for (let i = 0; i < lines.length; i++) {
    const start = i;
    let cmd = lines[i]!;
    while (cmd.endsWith('\\') && i + 1 < lines.length) cmd = cmd.slice(0, -1) + ' ' + lines[++i]!;
    if (cmd.trim() === '' || cmd.trim().startsWith('#')) continue;
    const m = /#\s*exit\s+(\d+)\s*$/.exec(cmd);
    out.push({ cmd, line: b.line + 1 + start, exit: m ? Number(m[1]) : 0 });
  }
  return out;
}

export interface BlockResult {
  ok: boolean;
  /** Where and why it failed: `file:line: …` and the tail of stderr. */
  message: string;
}

const tail = (s: string) => s.trim().split('\n').slice(-12).join('\n');

/**
 * Runs a sh block in one `sh` from the repository root with its own TMPDIR (removed afterwards), `CI`
 * and `NO_COLOR` set. Each command's exit code is compared with the one the block states.
 */
export function runShBlock(b: DocBlock, root = ROOT): BlockResult {
  const tmp = mkdtempSync(join(tmpdir(), 'sl-docs-'));
  try {
    const script = [
      `strainledger() { node "${join(root, 'bin', 'strainledger.js')}" "$@"; }`,
      'npx() { if [ "$1" = strainledger ]; then shift; strainledger "$@"; else command npx "$@"; fi; }',
      ...shCommands(b).map((c) => `${c.cmd}\n__c=$?; if [ "$__c" -ne ${c.exit} ]; then echo "@@doc-line ${c.line} exit $__c, expected ${c.exit}" >&2; exit 97; fi`),
    ].join('\n');
    const r = spawnSync('sh', ['-c', script], { cwd: root, encoding: 'utf8', timeout: 120_000, maxBuffer: 64 * 1024 * 1024, env: { ...process.env, TMPDIR: tmp, CI: '1', NO_COLOR: '1' } });
    const fail = /@@doc-line (\d+) exit (\d+), expected (\d+)/.exec(r.stderr ?? '');
    if (r.status === 0) return { ok: true, message: '' };
    if (fail) return { ok: false, message: `${b.file}:${fail[1]}: exit ${fail[2]}, expected ${fail[3]}\n${tail(r.stderr.replace(fail[0], ''))}` };
    return { ok: false, message: `${b.file}:${b.line}: the sh block failed (status ${r.status}${r.signal ? `, ${r.signal}` : ''})\n${tail(r.stderr ?? '')}` };
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

/**
 * Runs a ts block: types stripped by TypeScript's own transpiler, written as an .mjs file inside the
 * package (test-results/, git-ignored) so that `strainledger/...` resolves through package.json
 * `exports`, then run with Node from the repository root.
 */
export function runTsBlock(b: DocBlock, root = ROOT): BlockResult {
  const js = ts.transpileModule(b.body, { compilerOptions: { module: ts.ModuleKind.ESNext, target: ts.ScriptTarget.ES2022 }, fileName: 'example.ts' }).outputText;
  const dir = join(root, 'test-results', 'docs-examples');
  mkdirSync(dir, { recursive: true });
  const f = join(dir, `${relative(root, b.file).replace(/[^\w.-]+/g, '_')}-L${b.line}.mjs`);
  writeFileSync(f, js);
  const tmp = mkdtempSync(join(tmpdir(), 'sl-docs-'));
  try {
    const r = spawnSync(process.execPath, [f], { cwd: root, encoding: 'utf8', timeout: 120_000, env: { ...process.env, TMPDIR: tmp } });
    if (r.status === 0) return { ok: true, message: '' };
    return { ok: false, message: `${b.file}:${b.line}: the ts block failed (status ${r.status})\n${tail(r.stderr ?? '')}` };
  } finally {
    rmSync(tmp, { recursive: true, force: true });
    rmSync(f, { force: true });
  }
}

/**
 * Type-checks ts blocks as a package user's strict TypeScript would (module nodenext, the package's
 * own `exports` types from dist/), in one `tsc` run. Errors are mapped back to the Markdown file and
 * line. Returns the messages ([] when all blocks check).
 */
export function typecheckTsBlocks(blocks: readonly DocBlock[], root = ROOT): string[] {
  const dir = mkdtempSync(join(root, 'test-results', 'docs-typecheck-'));
  try {
    const names = new Map<string, DocBlock>();
    blocks.forEach((b, i) => {
      const name = `block${i}.ts`;
      names.set(name, b);
      writeFileSync(join(dir, name), `${b.body}\nexport {};\n`);
    });
    writeFileSync(join(dir, 'tsconfig.json'), JSON.stringify({
      compilerOptions: { strict: true, noEmit: true, module: 'nodenext', moduleResolution: 'nodenext', target: 'ES2022', lib: ['ES2022', 'DOM'], types: ['node'], skipLibCheck: true },
      include: ['*.ts'],
    }));
    const r = spawnSync(process.execPath, [join(root, 'node_modules', 'typescript', 'bin', 'tsc'), '-p', join(dir, 'tsconfig.json')], { cwd: root, encoding: 'utf8', timeout: 180_000 });
    if (r.status === 0) return [];
    return (r.stdout + r.stderr).split('\n').filter((l) => l.trim() !== '').map((l) => {
      const m = /(block\d+\.ts)\((\d+),(\d+)\): (.*)$/.exec(l);
      const b = m ? names.get(m[1]!) : undefined;
      return b ? `${b.file}:${b.line + Number(m![2])}:${m![3]}: ${m![4]}` : l;
    });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
