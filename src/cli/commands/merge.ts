import { PlanError, type Problem } from '../../plan/problems.js';
import { defineCommand } from '../command.js';

const cliError = (path: string, message: string) => new PlanError([{ file: '(command line)', path, message }]);
const fileError = (file: string, message: string, path = '') => new PlanError([{ file, path, message }]);

const GLOB_CHARS = /[*?[\]{}]/;

/** One plan's entry in a merged report, with the exit code it stands for and where it came from. */
interface Entry {
  /** The plan file as the shard named it: the key the entries are sorted by. */
  key: string;
  exit: number;
  from: string;
  /** JSON: the report or the `{ file, invalid }` entry of an invalid plan. */
  value?: unknown;
  /** JUnit: the `<testsuite>` element exactly as written, closing line included. */
  xml?: string;
  tests?: number;
  failures?: number;
  errors?: number;
}

type Kind = 'json' | 'junit';

/**
 * The kind of a report file by its first character: JSON (`[` or `{`) or XML (`<`).
 * @throws PlanError naming the file when it is neither.
 */
function kindOf(file: string, text: string): Kind {
  if (text.trim() === '') throw fileError(file, 'is empty; allowed a JSON report (run --format json) or a JUnit file (run --format junit)');
  const c = text.trimStart()[0];
  if (c === '[' || c === '{') return 'json';
  if (c === '<') return 'junit';
  throw fileError(file, `starts with ${JSON.stringify(text.trimStart().slice(0, 12))}; allowed a JSON report (run --format json) or a JUnit file (run --format junit)`);
}

/**
 * Entries of a JSON report file: one report (a run of one plan) or the array a batch or a shard writes
 * (reports, and `{ file, invalid }` for invalid plans). Every report is checked against report v1.
 */
async function jsonEntries(file: string, text: string): Promise<Entry[]> {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    throw fileError(file, `is not valid JSON (${(e as Error).message}); allowed a JSON report written by strainledger run --format json`);
  }
  const items = Array.isArray(data) ? data : [data];
  const { ReportSchema } = await import('../../report/schema.js');
  const { formatValue } = await import('../../plan/problems.js');
  return items.map((item, i): Entry => {
    const at = Array.isArray(data) ? `[${i}]` : '';
    if (item === null || typeof item !== 'object' || Array.isArray(item)) throw fileError(file, `got ${formatValue(item)}; allowed a report object or an invalid-plan entry { file, invalid }`, at);
    const o = item as Record<string, unknown>;
    if (!('reportVersion' in o) && typeof o.file === 'string' && 'invalid' in o) {
      // An invalid plan: its problems (exit 2), or the message of an internal error (exit 3).
      return { key: o.file, exit: typeof o.invalid === 'string' ? 3 : 2, from: file, value: item };
    }
    if (o.reportVersion !== 1) {
      throw fileError(file, `got ${formatValue(o.reportVersion)}; allowed reportVersion 1 (the version this strainledger writes and reads); merge reports of one version`, `${at}${at ? '.' : ''}reportVersion`);
    }
    const checked = ReportSchema.safeParse(item);
    if (!checked.success) {
      const issue = checked.error.issues[0]!;
      const path = [at, ...issue.path.map((k) => (typeof k === 'number' ? `[${k}]` : `.${String(k)}`))].join('').replace(/^\./, '');
      throw fileError(file, `not a report v1: ${issue.message}`, path);
    }
    return { key: checked.data.plan.file, exit: checked.data.allTargetsMet ? 0 : 1, from: file, value: item };
  });
}

/** The error case `report/junit.ts` writes for an internal error (exit 3). */
const INTERNAL_ERROR = /^ {6}<error message="internal error" type="internal">/m;
const XML_HEAD = /^<\?xml version="1\.0" encoding="UTF-8"\?>\n<testsuites name="strainledger" tests="(\d+)" failures="(\d+)" errors="(\d+)">\n/;
const SUITE_OPEN = /^ {2}<testsuite name="([^"]*)" tests="(\d+)" failures="(\d+)" errors="(\d+)" skipped="0">$/;
const FILE_PROPERTY = /^ {6}<property name="plan\.file" value="([^"]*)"\/>$/m;

