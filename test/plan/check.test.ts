import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { parse as parseYaml } from 'yaml';
import { describe, expect, it } from 'vitest';
import { paths, type Path } from '../helpers.js';
import Ajv2020Module from 'ajv/dist/2020.js';
import { fastPlanCheck } from '../../src/plan/check.js';
import { assertSupportedSchema, conforms, fillDefaults, type SchemaNode } from '../../src/plan/conforms.js';
import { PLAN_VALIDITY_SCHEMA } from '../../src/plan/generated/planSchema.js';
import { planJsonSchema, PlanSchema } from '../../src/plan/schema.js';
// @ts-expect-error plain ES module without types (the generator shared with scripts/gen-plan-validator.mjs)
import { planSchemaSource } from '../../scripts/plan-validator-source.mjs';

// The runner's fast plan check (the plan JSON Schema walked by src/plan/conforms.ts) must say "valid"
// exactly when the zod schema does and give the same document, defaults filled. Two references:
// zod, the schema the plan format is defined by (src/plan/schema.ts), and Ajv 8 (a general-purpose
// JSON Schema validator from the registry, draft 2020-12, defaults filled by its useDefaults) on the
// full JSON Schema that `strainledger schema` prints.

const Ajv2020 = (Ajv2020Module as unknown as { default: typeof Ajv2020Module }).default ?? Ajv2020Module;
const ajv = new Ajv2020({ useDefaults: true, strictNumbers: true, strict: false, allErrors: false });
const ajvCheck = ajv.compile(planJsonSchema() as object);

const EXAMPLES = new URL('../../examples/', import.meta.url);
const examplePlans = readdirSync(EXAMPLES)
  .filter((f) => /\.(json|ya?ml)$/.test(f) && !/^design-/.test(f))
  .map((f) => ({ f, data: parseYaml(readFileSync(new URL(f, EXAMPLES), 'utf8')) as unknown }));

/** Every optional part of the plan format at once, so mutations reach every branch of the schema. */
const KITCHEN_SINK = {
  name: 'every field (test data)', units: 'US', description: 'x',
  material: {
    name: 'm', elasticModulus: 29000, poissonRatio: 0.3,
    flowCurve: { law: 'swiftVoce', alpha: 0.5, K: 80, eps0: 0.01, n: 0.2, sigma0: 30, Q: 20, b: 10 },
    modulusDecay: { Ea: 25000, xi: 20 },
    kinematic: { backstresses: [{ C: 2000, gamma: 100 }, { C: 500, gamma: 10 }] },
    fittedStrainRange: [0.01, 0.2], density: 7850, specificHeat: 460,
  },
  start: { thickness: 0.1, width: 2, diameter: 0.2, height: 1 },
  steps: [
    { kind: 'roll', label: 'a', thickness: 0.09, rollRadius: 4, width: 2, friction: 0.1, forceCapacity: 1e5 },
    { kind: 'roll', reductionPct: 10 },
    { kind: 'draw', diameter: 0.18, dieHalfAngleDeg: 6, friction: 0.05, forceCapacity: 1000 },
    { kind: 'draw', areaReductionPct: 15 },
    { kind: 'stretch', strain: 0.02 }, { kind: 'stretch', engineeringStrain: 0.02 },
    { kind: 'stretchBiaxial', strain: 0.01 }, { kind: 'upset', height: 0.9 }, { kind: 'upset', reductionPct: 5 },
    { kind: 'shear', shearStrain: 0.1 }, { kind: 'strain', strain: 0.05 }, { kind: 'anneal', softeningFraction: 0.5 },
    { kind: 'reverse', strain: 0.01 }, { kind: 'bend', radius: 0.2, angle: 90, reverse: true },
  ],
  targets: { minYield: 40, maxYield: 90, minTensile: 50, minRemainingElongationPct: 2, maxSpringbackDeg: 10 },
  scatter: {
    samples: 1000, seed: 7, params: { K: { cv: 0.04 }, n: { sd: 0.01 } }, start: { thickness: { cv: 0.01 } },
    correlation: { 'K,n': -0.5 }, records: ['a.csv', 'b.csv'], coverage: 0.9, confidence: 0.95,
  },
};
const RECORD_PLAN = {
  name: 'record (test data)',
  material: { name: 'm', elasticModulus: 200000, flowCurve: { record: 'r.csv', law: 'voce', options: { stressUnit: 'MPa', strainUnit: '%', area: 1, diameter: 1, width: 1, thickness: 1, gaugeLength: 50 } } },
  steps: [],
};
const SEEDS: unknown[] = [KITCHEN_SINK, RECORD_PLAN, ...examplePlans.map((e) => e.data)];

