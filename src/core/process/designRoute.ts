import { checkRange, InputError } from '../errors.js';
import { evaluateRoute } from '../route/ledger.js';
import { PLANE_STRAIN_FACTOR } from '../route/strain.js';
import type { ColdWorkWindow, Ledger, Material, Size, Step, Targets } from '../route/types.js';
import { coldWorkWindow } from '../route/window.js';
import { inGrainGrowthRange, validateGrainGrowthStrain } from '../route/grainGrowth.js';
import { temperStrainBand } from '../temper/scale.js';
import { materialTemperScale } from '../temper/materialScale.js';
import { PROCESS_DEFAULTS } from './defaults.js';

/**
 * What a route must do, in core units (mm, MPa, N). The starting stock is annealed (ledger strain 0)
 * and every anneal is a full anneal back to that state.
 */
export interface DesignSpec {
  material: Material;
  /** `draw`: wire or bar, sizes are diameters; `roll`: strip, sizes are thicknesses. */
  process: 'draw' | 'roll';
  startSize: number;
  finalSize: number;
  /** Strip width for the roll force, mm (roll only). */
  width?: number;
  /** Largest reduction of one pass, percent: area for drawing, thickness for rolling. */
  maxPassReductionPct: number;
  /**
   * Largest equivalent strain between anneals, given directly, or from the ductility of the
   * material with a margin: `ductilityStrain·(1 − ductilityMargin)`. When both are given the smaller wins.
   */
  maxStrainBeforeAnneal?: number;
  ductilityStrain?: number;
  /** Fraction of the ductility kept in reserve, [0, 1); default 0.2 (common practice, no source). */
  ductilityMargin?: number;
  /** Final property window (the targets of the designed plan). */
  window: Targets;
  /** Die half-angle (degrees) and friction of every drawing pass. */
  dieHalfAngleDeg?: number;
  /** Roll radius of every rolling pass, mm. */
  rollRadius?: number;
  friction?: number;
  /** Drawing-block or mill force capacity, N. */
  forceCapacity?: number;
  /** Largest drawing stress over exit flow stress; default {@link PROCESS_DEFAULTS}.maxDrawabilityRatio. */
  maxDrawabilityRatio?: number;
  /** Largest adiabatic temperature rise of a pass, K (needs material density and specific heat); default {@link PROCESS_DEFAULTS}.maxTemperatureRise. */
  maxTemperatureRise?: number;
  /** Most anneals to consider; default 8. */
  maxAnneals?: number;
  /** Most passes in a route; default 60. */
  maxPasses?: number;
  /** Sizes are rounded to this step, mm (0: not rounded); default 0. */
  sizeResolution?: number;
  /** How many ranked routes to return; default 5. */
  maxRoutes?: number;
  /** Formats a length in mm (and a force in N) in the user's units for the explanations; default mm and N. */
  length?: (mm: number) => string;
  force?: (n: number) => string;
}

/** One anneal of a designed route and why it stands where it does. */
export interface AnnealNote {
  /** The anneal follows this pass (1-based pass count). */
  afterPass: number;
  /** Size at the anneal, mm. */
  size: number;
  /** Equivalent strain since the previous anneal (or the start) when the anneal is made. */
  strainBefore: number;
  reason: string;
}

/** A designed route: steps the runner can run, with its margins and explanations. */
export interface DesignedRoute {
  rank: number;
  steps: Step[];
  passes: number;
  anneals: number;
  annealNotes: AnnealNote[];
  /** Strain and percent reduction after the last anneal (the final temper reduction). */
  finalStrain: number;
  finalReductionPct: number;
  /** Smallest relative margin to the property window (target margin / target limit). */
  windowMargin: number;
  /** Smallest margin of any pass to its limits: 1 − the largest use of a limit (reduction, drawability, force, heating). */
  passMargin: number;
  /** 1 − the largest strain between anneals / the allowed strain. */
  annealMargin: number;
  /** Which pass limit is used most: `reduction`, `drawability`, `force`, `heating` or `bite` (rolling: draft ≤ μ²·R). */
  governingPassLimit: string;
  ledger: Ledger;
}

