import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { paths } from '../helpers.js';
import { parseJsonLocated, MAX_JSON_DEPTH } from '../../src/plan/json.js';
import { parseLocated } from '../../src/plan/parse.js';
import { PlanError } from '../../src/plan/problems.js';
import { parseYamlLocated } from '../../src/plan/yaml.js';

// The plan's JSON reader (src/plan/json.ts) against the `yaml` package, a general-purpose YAML 1.2
// parser from the registry (JSON is a subset of YAML 1.2): both must give the same data and put every
// field path at the same line and column. Syntax errors are checked against the engine's JSON.parse.

const EXAMPLES = new URL('../../examples/', import.meta.url);
const jsonExamples = readdirSync(EXAMPLES).filter((f) => f.endsWith('.json')).map((f) => ({ f, text: readFileSync(new URL(f, EXAMPLES), 'utf8') }));

function problems(fn: () => unknown): string[] {
  try {
    fn();
  } catch (e) {
    if (e instanceof PlanError) return e.problems.map((p) => `${p.line ?? '-'}:${p.column ?? '-'} ${p.path} | ${p.message}`);
    throw e;
  }
  return [];
}

describe('the JSON plan reader', () => {
  it('gives the same data and the same line and column for every field as the yaml package, on every JSON example', () => {
    expect(jsonExamples.length).toBeGreaterThanOrEqual(5);
    for (const { f, text } of jsonExamples) {
      const ours = parseJsonLocated(text, f);
      const ref = parseYamlLocated(text, f);
      expect(ours.data, f).toEqual(ref.data);
      const all = paths(ours.data);
      expect(all.length).toBeGreaterThan(10);
      for (const p of all) expect(ours.locate(p), `${f} ${JSON.stringify(p)}`).toEqual(ref.locate(p));
      // A path that does not exist (a missing required field) stands at its deepest existing part.
      expect(ours.locate(['material', 'nonesuch'])).toEqual(ref.locate(['material', 'nonesuch']));
    }
  });

  it('agrees with the yaml package on random JSON documents, pretty or compact (fast-check, seeded)', () => {
    const keyArb = fc.string({ maxLength: 6 });
    const doc = fc.dictionary(keyArb, fc.jsonValue({ maxDepth: 4 }), { maxKeys: 6 });
    fc.assert(fc.property(doc, fc.boolean(), (d, pretty) => {
      const text = JSON.stringify(d, null, pretty ? 2 : undefined);
      const ours = parseJsonLocated(text, 'r.json');
      const ref = parseYamlLocated(text, 'r.json');
      expect(ours.data).toEqual(JSON.parse(text));
      for (const p of paths(ours.data)) expect(ours.locate(p), JSON.stringify(p)).toEqual(ref.locate(p));
    }), { seed: 20261201, numRuns: 300 });
  });

  it('refuses duplicate keys at any depth, each with its line, column and path, also when escapes spell the same key', () => {
    const text = '{\n  "name": "a",\n  "steps": [ { "kind": "roll", "kind": "draw" } ],\n  "n\\u0061me": "b"\n}';
    expect(problems(() => parseJsonLocated(text, 'p.json'))).toEqual([
      '3:32 steps[0].kind | duplicate key "kind"; allowed each key once in an object',
      '4:3 name | duplicate key "name"; allowed each key once in an object',
    ]);
    // the same keys in different objects are fine
    expect(problems(() => parseJsonLocated('{"a":{"k":1},"b":{"k":2},"c":[{"k":1},{"k":2}]}', 'p.json'))).toEqual([]);
  });

  it('reads strings holding brackets, commas, quotes and backslashes as plain text', () => {
    const text = '{"a": "}{][,:\\"\\\\", "b": ["\\\\", "x\\"y"], "c": {"d": 1}}';
    const r = parseJsonLocated(text, 'p.json');
    expect(r.data).toEqual({ a: '}{][,:"\\', b: ['\\', 'x"y'], c: { d: 1 } });
    expect(r.locate(['c', 'd'])).toEqual({ line: 1, column: text.indexOf('1}') + 1 });
    expect(r.locate(['b', 1])).toEqual({ line: 1, column: text.indexOf('"x') + 1 });
  });

  it('gives syntax errors at the offset JSON.parse names, as line and column', () => {
    const text = '{\n  "name": "a",\n  "units": "SI",\n}';
    const [msg] = problems(() => parseJsonLocated(text, 'p.json'));
    expect(msg).toMatch(/^4:1 {2}\| JSON syntax: /);
    expect(problems(() => parseJsonLocated('{"a": 1} x', 'p.json'))[0]).toMatch(/^1:10 {2}\| JSON syntax/);
  });

  it(`refuses nesting deeper than ${MAX_JSON_DEPTH} levels at the first level too deep, and reads ${MAX_JSON_DEPTH} levels`, () => {
    const deep = (n: number) => '['.repeat(n) + ']'.repeat(n);
    expect(problems(() => parseJsonLocated(deep(MAX_JSON_DEPTH), 'p.json'))).toEqual([]);
    expect(problems(() => parseJsonLocated(deep(MAX_JSON_DEPTH + 1), 'p.json'))).toEqual([
      `1:${MAX_JSON_DEPTH + 1}  | nesting too deep to read; allowed at most ${MAX_JSON_DEPTH} levels of objects and lists (a plan needs about six)`,
    ]);
    expect(problems(() => parseJsonLocated(deep(1_000_000), 'p.json'))).toHaveLength(1);
  });

  it('skips a byte-order mark and refuses invalid UTF-8 (decoded as U+FFFD) at its position', () => {
    expect(parseLocated('\uFEFF{"a": 1}', 'p.json', 'json').data).toEqual({ a: 1 });
    expect(problems(() => parseLocated('{"a":\n "\uFFFD"}', 'p.json', 'json'))).toEqual(['2:3  | invalid UTF-8 byte sequence; allowed UTF-8 text']);
  });

  it('reads YAML only with the YAML reader passed in', () => {
    expect(() => parseLocated('a: 1', 'p.yaml', 'yaml')).toThrow(/YAML reader/);
    expect(parseLocated('a: 1', 'p.yaml', 'yaml', parseYamlLocated).data).toEqual({ a: 1 });
  });
});