const unescapeXml = (s: string) => s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&amp;/g, '&');

/**
 * The `<testsuite>` elements of a JUnit file written by strainledger (src/report/junit.ts), each kept
 * byte for byte. Written here rather than with an XML library on purpose: a DOM parser would
 * re-serialise the suites (quotes, escapes, white space) and the merged file would no longer equal
 * the one-run file; this reader knows the writer's exact layout and refuses anything else, and checks
 * the document's totals against its suites (a truncated artifact is caught).
 */
function junitEntries(file: string, text: string): Entry[] {
  const head = XML_HEAD.exec(text);
  if (!head) throw fileError(file, 'is not a JUnit file written by strainledger run --format junit (its first two lines differ); allowed JUnit reports of strainledger only');
  const lines = text.slice(head[0].length).split('\n');
  const out: Entry[] = [];
  let i = 0;
  const lineNo = (k: number) => head[0].split('\n').length + k;
  for (; i < lines.length && lines[i] !== '</testsuites>'; i++) {
    const open = SUITE_OPEN.exec(lines[i]!);
    if (!open) throw new PlanError([{ file, line: lineNo(i), column: 1, path: '', message: `got ${JSON.stringify(lines[i]!.slice(0, 40))}; allowed a <testsuite> element as strainledger writes it` }]);
    const start = i;
    while (i < lines.length && lines[i] !== '  </testsuite>') i++;
    if (i >= lines.length) throw new PlanError([{ file, line: lineNo(start), column: 1, path: '', message: 'this <testsuite> is never closed; allowed a complete JUnit file' }]);
    const xml = lines.slice(start, i + 1).join('\n') + '\n';
    const [tests, failures, errors] = [Number(open[2]), Number(open[3]), Number(open[4])];
    const prop = FILE_PROPERTY.exec(xml);
    // A valid plan's suite names its file in a property; an invalid plan's suite is named by its file.
    const key = unescapeXml(prop ? prop[1]! : open[1]!);
    // An internal error (run's exit 3) is written as an <error type="internal">; any other error is invalid input (exit 2).
    const exit = INTERNAL_ERROR.test(xml) ? 3 : errors > 0 ? 2 : failures > 0 ? 1 : 0;
    out.push({ key, exit, from: file, xml, tests, failures, errors });
  }
  if (lines[i] !== '</testsuites>' || lines.slice(i + 1).join('') !== '') {
    throw fileError(file, 'does not end with </testsuites> and a line break; allowed a complete JUnit file');
  }
  const sum = (k: 'tests' | 'failures' | 'errors') => out.reduce((n, e) => n + e[k]!, 0);
  const [t, f, e] = [Number(head[1]), Number(head[2]), Number(head[3])];
  if (t !== sum('tests') || f !== sum('failures') || e !== sum('errors')) {
    throw new PlanError([{ file, line: 2, column: 1, path: '', message: `the totals tests=${t} failures=${f} errors=${e} do not add up over its suites (${sum('tests')}, ${sum('failures')}, ${sum('errors')}); allowed an unedited JUnit file` }]);
  }
  return out;
}

/** The merged document: the same bytes `run` writes for these plans in one batch. */
function mergedText(kind: Kind, entries: readonly Entry[]): string {
  if (kind === 'json') return JSON.stringify(entries.map((e) => e.value), null, 2) + '\n';
  const sum = (k: 'tests' | 'failures' | 'errors') => entries.reduce((n, e) => n + e[k]!, 0);
  return `<?xml version="1.0" encoding="UTF-8"?>\n<testsuites name="strainledger" tests="${sum('tests')}" failures="${sum('failures')}" errors="${sum('errors')}">\n`
    + entries.map((e) => e.xml).join('') + '</testsuites>\n';
}

/**
 * `merge REPORT... [--out FILE]`: combines the JSON reports or the JUnit files of the shards of one
 * run (`run --shard K/N`) into the one document a single run of all the plans writes: entries sorted
 * by plan file (the order `--shard` splits), each kept as written, JUnit totals recounted. Exit code:
 * the worst over all plans (0 met, 1 a target missed, 2 an invalid plan, 3 an internal error), the
 * same rule as `run`. Refused with exit 2, naming the file: a file of the other kind than the first,
 * a report version other than 1, a report that is not report v1, a plan found in two files.
 */