export interface DesignResult {
  feasible: boolean;
  routes: DesignedRoute[];
  /** Candidate schedules built and run through the ledger. */
  candidatesTried: number;
  /** Ledger evaluations made (candidate routes and the pass-count search of their segments). */
  ledgerRuns: number;
  totalStrain: number;
  maxStrainBeforeAnneal: number;
  /** Largest equivalent strain of one pass from the reduction limit. */
  passStrainLimit: number;
  window: ColdWorkWindow;
  /** When infeasible: the limit that binds and why, in words. */
  binding?: { limit: string; explanation: string };
}

const DEFAULT_MAX_ANNEALS = 8;
const DEFAULT_MAX_PASSES = 60;
const DEFAULT_DUCTILITY_MARGIN = 0.2;
/** Final-temper strains are chosen this far inside the window (fraction of its width), so rounding of sizes cannot leave it. */
const WINDOW_INSET = 0.05;
/** Number of final-temper strains tried across the window. */
const WINDOW_SAMPLES = 7;

const fmt = (x: number, d = 4) => String(+x.toPrecision(d));

/**
 * Designs cold-forming routes from a start size to a final size that land in a property window:
 * the passes and their sizes, where to anneal, and the final reduction after the last anneal.
 *
 * Method (our own, built on the ledger): every target is monotone in the strain since the last full
 * anneal, so the window is a strain interval [s_lo, s_hi] ({@link coldWorkWindow}). The final temper
 * strain s_f is tried at {@link WINDOW_SAMPLES} points inside [s_lo, min(s_hi, S_max, E)] (E the total
 * strain from start to final size, S_max the strain allowed between anneals); when E itself lies in the
 * window and below S_max the route needs no anneal. The strain E − s_f before the last anneal is split
 * into k equal segments (k = ⌈(E − s_f)/S_max⌉ and k + 1), each ending in an anneal; each segment is
 * split into p equal passes, p from ⌈S/s_pass⌉ upward until every pass meets its limits (reduction per
 * pass, drawability ratio, force capacity, temperature rise; for rolling the bite limit draft ≤ μ²·R),
 * evaluated by the ledger itself. Every
 * candidate is run through {@link evaluateRoute} and kept only if it meets the window and every
 * limit. Ranking: fewest anneals, then fewest passes, then the largest smallest margin.
 * Strains: drawing ε̄ = 2·ln(d0/d); rolling ε̄ = (2/√3)·ln(t0/t) (core/route/strain.ts).
 * Units: mm, MPa, N. Valid range: 0 < final < start; 0 < maxPassReductionPct < 100.
 * @throws InputError naming the spec field for an invalid specification (an infeasible one is not an
 * error: it returns `feasible: false` with the binding limit explained).
 * @example designRoute({ material, process: 'draw', startSize: 5.5, finalSize: 2.5, maxPassReductionPct: 30, maxStrainBeforeAnneal: 1.5, window: { minYield: 500, maxYield: 620 }, dieHalfAngleDeg: 6, friction: 0.05 }).routes[0].anneals // 1
 */
