/**
 * Keeping the user's work: autosave to the browser's localStorage (versioned key, validated on
 * restore so a damaged entry never breaks the page) and a bounded undo history.
 */

export interface Stored<T> {
  /** The restored value, or null when nothing valid was stored. */
  value: T | null;
  /** Why a stored value was not used (damaged or failed validation), for a notice in the page. */
  problem?: string;
}

const PREFIX = 'strainledger:v1:';

/** The storage the kit uses; null where localStorage is unavailable (private mode, tests in Node). */
function storage(): Storage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    return null;
  }
}

/**
 * Saves `value` as JSON under `key`. Returns false (and keeps the page working) when the browser
 * refuses, e.g. storage full; the caller shows that autosave is off.
 */
export function autosave(key: string, value: unknown): boolean {
  const s = storage();
  if (!s) return false;
  try {
    s.setItem(PREFIX + key, JSON.stringify(value));
    return true;
  } catch {
    return false;
  }
}

/** Restores what {@link autosave} stored, checked by `validate` (which throws on bad data). */
export function restore<T>(key: string, validate: (raw: unknown) => T): Stored<T> {
  const s = storage();
  const text = s?.getItem(PREFIX + key);
  if (text === null || text === undefined) return { value: null };
  try {
    return { value: validate(JSON.parse(text)) };
  } catch (e) {
    let kept = false;
    try {
      s!.setItem(PREFIX + key + '.damaged', text);
      kept = true;
    } catch { /* keep going: the page must not break */ }
    const why = e instanceof Error ? e.message.split('\n')[0] : 'unreadable';
    return { value: null, problem: `the saved copy could not be restored (${why})${kept ? `; it was kept under "${PREFIX}${key}.damaged"` : ''}` };
  }
}

/** Removes a saved entry. */
export function forget(key: string): void {
  storage()?.removeItem(PREFIX + key);
}

/**
 * Undo history of whole states (plans are small, so snapshots are simpler and safer than diffs).
 * `push` the state before an edit; `undo` returns it. Bounded to `limit` entries.
 */
export class UndoHistory<T> {
  private readonly past: string[] = [];
  constructor(private readonly limit = 100) {}
  push(state: T): void {
    this.past.push(JSON.stringify(state));
    if (this.past.length > this.limit) this.past.shift();
  }
  get canUndo(): boolean {
    return this.past.length > 0;
  }
  undo(): T | null {
    const s = this.past.pop();
    return s === undefined ? null : (JSON.parse(s) as T);
  }
}