export const merge = defineCommand({
  name: 'merge',
  summary: 'combine the JSON reports or the JUnit files of the shards of one run (run --shard K/N) into the one document a single run writes',
  args: 'REPORT...',
  options: {
    out: { type: 'string', short: 'o', value: 'FILE', help: 'write the merged report to this file (atomically; never over one of its inputs) instead of stdout' },
  },
  details: [
    'REPORT... are JSON reports (run --format json) or JUnit files (run --format junit), not both; quoted globs are expanded.',
    'Entries are sorted by plan file, the order --shard splits; a plan found in two files is refused.',
    'exit codes: the worst over all plans, as run: 0 all targets met, 1 a target is not met, 2 an invalid plan or invalid input, 3 an internal error',
  ].join('\n'),
  async run({ values, positionals }, io) {
    if (positionals.length === 0) throw cliError('REPORT', 'got no report file, allowed one or more JSON reports or JUnit files (or quoted globs)');
    const files: string[] = [];
    for (const p of positionals) {
      if (!GLOB_CHARS.test(p)) { files.push(p); continue; }
      const { globSync } = await import('tinyglobby');
      const found = globSync(p, { onlyFiles: true, expandDirectories: false }).sort();
      if (found.length === 0) throw cliError('REPORT', `the pattern ${JSON.stringify(p)} matched no file, allowed a pattern matching at least one report`);
      files.push(...found);
    }
    const { readText } = await import('../io.js');
    const { resolve } = await import('node:path');
    if (values.out !== undefined && files.some((f) => resolve(f) === resolve(values.out!))) {
      throw cliError('--out', `got ${JSON.stringify(values.out)}, which is one of the reports to merge; allowed a new file (merge never overwrites its inputs)`);
    }
    if (values.out !== undefined) (await import('../out.js')).checkOutFile(values.out);
    let kind: Kind | undefined;
    let first = '';
    const entries: Entry[] = [];
    for (const file of files) {
      const text = readText(file).replace(/^\uFEFF/, ''); // a byte-order mark added by an editor or a CI step
      const k = kindOf(file, text);
      if (kind === undefined) { kind = k; first = file; }
      else if (k !== kind) {
        throw fileError(file, `is a ${k === 'json' ? 'JSON report' : 'JUnit file'} but ${first} is a ${kind === 'json' ? 'JSON report' : 'JUnit file'}; allowed reports of one kind (merge the JSON and the JUnit files separately)`);
      }
      entries.push(...(k === 'json' ? await jsonEntries(file, text) : junitEntries(file, text)));
    }
    // Shards of one run are disjoint: a plan twice means overlapping shards or a file given twice.
    const seen = new Map<string, string>();
    const twice: Problem[] = [];
    for (const e of entries) {
      const prev = seen.get(e.key);
      if (prev !== undefined) twice.push({ file: e.from, path: '', message: `plan ${e.key} is also in ${prev}; allowed each plan once (the shards of one run are disjoint)` });
      else seen.set(e.key, e.from);
    }
    if (twice.length > 0) throw new PlanError(twice);
    const { comparePaths } = await import('../shard.js');
    entries.sort((a, b) => comparePaths(a.key, b.key)); // stable: equal keys cannot occur (checked above)
    const text = mergedText(kind!, entries);
    const worst = entries.reduce((w, e) => Math.max(w, e.exit), 0);
    const count = (c: number) => entries.filter((e) => e.exit === c).length;
    const line = `merged ${entries.length} plan${entries.length === 1 ? '' : 's'} from ${files.length} file${files.length === 1 ? '' : 's'}: ${count(0)} met, ${count(1)} not met, ${count(2)} invalid${count(3) ? `, ${count(3)} internal errors` : ''}; exit ${worst}\n`;
    if (values.out !== undefined) {
      const { writeOutput } = await import('../out.js');
      writeOutput(values.out, text);
      io.stdout(`${line.trimEnd()}; wrote ${values.out}\n`);
    } else {
      io.stdout(text);
      io.stderr(line);
    }
    return worst;
  },
});
