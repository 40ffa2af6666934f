import { writeFileSync } from 'node:fs';
import { join } from 'node:path';

/**
 * Malformed inputs for the runner (issue 4): each must exit 2 with one clear message naming what
 * is wrong, print no stack trace and leave no output file. Plans are built from a small valid base
 * (an invented copper strip; K 530 MPa, n 0.44 from Callister, 2nd ed., p. 199).
 */
export interface BadCase {
  name: string;
  /** Writes the input files into `dir`; returns the runner arguments (the output folder is appended by the test). */
  setup(dir: string): string[];
  /** What the one message must say. */
  expect: RegExp;
  /** The case gives its own --out (e.g. an output folder that is a file). */
  ownOut?: boolean;
  /** The message is followed by the usage text (an unknown option). */
  usage?: boolean;
}

export const BASE = {
  name: 'corpus base (INVENTED)',
  units: 'SI',
  material: { name: 'copper, annealed', elasticModulus: 115000, flowCurve: { law: 'hollomon', K: 530, n: 0.44 } },
  start: { thickness: 2 },
  steps: [{ kind: 'roll', thickness: 1.5 }],
  targets: { minYield: 200 },
};
const WIRE = { ...BASE, start: { diameter: 5 }, steps: [{ kind: 'draw', diameter: 4.5 }] };

type Json = Record<string, unknown>;
const clone = (o: unknown) => structuredClone(o) as Json;
/** BASE with one change made by `edit`. */
function plan(edit: (p: Json) => void, base: unknown = BASE): Json {
  const p = clone(base);
  edit(p);
  return p;
}
const mat = (p: Json) => p.material as Json;

function jsonCase(name: string, data: unknown, expect: RegExp, extra: string[] = []): BadCase {
  return { name, expect, setup: (dir) => { const f = join(dir, 'plan.json'); writeFileSync(f, JSON.stringify(data, null, 2)); return ['run', f, '--format', 'json', ...extra]; } };
}
function textCase(name: string, file: string, text: string | Buffer, expect: RegExp, extra: string[] = []): BadCase {
  return { name, expect, setup: (dir) => { const f = join(dir, file); writeFileSync(f, text); return ['run', f, '--format', 'json', ...extra]; } };
}

/** A valid plan whose flow curve is fitted from `record.csv` beside it; `record` null leaves the file out. */
function recordCase(name: string, record: string | Buffer | null, expect: RegExp): BadCase {
  return { name, expect, setup: (dir) => {
    const f = join(dir, 'plan.json');
    writeFileSync(f, JSON.stringify(plan((p) => { mat(p).flowCurve = { record: 'record.csv', law: 'hollomon' }; })));
    if (record !== null) writeFileSync(join(dir, 'record.csv'), record);
    return ['run', f, '--format', 'json'];
  } };
}

const nested = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);