function agree(data: unknown): void {
  const z = PlanSchema.safeParse(structuredClone(data));
  const viaAjv = structuredClone(data);
  expect(ajvCheck(viaAjv), `Ajv ${z.success ? 'refused' : 'accepted'} what zod ${z.success ? 'accepted' : 'refused'}: ${JSON.stringify(data).slice(0, 300)}`).toBe(z.success);
  const fast = fastPlanCheck(data);
  expect(fast !== undefined, `fast check ${fast ? 'accepted' : 'refused'} what zod ${z.success ? 'accepted' : 'refused'}: ${JSON.stringify(data).slice(0, 400)}${z.success ? '' : `\nzod: ${z.error.issues[0]?.message} at ${z.error.issues[0]?.path.join('.')}`}`).toBe(z.success);
  if (z.success) {
    expect(fast).toEqual(z.data);
    expect(fast).toEqual(viaAjv);
  }
}

// Values near every bound in the schema, wrong types, lengths at the string limits (UTF-16 units,
// as zod counts them), and numbers JSON cannot hold but YAML can (.inf, .nan).
const VALUES: unknown[] = [
  0, -0, 1, -1, 0.5, 0.49999, 0.6, 0.61, 2, 2.5, 10, 45, 45.1, 99.999, 100, 180, 180.1, 500, 499, 1e4, 1e4 + 1, 1e5, 1e5 + 1,
  1e7, 1e7 + 1, 4294967295, 4294967296, 25000, 25001, 50, 49, 5000, 5001, 1e-300, -1e-300, 1e308,
  Infinity, -Infinity, NaN, '', 'x', 'x'.repeat(200), 'x'.repeat(201), '\u{1F600}'.repeat(100), '\u{1F600}'.repeat(101),
  'x'.repeat(1000), 'x'.repeat(1001), 'SI', 'US', 'ksi', '-', '%', 'roll', 'anneal', 'bend', 'hollomon', 'voce', 'swift',
  true, false, null, [], [1], [0.1, 0.2], [0.1, 0.2, 0.3], ['a.csv'], ['a.csv', 'b.csv'], {}, { cv: 0.1 }, { sd: 1 }, { cv: 2 },
  { kind: 'anneal' }, { kind: 'roll', reductionPct: 10 }, { law: 'hollomon', K: 500, n: 0.2 }, { C: 10, gamma: 1 },
];

function parentOf(root: unknown, p: Path): Record<string | number, unknown> | undefined {
  let node: unknown = root;
  for (const k of p.slice(0, -1)) node = (node as Record<string | number, unknown>)[k];
  return node !== null && typeof node === 'object' ? (node as Record<string | number, unknown>) : undefined;
}

/** One edit of a plan: set a field to a value, delete it, or add an unknown field. */
const mutation = fc.record({ pick: fc.nat(), value: fc.constantFrom(...VALUES), op: fc.constantFrom('set', 'set', 'set', 'delete', 'add') });

