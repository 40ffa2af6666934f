import { lineColumn, parseJsonLocated } from './json.js';
import { PlanError } from './problems.js';

/** Largest plan file read, in bytes (plans are small; this bounds memory on hostile input). */
export const MAX_PLAN_BYTES = 5 * 1024 * 1024;

/** A parsed document that can say where a field path stands in the text. */
export interface Located {
  data: unknown;
  locate(path: readonly (string | number)[]): { line: number; column: number } | undefined;
}

/** Format from the file name: `.yaml`/`.yml` → YAML, else JSON. */
export function formatOf(file: string): 'json' | 'yaml' {
  return /\.ya?ml$/i.test(file) ? 'yaml' : 'json';
}

/** Reads YAML text with positions: `parseYamlLocated` of src/plan/yaml.ts, passed in so that JSON plans never load the YAML package. */
export type YamlReader = (src: string, file: string) => Located;

/**
 * Parses JSON or YAML text keeping positions. JSON is strict (the engine's `JSON.parse`) with duplicate
 * keys rejected (src/plan/json.ts); YAML 1.2 is read by `yaml` (the `parseYamlLocated` of
 * src/plan/yaml.ts, which the runner imports only for a YAML file).
 * @throws PlanError with line and column for syntax errors and duplicate keys.
 */
export function parseLocated(text: string, file: string, format: 'json' | 'yaml', yaml?: YamlReader): Located {
  if (text.length > MAX_PLAN_BYTES) throw new PlanError([{ file, path: '', message: `file is ${text.length} bytes; allowed at most ${MAX_PLAN_BYTES} bytes for a plan` }]);
  if (text.includes('\uFFFD')) {
    const lc = lineColumn(text, text.indexOf('\uFFFD'));
    throw new PlanError([{ file, ...lc, path: '', message: 'invalid UTF-8 byte sequence; allowed UTF-8 text' }]);
  }
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (format === 'json') return parseJsonLocated(src, file);
  if (!yaml) throw new Error('parseLocated: YAML text needs the YAML reader (parseYamlLocated of src/plan/yaml.ts)');
  return yaml(src, file);
}
