import { PlanError, pathToString, type Problem } from './problems.js';

/**
 * Strict JSON with positions, for plan files: the data from the engine's own `JSON.parse` (so only
 * strict JSON passes, and syntax errors carry V8's offset), then one pass over the text that rejects
 * duplicate keys (which `JSON.parse` silently resolves to the last one) and, only when a message
 * needs it, an index from field path to the offset of its value.
 *
 * Written here rather than taken from a library, for one measured reason: start-up. The YAML
 * package that read JSON plans before cost about 21 ms of a 150 ms runner start (import and compile,
 * bench/coldstart.mjs, bench/RESULTS.md "Runner cold start"); this module costs well under 1 ms. It
 * is also iterative, so a hostile file nested a million deep cannot overflow the stack.
 */

/** Deepest nesting of objects and lists read; a plan needs about six levels. Deeper text is refused
 * before anything recursive (validation, messages, cloning) can overflow the stack on it. */
export const MAX_JSON_DEPTH = 500;

/** Where field paths stand in a JSON text: path → offset of the value. */
type PathIndex = Map<string, number>;

const key = (path: readonly (string | number)[]) => JSON.stringify(path);

interface Frame {
  /** true for an object, false for an array. */
  obj: boolean;
  /** Current key (object) or index (array). */
  cur: string | number;
  /** Keys seen so far in this object. */
  keys: Set<string> | null;
  /** In an object: the next string is a key. */
  wantKey: boolean;
}

/**
 * One pass over JSON text already accepted by `JSON.parse`. Collects duplicate keys (offset of the
 * repeated key and its path) and, when `index` is given, the offset of every value by path.
 */
function scan(src: string, index: PathIndex | null): { at: number; path: (string | number)[] }[] | { tooDeepAt: number } {
  const dups: { at: number; path: (string | number)[] }[] = [];
  const stack: Frame[] = [];
  const pathNow = () => stack.map((f) => f.cur);
  const onValue = (at: number) => {
    if (index) index.set(key(pathNow()), at);
  };
  const n = src.length;
  let i = 0;
  while (i < n) {
    const c = src.charCodeAt(i);
    switch (c) {
      case 0x20: case 0x09: case 0x0a: case 0x0d: case 0x3a /* : */:
        i++;
        break;
      case 0x7b: /* { */
        onValue(i);
        if (stack.length >= MAX_JSON_DEPTH) return { tooDeepAt: i };
        stack.push({ obj: true, cur: '', keys: new Set(), wantKey: true });
        i++;
        break;
      case 0x5b: /* [ */
        onValue(i);
        if (stack.length >= MAX_JSON_DEPTH) return { tooDeepAt: i };
        stack.push({ obj: false, cur: 0, keys: null, wantKey: false });
        i++;
        break;
      case 0x7d: case 0x5d: /* } ] */
        stack.pop();
        i++;
        break;
      case 0x2c: { /* , */
        const top = stack[stack.length - 1]!;
        if (top.obj) top.wantKey = true;
        else (top.cur as number)++;
        i++;
        break;
      }
      case 0x22: { /* " */
        let j = i + 1;
        let escaped = false;
        for (;;) {
          const d = src.charCodeAt(j);
          if (d === 0x5c) { escaped = true; j += 2; continue; }
          if (d === 0x22) break;
          j++;
        }
        const top = stack[stack.length - 1];
        if (top?.obj && top.wantKey) {
          const k = escaped ? (JSON.parse(src.slice(i, j + 1)) as string) : src.slice(i + 1, j);
          top.wantKey = false;
          top.cur = k;
          if (top.keys!.has(k)) dups.push({ at: i, path: pathNow() });
          else top.keys!.add(k);
        } else onValue(i);
        i = j + 1;
        break;
      }
      default: { // number, true, false, null
        onValue(i);
        while (i < n) {
          const d = src.charCodeAt(i);
          if (d === 0x2c || d === 0x5d || d === 0x7d || d === 0x20 || d === 0x09 || d === 0x0a || d === 0x0d) break;
          i++;
        }
      }
    }
  }
  return dups;
}

/** 1-based line and column of an offset. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let last = -1;
  for (let i = text.indexOf('\n'); i !== -1 && i < offset; i = text.indexOf('\n', i + 1)) { line++; last = i; }
  return { line, column: offset - last };
}

/**
 * Parses strict JSON, rejecting duplicate keys, and returns the data with a locator that gives the
 * line and column of a field path's value (or of the deepest part of the path that exists).
 * `src` has no byte-order mark. Example: `parseJsonLocated('{"a":[1,2]}', 'p.json').locate(['a', 1])`
 * → `{ line: 1, column: 9 }`.
 * @throws PlanError: the syntax error at its line and column, nesting deeper than {@link MAX_JSON_DEPTH}, or every duplicate key.
 */
export function parseJsonLocated(src: string, file: string): { data: unknown; locate(path: readonly (string | number)[]): { line: number; column: number } | undefined } {
  let data: unknown;
  try {
    data = JSON.parse(src);
  } catch (e) {
    const msg = String((e as Error).message);
    const m = /position (\d+)/.exec(msg);
    const at = m ? lineColumn(src, Number(m[1])) : {};
    throw new PlanError([{ file, ...at, path: '', message: `JSON syntax: ${msg.split('\n')[0]!.replace(/ \(line \d+ column \d+\)$/, '')}` }]);
  }
  const dups = scan(src, null);
  if ('tooDeepAt' in dups) {
    throw new PlanError([{ file, ...lineColumn(src, dups.tooDeepAt), path: '', message: `nesting too deep to read; allowed at most ${MAX_JSON_DEPTH} levels of objects and lists (a plan needs about six)` }]);
  }
  if (dups.length > 0) {
    throw new PlanError(dups.slice(0, 20).map((d): Problem => ({
      file, ...lineColumn(src, d.at), path: pathToString(d.path),
      message: `duplicate key ${JSON.stringify(d.path[d.path.length - 1])}; allowed each key once in an object`,
    })));
  }
  let index: PathIndex | null = null;
  return {
    data,
    locate(path) {
      if (!index) { index = new Map(); scan(src, index); }
      for (let k = path.length; k >= 0; k--) {
        const at = index.get(key(path.slice(0, k)));
        if (at !== undefined) return lineColumn(src, at);
      }
      return undefined;
    },
  };
}