describe('the fast plan check agrees with the zod schema', () => {
  it('the committed schema module is current (npm run gen:validator regenerates it) and uses only keywords the check knows', () => {
    const committed = readFileSync(new URL('../../src/plan/generated/planSchema.ts', import.meta.url), 'utf8');
    expect(committed === planSchemaSource(planJsonSchema()), 'src/plan/generated/planSchema.ts is stale: run `npm run gen:validator`').toBe(true);
    expect(() => assertSupportedSchema(PLAN_VALIDITY_SCHEMA)).not.toThrow();
    expect(() => assertSupportedSchema({ type: 'string', pattern: '^a' })).toThrow(/keyword "pattern" is not supported/);
    expect(() => assertSupportedSchema({ anyOf: [{ type: 'object', properties: { a: { default: 1 } } }] })).toThrow(/default inside anyOf/);
  });

  it('each keyword on its own, against Ajv on the same small schemas', () => {
    const cases: [SchemaNode, unknown[]][] = [
      [{ type: 'number', exclusiveMinimum: 0, maximum: 1 }, [0, 1e-300, 1, 1.0000001, -1, '1', null, Infinity]],
      [{ type: 'integer', minimum: 2, exclusiveMaximum: 5 }, [2, 4, 5, 2.5, 1, 4.0]],
      [{ type: 'string', minLength: 1, maxLength: 2 }, ['', 'a', 'ab', 'abc', '\u{1F600}\u{1F600}', '\u{1F600}\u{1F600}\u{1F600}', '\uD800\uD800', 3]],
      [{ type: 'string', enum: ['SI', 'US'] }, ['SI', 'si', 'US', 1]],
      [{ type: 'string', const: 'roll' }, ['roll', 'draw']],
      [{ type: 'boolean' }, [true, false, 0, 'true', null]],
      [{ type: 'array', prefixItems: [{ type: 'number' }, { type: 'number' }], items: false, minItems: 2, maxItems: 2 }, [[1, 2], [1], [1, 2, 3], [1, 'a'], {}]],
      [{ type: 'array', items: { type: 'string' }, minItems: 2 }, [['a', 'b'], ['a'], ['a', 1], 'ab']],
      [{ type: 'object', properties: { a: { type: 'number' } }, required: ['a'], additionalProperties: false }, [{ a: 1 }, {}, { a: 1, b: 2 }, { a: 'x' }, [], null, JSON.parse('{"a":1,"__proto__":2}'), { constructor: 1, a: 1 }]],
      [{ type: 'object', propertyNames: { type: 'string' }, additionalProperties: { type: 'number', maximum: 1 } }, [{}, { x: 1 }, { x: 2 }, { x: 'a' }]],
      [{ anyOf: [{ type: 'number' }, { type: 'string' }] }, [1, 'a', true]],
      [{ oneOf: [{ type: 'number', maximum: 5 }, { type: 'number', minimum: 3 }] }, [1, 4, 6, 'a']],
    ];
    for (const [schema, values] of cases) {
      const ref = new Ajv2020({ strictNumbers: true, strict: false }).compile(schema);
      for (const v of values) expect(conforms(schema, v), `${JSON.stringify(schema)} on ${JSON.stringify(v)}`).toBe(ref(v));
    }
    const filled = fillDefaults({ type: 'object', properties: { u: { default: 'SI' }, t: { default: {} , type: 'object', properties: { z: { default: 1 } } }, s: { type: 'object', properties: { n: { default: 2 } } } } }, { s: {} });
    expect(filled).toEqual({ u: 'SI', t: {}, s: { n: 2 } }); // a default is taken as it is, as zod does
  });

  it('on every example plan and on a plan using every field', () => {
    expect(examplePlans.length).toBeGreaterThanOrEqual(6);
    for (const s of SEEDS) {
      expect(PlanSchema.safeParse(structuredClone(s)).success).toBe(true);
      agree(s);
    }
  });

  it('fills the defaults as zod does (units SI, empty start and targets, scatter settings)', () => {
    const doc = fastPlanCheck({ name: 'n', material: RECORD_PLAN.material, steps: [], scatter: {} })!;
    expect(doc.units).toBe('SI');
    expect(doc.start).toEqual({});
    expect(doc.targets).toEqual({});
    expect(doc.scatter).toEqual(PlanSchema.parse({ name: 'n', material: RECORD_PLAN.material, steps: [], scatter: {} }).scatter);
  });

  it('does not change the data it checks', () => {
    const data = structuredClone(RECORD_PLAN);
    fastPlanCheck(data);
    expect(data).toEqual(RECORD_PLAN);
  });

  it('on 3000 plans with one to three random edits each (fast-check, seeded)', () => {
    fc.assert(fc.property(fc.nat({ max: SEEDS.length - 1 }), fc.array(mutation, { minLength: 1, maxLength: 3 }), (seedIndex, edits) => {
      const data = structuredClone(SEEDS[seedIndex]) as Record<string, unknown>;
      for (const e of edits) {
        const all = paths(data).filter((p) => p.length > 0);
        if (all.length === 0) break;
        const p = all[e.pick % all.length]!;
        const parent = parentOf(data, p);
        if (!parent) continue;
        const k = p[p.length - 1]!;
        if (e.op === 'delete') {
          if (Array.isArray(parent)) parent.splice(k as number, 1);
          else delete parent[k];
        } else if (e.op === 'add' && !Array.isArray(parent)) parent.extra = structuredClone(e.value);
        else parent[k] = structuredClone(e.value);
      }
      agree(data);
    }), { seed: 20261201, numRuns: 3000 });
  });
});
