import { checkRange, InputError } from '../errors.js';
import { biaxialStrain, drawingStrain, PLANE_STRAIN_FACTOR, rollingStrain, shearStrain, trueFromEngineering, upsetStrain } from './strain.js';
import { springback, type SpringbackResult } from '../bend/springback.js';
import type { Material, Size, Step, StepKind, StockKind } from './types.js';

/** Everything a step kind needs to know about the state it acts on. */
export interface StepContext {
  stock: StockKind;
  size: Size;
  /** Field path of the step, e.g. `steps[3]`, for error messages. */
  path: string;
  /** Formats a length in mm in the plan's own unit, for error messages. */
  length: (mm: number) => string;
  /** The material state before the step; needed by steps whose effect depends on it (bend). */
  state?: { material: Material; strain: number; backstresses: readonly number[] };
}

/** What a step does: an equivalent-strain increment and the new size; an anneal instead softens. */
export interface StepEffect {
  strainIncrement: number;
  size: Size;
  /** Set for an anneal: the fraction of the work hardening removed (1 = full anneal). */
  softeningFraction?: number;
  /** Direction of the plastic strain along the forming axis: +1 (default) forward, −1 reversed (reverse step, reverse bend). */
  direction?: 1 | -1;
  /** Set for a bend: the bend and its springback. */
  bend?: SpringbackResult;
}

/** How percent reduction relates to the equivalent strain of a step kind (for the cold-work window). */
export type ReductionBasis = 'thickness' | 'area' | 'height' | null;

/** One step kind: how it changes the state. Adding a kind = adding an entry here (see DEVELOPERS.md). */
export interface StepKindDef {
  kind: StepKind;
  /** Basis of the percent reduction this kind is specified in, for the cold-work window. */
  reductionBasis: ReductionBasis;
  apply(step: Step, ctx: StepContext): StepEffect;
}

/** Largest true (equivalent) strain a single step may give; beyond it input is rejected. */
export const MAX_STEP_STRAIN = 5;

/**
 * Percent reduction that a given equivalent strain means for a reduction basis:
 * thickness (plane-strain rolling) 100·(1 − exp(−(√3/2)·ε̄)); area or height 100·(1 − exp(−ε̄)).
 * @example reductionPctFromStrain('area', 0.4398) // 35.58
 */
export function reductionPctFromStrain(basis: Exclude<ReductionBasis, null>, eps: number): number {
  const e = basis === 'thickness' ? eps / PLANE_STRAIN_FACTOR : eps;
  return -Math.expm1(-e) * 100;
}

function oneOf(step: Record<string, unknown>, path: string, a: string, b: string): 'a' | 'b' {
  const hasA = step[a] !== undefined;
  const hasB = step[b] !== undefined;
  if (hasA === hasB) throw new InputError(path, hasA ? `${a} and ${b}` : 'neither', `exactly one of ${a} or ${b}`);
  return hasA ? 'a' : 'b';
}

function pct(path: string, v: unknown): number {
  return checkRange(path, v, 0, 100, { hiOpen: true }) / 100;
}

function scaled(size: Size, f: { thickness?: number; width?: number; diameter?: number; height?: number }): Size {
  const out: Size = {};
  if (size.thickness !== undefined) out.thickness = size.thickness * (f.thickness ?? 1);
  if (size.width !== undefined) out.width = size.width * (f.width ?? 1);
  if (size.diameter !== undefined) out.diameter = size.diameter * (f.diameter ?? 1);
  if (size.height !== undefined) out.height = size.height * (f.height ?? 1);
  return out;
}

function smallerSize(path: string, v: unknown, current: number, ctx: StepContext, what: string): number {
  if (typeof v === 'number' && v > 0 && v <= current * (1 + 1e-12)) return Math.min(v, current);
  const allowed = `a ${what} above 0 and at most the current ${what} ${ctx.length(current)}`;
  const enlarges = typeof v === 'number' && Number.isFinite(v) && v > current;
  throw new InputError(path, v, allowed, enlarges ? `a step cannot enlarge the ${what}` : undefined);
}

