/**
 * A small JSON Schema (draft 2020-12) checker for the keywords zod writes for the plan schema: type,
 * const, enum, number and length bounds, properties / required / additionalProperties /
 * propertyNames, items / prefixItems, anyOf / oneOf, default. Any other keyword or form is refused
 * with an error when the schema is checked (test/plan/check.test.ts runs that check), so a schema
 * change that needs more can never be half-understood.
 *
 * Why not Ajv here (Ajv is used in the tests as the reference): start-up. Ajv compiled at run time
 * costs tens of milliseconds; its standalone code for the plan schema is 160 kB whose first call
 * compiles for 8–10 ms, about an eighth of a 125 ms runner start. Walking the 9 kB schema costs well
 * under a millisecond (bench/coldstart.mjs; bench/RESULTS.md, "Runner cold start").
 */

/** One node of a JSON Schema. */
export type SchemaNode = { readonly [keyword: string]: unknown };

const KEYWORDS = new Set([
  'type', 'const', 'enum', 'minimum', 'maximum', 'exclusiveMinimum', 'exclusiveMaximum', 'minLength', 'maxLength',
  'properties', 'required', 'additionalProperties', 'propertyNames', 'items', 'prefixItems', 'minItems', 'maxItems',
  'anyOf', 'oneOf', 'default',
]);
const TYPES = new Set(['object', 'array', 'string', 'number', 'integer', 'boolean']);

/**
 * Throws unless every node of `schema` uses only the keywords and forms {@link conforms} understands,
 * and no `default` sits inside an `anyOf`/`oneOf` branch (defaults are filled along `properties` only).
 */
export function assertSupportedSchema(schema: SchemaNode, at = '#', inBranch = false): void {
  for (const [k, v] of Object.entries(schema)) {
    if (!KEYWORDS.has(k)) throw new Error(`${at}: JSON Schema keyword "${k}" is not supported by the plan check`);
    if (k === 'type' && !TYPES.has(v as string)) throw new Error(`${at}: type ${JSON.stringify(v)} is not supported by the plan check`);
    if (k === 'default' && inBranch) throw new Error(`${at}: a default inside anyOf/oneOf is not supported by the plan check`);
    if (k === 'const' && v !== null && typeof v === 'object') throw new Error(`${at}: only primitive const values are supported`);
  }
  const sub = (s: unknown, path: string, branch: boolean) => {
    if (s !== null && typeof s === 'object' && !Array.isArray(s)) assertSupportedSchema(s as SchemaNode, path, branch);
    else if (typeof s !== 'boolean') throw new Error(`${path}: a schema must be an object or a boolean`);
  };
  const props = schema.properties as Record<string, unknown> | undefined;
  if (props) for (const [name, s] of Object.entries(props)) sub(s, `${at}/properties/${name}`, inBranch);
  for (const k of ['additionalProperties', 'propertyNames', 'items'] as const) if (schema[k] !== undefined) sub(schema[k], `${at}/${k}`, inBranch);
  (schema.prefixItems as unknown[] | undefined)?.forEach((s, i) => sub(s, `${at}/prefixItems/${i}`, inBranch));
  for (const k of ['anyOf', 'oneOf'] as const) (schema[k] as unknown[] | undefined)?.forEach((s, i) => sub(s, `${at}/${k}/${i}`, true));
}

/** Length of a string in code points, as JSON Schema (and zod) count it. */
function codePoints(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff && i + 1 < s.length) {
      const d = s.charCodeAt(i + 1);
      if (d >= 0xdc00 && d <= 0xdfff) i++;
    }
    n++;
  }
  return n;
}

const hasOwn = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);
const num = (s: SchemaNode, k: string) => s[k] as number | undefined;

/**
 * Whether `x` is valid against `schema` (a schema accepted by {@link assertSupportedSchema}). Numbers
 * must be finite, as in zod. Missing properties with a `default` are valid (they are not `required`).
 * Example: `conforms({ type: 'number', exclusiveMinimum: 0 }, 0)` → false.
 */