export function designRoute(spec: DesignSpec): DesignResult {
  const draw = spec.process === 'draw';
  if (spec.process !== 'draw' && spec.process !== 'roll') throw new InputError('process', spec.process, 'one of "draw", "roll"');
  const sizeName = draw ? 'diameter' : 'thickness';
  const d0 = checkRange(`start.${sizeName}`, spec.startSize, 0, Infinity, { loOpen: true });
  const df = checkRange(`final.${sizeName}`, spec.finalSize, 0, d0, { loOpen: true, hiOpen: true });
  const rPass = checkRange('limits.maxPassReductionPct', spec.maxPassReductionPct, 0, 100, { loOpen: true, hiOpen: true }) / 100;
  const margin = checkRange('limits.ductilityMargin', spec.ductilityMargin ?? DEFAULT_DUCTILITY_MARGIN, 0, 1, { hiOpen: true });
  let sMax = Infinity;
  let sMaxWhy = '';
  if (spec.maxStrainBeforeAnneal !== undefined) {
    sMax = checkRange('limits.maxStrainBeforeAnneal', spec.maxStrainBeforeAnneal, 0, 10, { loOpen: true });
    sMaxWhy = `the stated limit ${fmt(sMax)}`;
  }
  if (spec.ductilityStrain !== undefined) {
    const fromDuct = checkRange('limits.ductilityStrain', spec.ductilityStrain, 0, 10, { loOpen: true }) * (1 - margin);
    if (fromDuct < sMax) { sMax = fromDuct; sMaxWhy = `ductility ${fmt(spec.ductilityStrain)} less the ${fmt(margin * 100, 3)} % margin = ${fmt(sMax)}`; }
  }
  if (!Number.isFinite(sMax)) throw new InputError('limits.maxStrainBeforeAnneal', undefined, 'a strain in (0, 10], or limits.ductilityStrain (with limits.ductilityMargin)');
  const maxDrawRatio = checkRange('limits.maxDrawabilityRatio', spec.maxDrawabilityRatio ?? PROCESS_DEFAULTS.maxDrawabilityRatio, 0, 1, { loOpen: true });
  const maxDT = checkRange('limits.maxTemperatureRise', spec.maxTemperatureRise ?? PROCESS_DEFAULTS.maxTemperatureRise, 0, Infinity, { loOpen: true });
  const maxAnneals = checkRange('limits.maxAnneals', spec.maxAnneals ?? DEFAULT_MAX_ANNEALS, 0, 100);
  const maxPasses = checkRange('limits.maxPasses', spec.maxPasses ?? DEFAULT_MAX_PASSES, 1, 1000);
  const res = checkRange('sizeResolution', spec.sizeResolution ?? 0, 0, d0 / 100);
  const maxRoutes = checkRange('maxRoutes', spec.maxRoutes ?? 5, 1, 100);
  const capacity = spec.forceCapacity === undefined ? undefined : checkRange('process.forceCapacity', spec.forceCapacity, 0, Infinity, { loOpen: true });
  if (draw) {
    if (spec.dieHalfAngleDeg === undefined) throw new InputError('process.dieHalfAngleDeg', undefined, 'a die half-angle in degrees (0, 45]');
    checkRange('process.dieHalfAngleDeg', spec.dieHalfAngleDeg, 0, 45, { loOpen: true });
    checkRange('process.friction', spec.friction, 0, 0.5);
  } else {
    checkRange('process.rollRadius', spec.rollRadius, 0, Infinity, { loOpen: true });
    checkRange('process.friction', spec.friction, 0, 0.6);
    checkRange('start.width', spec.width, 0, Infinity, { loOpen: true });
  }
  const len = spec.length ?? ((mm: number) => `${fmt(mm)} mm`);
  const forceText = spec.force ?? ((n: number) => `${fmt(n)} N`);
  const heating = spec.material.density !== undefined && spec.material.specificHeat !== undefined;

  // Strain ↔ size for the process.
  const k = draw ? 2 : PLANE_STRAIN_FACTOR;
  const strainOf = (a: number, b: number) => k * Math.log(a / b);
  const sizeAfter = (a: number, s: number) => a * Math.exp(-s / k);
  const round = (x: number) => (res > 0 ? Math.round(x / res) * res : x);
  const E = strainOf(d0, df);
  const passStrain = draw ? -Math.log1p(-rPass) : PLANE_STRAIN_FACTOR * -Math.log1p(-rPass);
  const basis = draw ? 'area' : 'thickness';
  const redPct = (s: number) => (draw ? -Math.expm1(-s) : -Math.expm1(-s / PLANE_STRAIN_FACTOR)) * 100;
  const grainRange = validateGrainGrowthStrain(spec.material.grainGrowthStrain);
  let band: { from: number; to: number | null } | null | undefined;
  if (spec.window.temper !== undefined) {
    const scale = materialTemperScale(spec.material, draw ? 'wire' : 'strip', { designation: spec.window.temper, path: 'window.temper' })!;
    band = temperStrainBand(scale, spec.material.law, spec.window.temper, 'window.temper', spec.material.hardness);
  }
  const win = coldWorkWindow(spec.material.law, 0, spec.window, basis, spec.material.hardness, band);
  const base = { totalStrain: E, maxStrainBeforeAnneal: sMax, passStrainLimit: passStrain, window: win };
  let evaluations = 0;
  const infeasible = (limit: string, explanation: string, tried = 0): DesignResult => ({ feasible: false, routes: [], candidatesTried: tried, ledgerRuns: evaluations, ...base, binding: { limit, explanation } });

  if (win.empty) return infeasible(`window (${win.limitedBy.from ?? '?'} against ${win.limitedBy.to ?? '?'})`, `no temper meets the window for this material: ${win.note}`);
  const lo = win.strainFrom ?? 0;
  const hi = win.strainTo ?? Infinity;
  const top = Math.min(hi, sMax, E);
  if (lo > top) {
    if (lo > E) return infeasible(`total reduction (against ${win.limitedBy.from})`, `the window needs at least strain ${fmt(lo)} (${fmt(redPct(lo), 3)} % ${basis} reduction) after the last anneal, but the whole route from ${len(d0)} to ${len(df)} gives only ${fmt(E)} (${fmt(redPct(E), 3)} %): start from larger stock or relax ${win.limitedBy.from}`);
    return infeasible(`strain between anneals (against ${win.limitedBy.from})`, `the window needs at least strain ${fmt(lo)} after the last anneal, but at most ${fmt(sMax)} is allowed between anneals (${sMaxWhy}): relax ${win.limitedBy.from} or allow more strain before an anneal`);
  }

  // Passes of one segment that starts annealed at size a and takes strain s; cached by (a, s, p).
  const material = spec.material;
  const passStep = (size: number): Step => draw
    ? { kind: 'draw', diameter: size, dieHalfAngleDeg: spec.dieHalfAngleDeg!, friction: spec.friction!, ...(capacity !== undefined ? { forceCapacity: capacity } : {}) }
    : { kind: 'roll', thickness: size, rollRadius: spec.rollRadius!, friction: spec.friction!, width: spec.width!, ...(capacity !== undefined ? { forceCapacity: capacity } : {}) };
  const startOf = (size: number): Size => (draw ? { diameter: size } : { thickness: size, width: spec.width! });
  interface Segment { sizes: number[]; use: number; governing: string; ok: boolean; failing: string }
  const usage = (ledger: Ledger, from: number, to: number, sizes: number[], a: number): { use: number; governing: string } => {
    let use = 0;
    let governing = 'reduction';
    let prev = a;
    for (let i = from; i < to; i++) {
      const r = ledger.rows[i]!;
      const size = sizes[i - from]!;
      const parts: Array<[string, number]> = [['reduction', strainOf(prev, size) / passStrain]];
      if (r.drawabilityRatio !== undefined) parts.push(['drawability', r.drawabilityRatio / maxDrawRatio]);
      const f = r.drawingForce ?? r.rollForce;
      if (capacity !== undefined && f !== undefined) parts.push(['force', f / capacity]);
      if (heating && r.temperatureRise !== undefined) parts.push(['heating', r.temperatureRise / maxDT]);
      // Rolls bite the strip unaided only for a draft up to μ²·R (Dieter §17-5; see rollingLoad).
      if (!draw && spec.friction! > 0) parts.push(['bite', (prev - size) / (spec.friction! * spec.friction! * spec.rollRadius!)]);
      else if (!draw) parts.push(['bite', prev > size ? Infinity : 0]);
      for (const [name, u] of parts) if (u > use) { use = u; governing = name; }
      prev = size;
    }
    return { use, governing };
  };
  const segmentCache = new Map<string, Segment>();
  const segment = (a: number, b: number, p: number): Segment => {
    const key = `${a}|${b}|${p}`;
    const hit = segmentCache.get(key);
    if (hit) return hit;
    const s = strainOf(a, b);
    const sizes: number[] = [];
    let prev = a;
    for (let i = 1; i < p; i++) {
      const x = round(sizeAfter(a, (s * i) / p));
      if (!(x < prev) || !(x > b)) break;
      sizes.push(x);
      prev = x;
    }
    sizes.push(b);
    evaluations++;
    const ledger = evaluateRoute({ material, start: startOf(a), steps: sizes.map(passStep) });
    const { use, governing } = usage(ledger, 0, sizes.length, sizes, a);
    const seg = { sizes, use, governing, ok: use <= 1 + 1e-9, failing: governing };
    segmentCache.set(key, seg);
    return seg;
  };
  // Fewest passes (from the reduction limit upward) that meet every pass limit; null when none within the budget.
  const fewestPasses = (a: number, b: number, budget: number): Segment | null => {
    const s = strainOf(a, b);
    let p = Math.max(1, Math.ceil(s / passStrain - 1e-9));
    let last: Segment | null = null;
    for (; p <= budget; p++) {
      last = segment(a, b, p);
      if (last.ok) return last;
    }
    lastFailure = last ? last.failing : 'passes';
    return null;
  };
  let lastFailure = '';
  let grainBlocked = 0;

  // Final-temper strains to try.
  const finals: number[] = [];
  if (E >= lo && E <= Math.min(hi, sMax)) finals.push(E);
  const from = lo + WINDOW_INSET * (top - lo);
  const to = top - WINDOW_INSET * (top - lo);
  for (let i = 0; i < WINDOW_SAMPLES; i++) {
    const s = from + ((to - from) * i) / (WINDOW_SAMPLES - 1);
    if (s < E && !finals.some((f) => Math.abs(f - s) < 1e-9)) finals.push(s);
  }

  const candidates: DesignedRoute[] = [];
  // Candidates built but refused by the final check (the rounded sizes left the window or a limit).
  let rejected = 0;
  const seen = new Set<string>();
  let tried = 0;
  for (const sf of finals) {
    const rest = E - sf;
    const kMin = rest <= 1e-12 ? 0 : Math.ceil(rest / sMax - 1e-9);
    for (const kk of kMin === 0 ? [0] : [kMin, kMin + 1]) {
      if (kk > maxAnneals) { lastFailure = lastFailure || 'anneals'; continue; }
      // Anneal sizes: k equal segments of strain before the last anneal.
      const annealSizes: number[] = [];
      for (let j = 1; j <= kk; j++) annealSizes.push(j === kk ? round(sizeAfter(df, -sf)) : round(sizeAfter(d0, (rest * j) / kk)));
      if (annealSizes.some((x, j) => !(x < (j === 0 ? d0 : annealSizes[j - 1]!)) || !(x > df))) continue;
      const bounds = [d0, ...annealSizes, df];
      // Never anneal inside the critical strain for grain growth (core/route/grainGrowth.ts).
      if (annealSizes.some((x, j) => inGrainGrowthRange(strainOf(bounds[j]!, x), grainRange))) { grainBlocked++; continue; }
      for (const extra of [0, 1]) {
        const segs: Segment[] = [];
        let passes = 0;
        let ok = true;
        for (let j = 0; j + 1 < bounds.length; j++) {
          const best = fewestPasses(bounds[j]!, bounds[j + 1]!, maxPasses - passes);
          if (!best) { ok = false; break; }
          const seg = extra === 0 ? best : segment(bounds[j]!, bounds[j + 1]!, best.sizes.length + 1);
          if (!seg.ok) { ok = false; break; }
          segs.push(seg);
          passes += seg.sizes.length;
        }
        if (!ok || passes > maxPasses) { if (passes > maxPasses) lastFailure = 'passes'; continue; }
        const key = segs.map((g) => g.sizes.join(',')).join('|');
        if (seen.has(key)) continue;
        seen.add(key);
        tried++;
        const route = assemble(bounds, segs, sf);
        if (route) candidates.push(route);
      }
    }
  }

  function assemble(bounds: number[], segs: Segment[], sf: number): DesignedRoute | null {
    const steps: Step[] = [];
    const notes: AnnealNote[] = [];
    let passCount = 0;
    let maxSeg = 0;
    segs.forEach((g, j) => {
      for (const x of g.sizes) steps.push(passStep(x));
      passCount += g.sizes.length;
      const s = strainOf(bounds[j]!, bounds[j + 1]!);
      maxSeg = Math.max(maxSeg, s);
      if (j + 1 < segs.length) {
        steps.push({ kind: 'anneal' });
        const last = j + 2 === segs.length;
        const at = bounds[j + 1]!;
        const reason = last
          ? `last anneal at ${len(at)}: the remaining reduction to ${len(df)} (${fmt(redPct(strainOf(at, df)), 3)} % ${basis}, strain ${fmt(strainOf(at, df))}) is the final temper that lands inside the window [${fmt(lo)}, ${Number.isFinite(hi) ? fmt(hi) : '∞'}] of strain since the last anneal`
            + (s > 0 ? `; the strain since the previous anneal is ${fmt(s)} of the ${fmt(sMax)} allowed (${sMaxWhy})` : '')
          : `anneal at ${len(at)}: strain since the previous anneal reaches ${fmt(s)}; the ${fmt(E - sf)} strain before the final temper is split into ${segs.length - 1} equal parts to stay under ${fmt(sMax)} (${sMaxWhy})`;
        notes.push({ afterPass: passCount, size: at, strainBefore: s, reason });
      }
    });
    evaluations++;
    const ledger = evaluateRoute({ material, start: startOf(d0), steps, targets: spec.window });
    if (!ledger.allTargetsMet) { rejected++; return null; }
    // The ledger's own grain-growth check on the rounded sizes (the same warning the runner prints).
    if (ledger.rows.some((r) => r.warnings.some((w) => w.code === 'grainGrowth'))) { grainBlocked++; return null; }
    // Every pass is checked again on the whole route (the same numbers the runner will print).
    const passIdx: number[] = [];
    ledger.rows.forEach((r, i) => { if (r.kind !== 'anneal') passIdx.push(i); });
    let use = 0;
    let governing = 'reduction';
    let prev = d0;
    for (const i of passIdx) {
      const step = steps[i] as { diameter?: number; thickness?: number };
      const size = (draw ? step.diameter : step.thickness)!;
      const u = usage(ledger, i, i + 1, [size], prev);
      if (u.use > use) { use = u.use; governing = u.governing; }
      prev = size;
    }
    if (use > 1 + 1e-9 || maxSeg > sMax * (1 + 1e-9)) { rejected++; return null; }
    const windowMargin = Math.min(...ledger.targets.map((t) => (t.limit !== 0 ? t.margin / Math.abs(t.limit) : t.margin)), Infinity);
    const finalStrain = segs.length > 1 ? strainOf(bounds[bounds.length - 2]!, df) : E;
    return {
      rank: 0, steps, passes: passCount, anneals: segs.length - 1, annealNotes: notes,
      finalStrain, finalReductionPct: redPct(finalStrain),
      windowMargin: Number.isFinite(windowMargin) ? windowMargin : 1, passMargin: 1 - use, annealMargin: 1 - maxSeg / sMax,
      governingPassLimit: governing, ledger,
    };
  }

  if (candidates.length === 0 && grainBlocked > 0 && rejected === 0) {
    return infeasible('grain growth', `${grainBlocked} schedules would anneal after a strain inside the critical range ${grainRange[0]}–${grainRange[1]} for grain growth (coarse grains); none avoids it: move the final temper in the window, or change material.grainGrowthStrain if tests on the alloy justify it`, tried);
  }
  if (candidates.length === 0 && rejected > 0) {
    return infeasible('window (size rounding)', `${rejected} schedules were built, but with sizes rounded to ${len(res)} none stays inside the window [${fmt(lo)}, ${Number.isFinite(hi) ? fmt(hi) : '∞'}] of strain since the last anneal and every pass limit: widen the window`, tried);
  }
  if (candidates.length === 0) {
    const what = lastFailure === 'passes' || lastFailure === 'anneals' || lastFailure === '' ? lastFailure || 'passes' : lastFailure;
    const explain: Record<string, string> = {
      passes: `no schedule fits within ${maxPasses} passes and ${maxAnneals} anneals: allow more passes or a larger reduction per pass (now ${fmt(rPass * 100, 3)} %)`,
      anneals: `the route needs more than ${maxAnneals} anneals at ${fmt(sMax)} strain between anneals (${sMaxWhy}) for a total strain of ${fmt(E)}`,
      drawability: `the drawing stress exceeds ${fmt(maxDrawRatio * 100, 3)} % of the exit flow stress even at the smallest pass tried (die half-angle ${spec.dieHalfAngleDeg}°, friction ${spec.friction}): use a smaller die angle or better lubrication`,
      force: `the ${draw ? 'drawing' : 'roll'} force exceeds the capacity ${forceText(capacity ?? 0)} even at the smallest pass tried within ${maxPasses} passes`,
      bite: `the rolls cannot bite the draft of the smallest pass tried within ${maxPasses} passes (largest draft μ²·R = ${len((spec.friction ?? 0) ** 2 * (spec.rollRadius ?? 0))}): raise friction or roll radius, or allow more passes`,
      heating: `the adiabatic temperature rise exceeds ${fmt(maxDT)} K even at the smallest pass tried within ${maxPasses} passes`,
      reduction: `no schedule fits within ${maxPasses} passes at ${fmt(rPass * 100, 3)} % per pass`,
    };
    return infeasible(what === 'reduction' ? 'passes' : what, explain[what] ?? explain.passes!, tried);
  }
  const score = (r: DesignedRoute) => Math.min(r.windowMargin, r.passMargin, r.annealMargin);
  candidates.sort((a, b) => a.anneals - b.anneals || a.passes - b.passes || score(b) - score(a));
  const routes = candidates.slice(0, maxRoutes).map((r, i) => ({ ...r, rank: i + 1 }));
  return { feasible: true, routes, candidatesTried: tried, ledgerRuns: evaluations, ...base };
}