const roll: StepKindDef = {
  kind: 'roll',
  reductionBasis: 'thickness',
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'roll' }>;
    if (ctx.stock === 'wire') throw new InputError(`${ctx.path}.kind`, 'roll', 'a step for wire or bar stock (draw, stretch, upset, shear, strain, anneal)', 'rolling needs strip (start.thickness)');
    const which = oneOf(s, ctx.path, 'thickness', 'reductionPct');
    const t0 = ctx.size.thickness;
    if (which === 'a') {
      if (t0 === undefined) throw new InputError(`${ctx.path}.thickness`, s.thickness, 'reductionPct for stock without a starting thickness', 'the stock has no thickness');
      const t = smallerSize(`${ctx.path}.thickness`, s.thickness, t0, ctx, 'thickness');
      return { strainIncrement: rollingStrain(t0, t), size: { ...ctx.size, thickness: t } };
    }
    const r = pct(`${ctx.path}.reductionPct`, s.reductionPct);
    return { strainIncrement: PLANE_STRAIN_FACTOR * -Math.log1p(-r), size: scaled(ctx.size, { thickness: 1 - r }) };
  },
};

const draw: StepKindDef = {
  kind: 'draw',
  reductionBasis: 'area',
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'draw' }>;
    if (ctx.stock === 'strip') throw new InputError(`${ctx.path}.kind`, 'draw', 'a step for strip stock (roll, stretch, stretchBiaxial, upset, shear, strain, anneal)', 'drawing needs wire or bar (start.diameter)');
    const which = oneOf(s, ctx.path, 'diameter', 'areaReductionPct');
    const d0 = ctx.size.diameter;
    if (which === 'a') {
      if (d0 === undefined) throw new InputError(`${ctx.path}.diameter`, s.diameter, 'areaReductionPct for stock without a starting diameter', 'the stock has no diameter');
      const d = smallerSize(`${ctx.path}.diameter`, s.diameter, d0, ctx, 'diameter');
      return { strainIncrement: drawingStrain(d0, d), size: { ...ctx.size, diameter: d } };
    }
    const r = pct(`${ctx.path}.areaReductionPct`, s.areaReductionPct);
    return { strainIncrement: -Math.log1p(-r), size: scaled(ctx.size, { diameter: Math.sqrt(1 - r), height: 1 / (1 - r) }) };
  },
};

const stretch: StepKindDef = {
  kind: 'stretch',
  reductionBasis: null,
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'stretch' }>;
    const which = oneOf(s, ctx.path, 'strain', 'engineeringStrain');
    const eps = which === 'a'
      ? checkRange(`${ctx.path}.strain`, s.strain, 0, MAX_STEP_STRAIN)
      : trueFromEngineering(checkRange(`${ctx.path}.engineeringStrain`, s.engineeringStrain, 0, Math.expm1(MAX_STEP_STRAIN)));
    const lateral = Math.exp(-eps / 2);
    return { strainIncrement: eps, size: scaled(ctx.size, { thickness: lateral, width: lateral, diameter: lateral, height: Math.exp(eps) }) };
  },
};

const stretchBiaxial: StepKindDef = {
  kind: 'stretchBiaxial',
  reductionBasis: null,
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'stretchBiaxial' }>;
    if (ctx.stock === 'wire') throw new InputError(`${ctx.path}.kind`, 'stretchBiaxial', 'a step for wire or bar stock', 'equibiaxial stretching needs sheet or strip');
    const e1 = checkRange(`${ctx.path}.strain`, s.strain, 0, MAX_STEP_STRAIN / 2);
    return { strainIncrement: biaxialStrain(e1), size: scaled(ctx.size, { thickness: Math.exp(-2 * e1), width: Math.exp(e1) }) };
  },
};

const upset: StepKindDef = {
  kind: 'upset',
  reductionBasis: 'height',
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'upset' }>;
    const which = oneOf(s, ctx.path, 'height', 'reductionPct');
    // The height is the stock's own height where given, else a strip's thickness.
    const onThickness = ctx.size.height === undefined && ctx.size.thickness !== undefined;
    const h0 = ctx.size.height ?? ctx.size.thickness;
    let ratio: number;
    if (which === 'a') {
      if (h0 === undefined) throw new InputError(`${ctx.path}.height`, s.height, 'reductionPct, or a start.height to upset from', 'the stock has no height');
      const h = smallerSize(`${ctx.path}.height`, s.height, h0, ctx, 'height');
      ratio = h / h0;
    } else {
      ratio = 1 - pct(`${ctx.path}.reductionPct`, s.reductionPct);
    }
    const eps = upsetStrain(1, ratio);
    if (eps > MAX_STEP_STRAIN) throw new InputError(`${ctx.path}`, ratio, `an upset to at least exp(−${MAX_STEP_STRAIN}) of the height`);
    const lateral = 1 / Math.sqrt(ratio);
    const size = onThickness
      ? scaled(ctx.size, { thickness: ratio, width: lateral })
      : scaled(ctx.size, { height: ratio, diameter: lateral, width: lateral, thickness: lateral });
    return { strainIncrement: eps, size };
  },
};

