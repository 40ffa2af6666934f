import { Runtime } from '@observablehq/runtime';
import { byId } from './dom.js';
import { cellObserver, type Render } from './observer.js';

/** Microtask turns without activity after which {@link Notebook.idle} calls the notebook settled. */
const QUIET_TICKS = 64;

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
  /** Number of cells currently showing an error. */
  readonly errors = new Set<string>();

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
    // A hidden cell renders nothing: serialising its value (a record of 100,000 points, say) into a
    // detached element took a second of the page thread per change (measured, issue 12).
    const observer = cellObserver(el ?? document.createElement('div'), spec.render ?? (el ? undefined : () => null), {
      onPending: () => this.pending.add(name),
      onSettled: (ok) => {
        this.pending.delete(name);
        if (ok) this.errors.delete(name);
        else this.errors.add(name);
        this.wake();
      },
    });
    const v = this.module.variable(observer).define(name, spec.inputs ?? [], spec.fn);
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

  /** Resolves when no computation is scheduled and no shown cell is pending. */
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
