import { Runtime } from '@observablehq/runtime';
import { byId } from './dom.js';
import { cellObserver, type Render } from './observer.js';

/** Microtask turns without activity after which {@link Notebook.idle} calls the notebook settled. */
const QUIET_TICKS = 64;

const hidden = (): null => null;

/** A cell: a name, the names of the cells it reads, and a function of their values. */
export interface CellSpec {
  name: string;
  inputs?: readonly string[];
  /** Value, promise or (async) generator, as @observablehq/runtime allows. */
  fn: (...args: any[]) => unknown;
  /** Element (or its id) that shows the value; omit for a hidden cell. */
  into?: HTMLElement | string;
  render?: Render;
}

interface RuntimeVariable {
  define(name: string, inputs: readonly string[], fn: (...a: any[]) => unknown): RuntimeVariable;
}
interface RuntimeModule {
  variable(observer?: unknown): RuntimeVariable;
  redefine(name: string, inputs: readonly string[], fn: (...a: any[]) => unknown): RuntimeVariable;
  value(name: string): Promise<unknown>;
}
interface RuntimeLike {
  module(): RuntimeModule;
  _computing: Promise<void> | null;
  _computeSoon: () => Promise<void>;
  _computeNow: () => Promise<void>;
  dispose(): void;
}

/**
 * A notebook: one @observablehq/runtime module whose cells are shown in page elements. Adds what
 * runtime v6 leaves out: observers (see {@link cellObserver}), a way to set a cell from the page
 * (`set`), and `idle()`, which resolves when every cell has settled (tests and the latency
 * benchmark wait on it).
 *
 * Runtime v6 waits one animation frame before recomputing after a change; here recomputation
 * starts in a microtask instead, so a slider move is computed and painted in the same frame
 * (measured in bench/notebook-latency.mjs).
 */
export class Notebook {
  readonly runtime: RuntimeLike;
  readonly module: RuntimeModule;
  private readonly pending = new Set<string>();
  private readonly variables = new Map<string, RuntimeVariable>();
  private waiters: (() => void)[] = [];
  private readonly tracked = new Set<Promise<unknown>>();
  /** Number of cells currently showing an error. */
  readonly errors = new Set<string>();
  /**
   * Milliseconds spent in each cell's function (synchronous part), summed since profiling was
   * switched on; `null` (the default) records nothing. The latency bench reads it to split a
   * slider's latency into computation and DOM work.
   */
  profile: Map<string, number> | null = null;

  constructor() {
    this.runtime = new (Runtime as unknown as new () => RuntimeLike)();
    const rt = this.runtime;
    rt._computeSoon = function (this: RuntimeLike) {
      return Promise.resolve().then(() => this._computeNow());
    };
    this.module = rt.module();
  }

  /** Defines a cell (shown in `into` when given). */
  cell(spec: CellSpec): this {
    const el = typeof spec.into === 'string' ? byId(spec.into) : spec.into;
    const name = spec.name;
    // A hidden cell (no `into`) is never rendered: the default render would JSON.stringify its value
    // into a detached element on every change (for a path of thousands of points or a scatter
    // summary, milliseconds per slider move: bench/notebook-profile.mjs).
    const observer = cellObserver(el ?? document.createElement('div'), el ? spec.render : hidden, {
      onPending: () => this.pending.add(name),
      onSettled: (ok) => {
        this.pending.delete(name);
        if (ok) this.errors.delete(name);
        else this.errors.add(name);
        this.wake();
      },
    });
    const fn = spec.fn;
    const timed = (...args: unknown[]) => {
      const p = this.profile;
      if (!p) return fn(...args);
      const t0 = performance.now();
      try {
        return fn(...args);
      } finally {
        p.set(name, (p.get(name) ?? 0) + performance.now() - t0);
      }
    };
    const v = this.module.variable(observer).define(name, spec.inputs ?? [], timed);
    this.variables.set(name, v);
    return this;
  }

  /** Sets a cell to a constant value (an edit from the page); dependants recompute. */
  set(name: string, value: unknown): void {
    const v = this.variables.get(name);
    if (!v) throw new Error(`no cell named "${name}"`);
    v.define(name, [], () => value);
  }

  /** The current value of a cell. */
  value(name: string): Promise<unknown> {
    return this.module.value(name);
  }

  private wake(): void {
    const w = this.waiters;
    this.waiters = [];
    for (const f of w) f();
  }

  /**
   * Work a cell goes on with after it has shown a first value (a generator cell that shows a quick
   * answer and then refines it): {@link idle} waits for it too, so tests see the refined answer.
   * Returns the promise it was given.
   */
  track<T>(work: Promise<T>): Promise<T> {
    this.tracked.add(work);
    const done = () => { this.tracked.delete(work); this.wake(); };
    work.then(done, done);
    return work;
  }

  /** Resolves when no computation is scheduled, no shown cell is pending and no tracked work is left. */
  async idle(): Promise<void> {
    // A change reaches the runtime through a chain of promises (input event → generator → runtime
    // schedule → compute → observers); it is quiet once no computation is scheduled and no cell is
    // pending for QUIET_TICKS consecutive microtask turns (cheap: no timers, no frames).
    let quiet = 0;
    while (quiet < QUIET_TICKS) {
      if (this.runtime._computing) {
        quiet = 0;
        await this.runtime._computing;
      } else if (this.pending.size > 0) {
        quiet = 0;
        await new Promise<void>((r) => this.waiters.push(r));
      } else if (this.tracked.size > 0) {
        quiet = 0;
        await Promise.allSettled([...this.tracked]);
      } else {
        quiet++;
        await Promise.resolve();
      }
    }
  }
}

/** Notebooks register here so tests and benchmarks can wait for them (`window.strainledger`). */
export function expose(name: string, nb: Notebook): void {
  const w = window as unknown as { strainledger?: Record<string, Notebook> };
  (w.strainledger ??= {})[name] = nb;
}