export const CORPUS: BadCase[] = [
  // wrong types
  jsonCase('elasticModulus given as a string', plan((p) => { mat(p).elasticModulus = '115000'; }), /material\.elasticModulus: got "115000", allowed a number/),
  jsonCase('steps given as an object', plan((p) => { p.steps = { kind: 'roll' }; }), /steps: got \{"kind":"roll"\}, allowed an array/),
  jsonCase('plan name given as a number', plan((p) => { p.name = 42; }), /name: got 42, allowed a string/),
  jsonCase('law parameter given as a boolean', plan((p) => { (mat(p).flowCurve as Json).K = true; }), /material\.flowCurve\.K: got true, allowed a number/),
  jsonCase('a step given as a string', plan((p) => { p.steps = ['roll']; }), /steps\[0\]: got "roll", allowed/),
  textCase('the whole plan is a list', 'plan.json', '[1, 2, 3]', /got \[1,2,3\], allowed an object/),
  textCase('the whole plan is a number', 'plan.json', '42', /got 42, allowed an object/),
  textCase('an empty file', 'plan.json', '', /got (nothing|null)|allowed an object|JSON syntax/),
  // missing fields
  jsonCase('material missing', plan((p) => { delete p.material; }), /material: got nothing \(the field is required\), allowed an object/),
  jsonCase('flow curve missing', plan((p) => { delete mat(p).flowCurve; }), /material\.flowCurve: got nothing \(the field is required\)/),
  jsonCase('plan name missing', plan((p) => { delete p.name; }), /^[^\n]*name: got nothing \(the field is required\), allowed a string/),
  jsonCase('biaxial stretch without its strain', plan((p) => { p.steps = [{ kind: 'stretchBiaxial' }]; }), /steps\[0\]\.strain: got nothing \(the field is required\), allowed a number/),
  jsonCase('law parameter n missing', plan((p) => { delete (mat(p).flowCurve as Json).n; }), /material\.flowCurve\.n: got nothing \(the field is required\)/),
  // unknown kinds, fields, units
  jsonCase('unknown step kind', plan((p) => { p.steps = [{ kind: 'forge' }]; }), /steps\[0\]\.kind: got "forge", allowed one of "roll", "draw"/),
  jsonCase('unknown hardening law', plan((p) => { mat(p).flowCurve = { law: 'cubicSpline', K: 1 }; }), /material\.flowCurve\.law: got "cubicSpline", allowed one of "hollomon"/),
  jsonCase('unknown top-level field', plan((p) => { p.colour = 'blue'; }), /colour: unknown field "colour"/),
  jsonCase('unknown field in a step', plan((p) => { p.steps = [{ kind: 'roll', thickness: 1.5, speed: 3 }]; }), /steps\[0\]\.speed: unknown field "speed"/),
  jsonCase('unknown units', plan((p) => { p.units = 'metric'; }), /units: got "metric", allowed one of "SI", "US"/),
  // negative or zero sizes and moduli
  jsonCase('negative starting thickness', plan((p) => { p.start = { thickness: -2 }; }), /start\.thickness: got -2, allowed a number > 0/),
  jsonCase('zero starting diameter', plan((p) => { p.start = { diameter: 0 }; p.steps = []; }), /start\.diameter: got 0, allowed a number > 0/),
  jsonCase('a roll to zero thickness', plan((p) => { p.steps = [{ kind: 'roll', thickness: 0 }]; }), /steps\[0\]\.thickness: got 0, allowed a number > 0/),
  jsonCase('negative elastic modulus', plan((p) => { mat(p).elasticModulus = -115000; }), /material\.elasticModulus: got -115000, allowed a number > 0/),
  jsonCase('negative biaxial strain', plan((p) => { p.steps = [{ kind: 'stretchBiaxial', strain: -0.1 }]; }), /steps\[0\]\.strain: got -0\.1, allowed a number ≥ 0/),
  // reductions of 100 % or more
  jsonCase('a roll reduction of 100 %', plan((p) => { p.steps = [{ kind: 'roll', reductionPct: 100 }]; }), /steps\[0\]\.reductionPct: got 100, allowed a number < 100/),
  jsonCase('a draw area reduction of 150 %', plan((p) => { p.steps = [{ kind: 'draw', areaReductionPct: 150 }]; }, WIRE), /steps\[0\]\.areaReductionPct: got 150, allowed a number < 100/),
  jsonCase('an upset height reduction of 100 %', plan((p) => { p.start = { height: 20 }; p.steps = [{ kind: 'upset', reductionPct: 100 }]; }), /steps\[0\]\.reductionPct: got 100, allowed a number < 100/),
  // impossible geometry
  jsonCase('a draw that enlarges the wire', plan((p) => { p.steps = [{ kind: 'draw', diameter: 5.5 }]; }, WIRE), /steps\[0\]\.diameter: .*got 5\.5.*at most the current diameter 5 mm/),
  jsonCase('a roll that thickens the strip', plan((p) => { p.steps = [{ kind: 'roll', thickness: 2.5 }]; }), /steps\[0\]\.thickness: .*got 2\.5/),
  jsonCase('drawing a strip', plan((p) => { p.steps = [{ kind: 'draw', areaReductionPct: 10 }]; }), /steps\[0\]\.kind: drawing needs wire/),
  jsonCase('rolling a wire', plan((p) => { p.steps = [{ kind: 'roll', reductionPct: 10 }]; }, WIRE), /steps\[0\]\.kind: .*(strip|thickness)/),
  // out-of-range material data
  jsonCase('hardening exponent n of 2', plan((p) => { (mat(p).flowCurve as Json).n = 2; }), /material\.flowCurve\.n: got 2, allowed a number ≤ 1/),
  jsonCase('Poisson ratio of 0.5', plan((p) => { mat(p).poissonRatio = 0.5; }), /material\.poissonRatio: got 0\.5, allowed a number < 0\.5/),
  jsonCase('an anneal that softens nothing', plan((p) => { p.steps = [{ kind: 'anneal', softeningFraction: 0 }]; }), /steps\[0\]\.softeningFraction: got 0, allowed a number > 0/),
  jsonCase('saturated chord modulus above E', plan((p) => { mat(p).modulusDecay = { Ea: 200000, xi: 50 }; }), /material\.modulusDecay\.Ea: got 200000, allowed a modulus at most elasticModulus/),
  jsonCase('a fitted strain range backwards', plan((p) => { mat(p).fittedStrainRange = [0.2, 0.05]; }), /material\.fittedStrainRange: got \[0\.2,0\.05\], allowed a pair/),
  textCase('a number too large for a double (1e400)', 'plan.json', JSON.stringify(BASE).replace('115000', '1e400'), /material\.elasticModulus: got Infinity, allowed a number/),
  // contradictory targets
  jsonCase('minimum yield above maximum yield', plan((p) => { p.targets = { minYield: 500, maxYield: 300 }; }), /targets\.maxYield: contradictory targets; got 300, allowed a value ≥ minYield \(500\)/),
  jsonCase('a negative elongation target', plan((p) => { p.targets = { minRemainingElongationPct: -5 }; }), /targets\.minRemainingElongationPct: got -5, allowed a number ≥ 0/),
  // syntax: duplicate keys, broken files
  textCase('duplicate keys in JSON', 'plan.json', '{"name": "a", "name": "b", "material": {}}', /plan\.json:1:15: name: duplicate key "name"; allowed each key once in an object/),
  textCase('duplicate keys in YAML', 'plan.yaml', 'name: a\nunits: SI\nunits: US\n', /plan\.yaml:3:\d+: YAML syntax: Map keys must be unique/),
  textCase('a trailing comma in JSON', 'plan.json', JSON.stringify(BASE).replace(/}$/, ',}'), /plan\.json:1:\d+: JSON syntax/),
  textCase('bad YAML indentation', 'plan.yaml', 'name: x\nmaterial:\n  name: m\n elasticModulus: 1\n', /plan\.yaml:\d+:\d+: YAML syntax/),
  textCase('YAML that is not a plan at all', 'plan.yaml', '- just\n- a list\n', /got \["just","a list"\], allowed an object/),
  textCase('YAML alias bomb', 'plan.yaml', `a: &a [x, x, x, x, x, x, x, x, x]\nb: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a]\nc: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b]\nd: &d [*c, *c, *c, *c, *c, *c, *c, *c, *c]\ne: [*d, *d, *d, *d, *d, *d, *d, *d, *d]\n`, /plan\.yaml.*(alias|Alias)/),
  // deeply nested junk
  textCase('JSON nested 100,000 lists deep', 'plan.json', nested(100_000), /plan\.json:1:501: nesting too deep to read; allowed at most 500 levels/),
  textCase('YAML nested 100,000 lists deep', 'plan.yaml', nested(100_000), /plan\.yaml: nesting too deep to read/),
  jsonCase('junk nested 60 objects deep inside a field', plan((p) => { let o: Json = { leaf: 1 }; for (let i = 0; i < 60; i++) o = { a: o }; p.description = o; }), /description: got \{"a":.*allowed a string/),
  // size and encoding
  { name: 'a 50 MB file', expect: /plan\.json: file is 52428800 bytes; allowed at most 5242880 bytes for a plan/,
    setup: (dir) => { const f = join(dir, 'plan.json'); writeFileSync(f, Buffer.alloc(50 * 1024 * 1024, 0x20)); return ['run', f, '--format', 'json']; } },
  textCase('invalid UTF-8', 'plan.json', Buffer.concat([Buffer.from('{"name": "caf'), Buffer.from([0xc3, 0x28]), Buffer.from('"}')]), /plan\.json: invalid UTF-8 byte sequence; allowed UTF-8 text/),
  // records named by a plan (material.flowCurve.record, fitted at run time)
  recordCase('a plan that names a missing record file', null, /material\.flowCurve\.record: got "record\.csv" \(.*\): file not found/),
  recordCase('a named record that is empty', '', /record\.csv:1:1: empty file/),
  recordCase('a named record with a header and no numbers', 'strain,stress\n', /record\.csv:\d+:\d+: .*no rows of numbers/),
  recordCase('a named record with text in a number column', 'strain,stress\n0,0\n0.01,abc\n', /record\.csv:3:\d+: stress: got "abc", expected a number/),
  recordCase('a named record that is binary (NUL bytes, not UTF-8)', Buffer.from([0x73, 0x74, 0xff, 0x00, 0x0a]), /record\.csv:1:\d+: binary content \(character U\+(0000|FFFD)\)/),
  recordCase('a named record that is a spreadsheet workbook', Buffer.concat([Buffer.from('PK\x03\x04', 'latin1'), Buffer.alloc(40)]), /record\.csv:1:1: a spreadsheet workbook or another ZIP archive .* save the sheet/),
  // bytes that are not UTF-8 and hold no NUL are a Windows code page (decodeRecord): read, and refused for what they say
  recordCase('a named record in Windows-1252 with no numbers', Buffer.from('Dehnung [%];Spannung [N/mm\xb2]\n', 'latin1'), /record\.csv:\d+:\d+: .*no rows of numbers/),
  // files and folders
  { name: 'a plan file that does not exist', expect: /missing\.json: file not found/, setup: (dir) => ['run', join(dir, 'missing.json')] },
  { name: 'a plan path that is a folder', expect: /is a folder, not a file/, setup: (dir) => ['run', dir] },
  { name: 'an output folder that is a file', ownOut: true, expect: /taken\.txt: --out: is a file, not a folder/,
    setup: (dir) => { const f = join(dir, 'plan.json'); writeFileSync(f, JSON.stringify(BASE)); const o = join(dir, 'taken.txt'); writeFileSync(o, 'keep me'); return ['run', f, '--format', 'json', '--out', o]; } },
  { name: 'an output folder that holds the input of the same name', ownOut: true, expect: /--out: writing .*plan\.json would overwrite the input/,
    setup: (dir) => { const f = join(dir, 'plan.json'); writeFileSync(f, JSON.stringify(BASE)); return ['run', f, '--format', 'json', '--out', dir]; } },
  { name: 'a glob that matches nothing', expect: /PLAN: the pattern ".*nothing-\*\.json" matched no file/, setup: (dir) => ['run', join(dir, 'nothing-*.json')] },
  // command line
  jsonCase('--set to a step that does not exist', BASE, /--set: got index 9 in steps\[9\], allowed 0 to 0/, ['--set', 'steps[9].thickness=1']),
  jsonCase('--set giving a negative thickness', BASE, /steps\[0\]\.thickness: got -1, allowed a number > 0 \(value from --set\)/, ['--set', 'steps[0].thickness=-1']),
  jsonCase('--set without a value', BASE, /--set: got "steps\[0\]\.thickness", allowed PATH=VALUE/, ['--set', 'steps[0].thickness']),
  jsonCase('--sweep with a bad range', BASE, /--sweep: got .*allowed PATH=FROM:TO:STEP/, ['--sweep', 'steps[0].thickness=1:two:0.1']),
  jsonCase('--sweep with a zero step', BASE, /--sweep: got STEP 0, allowed a number > 0/, ['--sweep', 'steps[0].thickness=1:1.5:0']),
  jsonCase('an unknown format', BASE, /--format: got "pdf", allowed one of table, json, csv, md, html, junit/, ['--format', 'pdf']),
  jsonCase('--jobs 0', BASE, /--jobs: got 0, allowed 1 to \d+/, ['--jobs', '0']),
  { ...jsonCase('an unknown option', BASE, /strainledger run: unknown option '--colour'/, ['--colour']), usage: true },
];
