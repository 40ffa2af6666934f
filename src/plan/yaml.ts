import { isMap, isSeq, LineCounter, parseDocument, type Document } from 'yaml';
import type { Located } from './parse.js';
import { PlanError } from './problems.js';

/**
 * YAML 1.2 plans with positions, read by the `yaml` package with duplicate keys rejected and alias
 * expansion bounded. Passed to `parseLocated` for YAML text; a module of its own so that JSON plans
 * (the runner's usual case) never load the YAML package.
 * @throws PlanError with line and column for syntax errors and duplicate keys.
 */
export function parseYamlLocated(src: string, file: string): Located {
  const lineCounter = new LineCounter();
  const doc: Document = parseDocument(src, { lineCounter, uniqueKeys: true, prettyErrors: false, strict: true });
  if (doc.errors.length > 0) {
    throw new PlanError(doc.errors.slice(0, 20).map((e) => {
      const lp = lineCounter.linePos(e.pos[0]);
      return { file, line: lp.line, column: lp.col, path: '', message: `YAML syntax: ${e.message.split('\n')[0]}` };
    }));
  }
  const data = doc.toJS({ maxAliasCount: 100 });
  return {
    data,
    locate(path) {
      let node: unknown = doc.contents;
      let best: unknown = node;
      for (const key of path) {
        if (isMap(node)) {
          const pair = node.items.find((it) => (it.key as { value?: unknown } | null)?.value === key);
          if (!pair) break;
          best = pair.key ?? best;
          node = pair.value;
          if (node) best = node;
        } else if (isSeq(node) && typeof key === 'number') {
          node = node.items[key];
          if (!node) break;
          best = node;
        } else break;
      }
      const range = (best as { range?: [number, number, number] } | null)?.range;
      if (!range) return undefined;
      const lp = lineCounter.linePos(range[0]);
      return { line: lp.line, column: lp.col };
    },
  };
}