export function conforms(schema: SchemaNode | boolean, x: unknown): boolean {
  if (typeof schema === 'boolean') return schema;
  const s = schema;
  if (s.anyOf !== undefined && !(s.anyOf as SchemaNode[]).some((b) => conforms(b, x))) return false;
  if (s.oneOf !== undefined) {
    let matched = 0;
    for (const b of s.oneOf as SchemaNode[]) if (conforms(b, x) && ++matched > 1) return false;
    if (matched !== 1) return false;
  }
  if (s.const !== undefined && x !== s.const) return false;
  if (s.enum !== undefined && !(s.enum as unknown[]).includes(x)) return false;
  switch (s.type) {
    case undefined:
      return true;
    case 'boolean':
      return typeof x === 'boolean';
    case 'string': {
      if (typeof x !== 'string') return false;
      const lo = num(s, 'minLength');
      const hi = num(s, 'maxLength');
      if (lo === undefined && hi === undefined) return true;
      const n = codePoints(x);
      return !(lo !== undefined && n < lo) && !(hi !== undefined && n > hi);
    }
    case 'number':
    case 'integer': {
      if (typeof x !== 'number' || !Number.isFinite(x)) return false;
      if (s.type === 'integer' && !Number.isInteger(x)) return false;
      const min = num(s, 'minimum');
      const max = num(s, 'maximum');
      const xmin = num(s, 'exclusiveMinimum');
      const xmax = num(s, 'exclusiveMaximum');
      return !(min !== undefined && x < min) && !(max !== undefined && x > max)
        && !(xmin !== undefined && x <= xmin) && !(xmax !== undefined && x >= xmax);
    }
    case 'array': {
      if (!Array.isArray(x)) return false;
      const lo = num(s, 'minItems');
      const hi = num(s, 'maxItems');
      if ((lo !== undefined && x.length < lo) || (hi !== undefined && x.length > hi)) return false;
      const prefix = (s.prefixItems as (SchemaNode | boolean)[] | undefined) ?? [];
      for (let i = 0; i < x.length; i++) {
        const item = i < prefix.length ? prefix[i]! : (s.items as SchemaNode | boolean | undefined);
        if (item !== undefined && !conforms(item, x[i])) return false;
      }
      return true;
    }
    case 'object': {
      if (x === null || typeof x !== 'object' || Array.isArray(x)) return false;
      const o = x as Record<string, unknown>;
      for (const k of (s.required as string[] | undefined) ?? []) if (!hasOwn(o, k)) return false;
      const props = s.properties as Record<string, SchemaNode | boolean> | undefined;
      const extra = s.additionalProperties as SchemaNode | boolean | undefined;
      const names = s.propertyNames as SchemaNode | boolean | undefined;
      for (const k of Object.keys(o)) {
        if (names !== undefined && !conforms(names, k)) return false;
        if (props && hasOwn(props, k)) { if (!conforms(props[k]!, o[k])) return false; }
        else if (extra !== undefined && !conforms(extra, o[k])) return false;
      }
      return true;
    }
    default:
      throw new Error(`JSON Schema type ${JSON.stringify(s.type)} is not supported by the plan check`);
  }
}

/**
 * Fills `default`s along `properties` (and into items and additional properties) of data already
 * valid against `schema`, in place, as zod's `.default()` does: a missing property gets a copy of
 * its default. Example: `fillDefaults({ type: 'object', properties: { u: { default: 'SI' } } }, {})` → `{ u: 'SI' }`.
 */
export function fillDefaults<T>(schema: SchemaNode | boolean, x: T): T {
  if (typeof schema === 'boolean' || x === null || typeof x !== 'object') return x;
  if (Array.isArray(x)) {
    const prefix = (schema.prefixItems as SchemaNode[] | undefined) ?? [];
    x.forEach((v, i) => fillDefaults(i < prefix.length ? prefix[i]! : ((schema.items as SchemaNode | undefined) ?? true), v));
    return x;
  }
  const o = x as Record<string, unknown>;
  const props = schema.properties as Record<string, SchemaNode> | undefined;
  for (const k of Object.keys(o)) {
    const sub = props && hasOwn(props, k) ? props[k] : (schema.additionalProperties as SchemaNode | undefined);
    if (sub !== undefined) fillDefaults(sub, o[k]);
  }
  // A default is taken as it is, not filled in turn (zod returns a default without parsing it).
  if (props) for (const [k, p] of Object.entries(props)) if (!hasOwn(o, k) && p.default !== undefined) o[k] = structuredClone(p.default);
  return x;
}