const shear: StepKindDef = {
  kind: 'shear',
  reductionBasis: null,
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'shear' }>;
    const g = checkRange(`${ctx.path}.shearStrain`, s.shearStrain, 0, MAX_STEP_STRAIN * Math.sqrt(3));
    return { strainIncrement: shearStrain(g), size: { ...ctx.size } };
  },
};

const strain: StepKindDef = {
  kind: 'strain',
  reductionBasis: null,
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'strain' }>;
    return { strainIncrement: checkRange(`${ctx.path}.strain`, s.strain, 0, MAX_STEP_STRAIN), size: { ...ctx.size } };
  },
};

const anneal: StepKindDef = {
  kind: 'anneal',
  reductionBasis: null,
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'anneal' }>;
    const f = s.softeningFraction === undefined ? 1 : checkRange(`${ctx.path}.softeningFraction`, s.softeningFraction, 0, 1, { loOpen: true });
    return { strainIncrement: 0, size: { ...ctx.size }, softeningFraction: f };
  },
};

const reverse: StepKindDef = {
  kind: 'reverse',
  reductionBasis: null,
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'reverse' }>;
    // Reversed uniaxial strain: compression along the forming axis; the cross-section grows.
    const eps = checkRange(`${ctx.path}.strain`, s.strain, 0, 1);
    const lateral = Math.exp(eps / 2);
    return { strainIncrement: eps, direction: -1, size: scaled(ctx.size, { thickness: lateral, width: lateral, diameter: lateral, height: Math.exp(-eps) }) };
  },
};

const bend: StepKindDef = {
  kind: 'bend',
  reductionBasis: null,
  apply(step, ctx) {
    const s = step as Extract<Step, { kind: 'bend' }>;
    if (ctx.stock !== 'strip' || ctx.size.thickness === undefined) {
      throw new InputError(`${ctx.path}.kind`, 'bend', 'a step for this stock (bend needs strip: start.thickness)', 'bending is modelled for strip and sheet only');
    }
    if (!ctx.state) throw new InputError(`${ctx.path}.kind`, 'bend', 'a bend evaluated inside a route (evaluateRoute passes the material state)');
    const st = ctx.state;
    const m = st.material;
    const r = springback({
      elasticModulus: m.elasticModulus, poissonRatio: m.poissonRatio, law: m.law, thickness: ctx.size.thickness,
      prestrain: st.strain, backstresses: st.backstresses, reverse: s.reverse === true,
      ...(m.kinematic ? { kinematic: m.kinematic } : {}), ...(m.modulusDecay ? { modulusDecay: m.modulusDecay } : {}),
    }, { radius: s.radius, angleDeg: s.angle }, ctx.path);
    // The ledger follows the outer (most strained) fibre: its equivalent plastic strain is the step's increment.
    return { strainIncrement: r.outerFibrePlasticStrain, direction: s.reverse === true ? -1 : 1, size: { ...ctx.size }, bend: r };
  },
};

/** Every step kind by name. */
export const STEP_KINDS: Readonly<Record<StepKind, StepKindDef>> = { roll, draw, stretch, stretchBiaxial, upset, shear, strain, anneal, reverse, bend };

export const STEP_KIND_NAMES = Object.keys(STEP_KINDS) as StepKind[];

/** Stock kind from the starting size: diameter → wire, thickness → strip, else a specimen. */
export function stockOf(size: Size): StockKind {
  if (size.diameter !== undefined && size.thickness !== undefined) throw new InputError('start', 'diameter and thickness', 'either a thickness (strip) or a diameter (wire, bar), not both');
  return size.diameter !== undefined ? 'wire' : size.thickness !== undefined ? 'strip' : 'specimen';
}
