import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { designRoute, hollomon, PLANE_STRAIN_FACTOR, type DesignSpec, type Material } from '../../../src/core/index.js';
import { loadDesignSpecText, routeToPlan, runDesign } from '../../../src/plan/designSpec.js';
import { loadPlanText, runPlan } from '../../../src/plan/load.js';
import { MPA_PER_KSI, MM_PER_IN, N_PER_LBF } from '../../../src/plan/units.js';

// Callister, Fundamentals of Materials Science and Engineering, 2nd ed., p. 199: annealed low-carbon
// steel K 600 MPa, n 0.21; E 207 GPa (Table B.2). Density and specific heat: usual handbook values (from memory).
const steel: Material = { name: 'low-carbon steel', elasticModulus: 207000, poissonRatio: 0.3, law: hollomon({ K: 600, n: 0.21 }), density: 7850, specificHeat: 486 };
const wire: DesignSpec = {
  material: steel, process: 'draw', startSize: 5.5, finalSize: 2.5, maxPassReductionPct: 30, maxStrainBeforeAnneal: 1.3,
  window: { minYield: 520, maxYield: 600 }, dieHalfAngleDeg: 6, friction: 0.05,
};

describe('designRoute(spec): ranked routes', () => {
  const res = designRoute(wire);
  it('finds routes, ranked by fewest anneals, then fewest passes, then the largest smallest margin', () => {
    expect(res.feasible).toBe(true);
    expect(res.routes.length).toBeGreaterThan(1);
    const score = (r: (typeof res.routes)[number]) => Math.min(r.windowMargin, r.passMargin, r.annealMargin);
    for (let i = 1; i < res.routes.length; i++) {
      const a = res.routes[i - 1]!;
      const b = res.routes[i]!;
      expect(a.anneals < b.anneals || (a.anneals === b.anneals && (a.passes < b.passes || (a.passes === b.passes && score(a) >= score(b))))).toBe(true);
    }
  });
  it('needs an anneal here because the whole strain 2·ln(5.5/2.5) = 1.58 is above maxYield\'s strain', () => {
    expect(res.totalStrain).toBeCloseTo(2 * Math.log(5.5 / 2.5), 12);
    expect(res.routes[0]!.anneals).toBe(1);
    // The fewest passes the 30 % limit allows: ⌈1.577 / −ln 0.7⌉ = 5.
    expect(res.routes[0]!.passes).toBe(Math.ceil(res.totalStrain / -Math.log(0.7)));
    expect(res.routes[0]!.annealNotes[0]!.reason).toMatch(/final temper/);
  });
  it('needs no anneal when the whole reduction lands in the window', () => {
    const r = designRoute({ ...wire, finalSize: 4, window: { minYield: 450 } });
    expect(r.routes[0]!.anneals).toBe(0);
  });
  it('rolling routes use the plane-strain strain (2/√3)·ln(t0/t)', () => {
    const r = designRoute({ material: steel, process: 'roll', startSize: 3, finalSize: 1, width: 50, maxPassReductionPct: 30, maxStrainBeforeAnneal: 1, window: { minYield: 500 }, rollRadius: 80, friction: 0.08 });
    expect(r.totalStrain).toBeCloseTo(PLANE_STRAIN_FACTOR * Math.log(3), 12);
    expect(r.feasible).toBe(true);
  });
});

describe('designRoute(spec): infeasible specifications name the binding limit', () => {
  it('a window needing more strain than the whole route', () => {
    const r = designRoute({ ...wire, finalSize: 5, window: { minYield: 600 } });
    expect(r.feasible).toBe(false);
    expect(r.routes).toEqual([]);
    expect(r.binding!.limit).toMatch(/total reduction.*minYield/);
    expect(r.binding!.explanation).toMatch(/needs at least strain .* gives only/);
  });
  it('a window needing more strain than allowed between anneals', () => {
    const r = designRoute({ ...wire, finalSize: 1, maxStrainBeforeAnneal: 0.5, window: { minYield: 640 } });
    expect(r.binding!.limit).toMatch(/strain between anneals/);
  });
  it('a window no temper reaches (minYield above maxYield\'s strain via the elongation target)', () => {
    const r = designRoute({ ...wire, window: { minYield: 560, minRemainingElongationPct: 15 } });
    expect(r.binding!.limit).toMatch(/window/);
    expect(r.binding!.explanation).toMatch(/the minimum reload yield \(Rp0\.2\) target needs at least/);
  });
  it('a force capacity below even the smallest pass', () => {
    const r = designRoute({ ...wire, forceCapacity: 50 });
    expect(r.binding!.limit).toBe('force');
  });
  it('a window narrower than the size rounding can hit', () => {
    const r = designRoute({ ...wire, sizeResolution: 0.01, window: { minYield: 560, maxYield: 560.02 } });
    expect(r.feasible).toBe(false);
    expect(r.binding!.limit).toBe('window (size rounding)');
  });
  it('too few anneals allowed', () => {
    const r = designRoute({ ...wire, finalSize: 1, maxStrainBeforeAnneal: 0.9, maxAnneals: 1 });
    expect(r.binding!.limit).toBe('anneals');
  });
});

/** A random design specification as a file text (SI or US), and the limits to check against, in SI. */
const specArb = fc.record({
  K: fc.double({ min: 300, max: 1200, noNaN: true }),
  n: fc.double({ min: 0.1, max: 0.5, noNaN: true }),
  draw: fc.boolean(),
  us: fc.boolean(),
  d0: fc.double({ min: 3, max: 12, noNaN: true }),
  ratio: fc.double({ min: 0.15, max: 0.85, noNaN: true }),
  maxPass: fc.double({ min: 12, max: 40, noNaN: true }),
  sMax: fc.double({ min: 0.6, max: 2.5, noNaN: true }),
  a: fc.double({ min: 0.02, max: 1.2, noNaN: true }),
  width: fc.double({ min: 0.15, max: 1, noNaN: true }),
  angle: fc.double({ min: 3, max: 12, noNaN: true }),
  mu: fc.double({ min: 0, max: 0.12, noNaN: true }),
  heat: fc.boolean(),
  maxDT: fc.double({ min: 40, max: 200, noNaN: true }),
  capacity: fc.option(fc.double({ min: 2e3, max: 2e5, noNaN: true }), { nil: undefined }),
  drawRatio: fc.double({ min: 0.5, max: 0.95, noNaN: true }),
});

describe('every designed route, run through the runner, meets its own window and no pass exceeds its limits', () => {
  it('holds over random specifications (property, seeded; loadPlanText + runPlan)', () => {
    let feasible = 0;
    fc.assert(fc.property(specArb, (g) => {
      const sig = (e: number) => g.K * (e + 0.002) ** g.n;
      const S = g.us ? 1 / MPA_PER_KSI : 1;
      const L = g.us ? 1 / MM_PER_IN : 1;
      const F = g.us ? 1 / N_PER_LBF : 1;
      const b = g.a + g.width;
      // Rolling friction 0.08–0.15 with 150 mm rolls: largest bite μ²·R from 0.96 to 3.4 mm.
      const rollMu = 0.08 + (g.mu / 0.12) * 0.07;
      const spec = {
        name: 'random spec', units: g.us ? 'US' : 'SI',
        material: { name: 'm', elasticModulus: 200000 * S, flowCurve: { law: 'hollomon', K: g.K * S, n: g.n }, ...(g.heat ? { density: 7850, specificHeat: 480 } : {}) },
        process: g.draw
          ? { kind: 'draw', dieHalfAngleDeg: g.angle, friction: g.mu, ...(g.capacity ? { forceCapacity: g.capacity * F } : {}) }
          : { kind: 'roll', rollRadius: 150 * L, friction: rollMu, ...(g.capacity ? { forceCapacity: g.capacity * 20 * F } : {}) },
        start: g.draw ? { diameter: g.d0 * L } : { thickness: g.d0 * L, width: 60 * L },
        final: g.draw ? { diameter: g.d0 * g.ratio * L } : { thickness: g.d0 * g.ratio * L },
        limits: { maxPassReductionPct: g.maxPass, maxStrainBeforeAnneal: g.sMax, maxDrawabilityRatio: g.drawRatio, maxTemperatureRise: g.maxDT },
        window: { minYield: sig(g.a) * S, maxYield: sig(b) * S },
        routes: 3,
      };
      const loaded = loadDesignSpecText(JSON.stringify(spec), 'random.json');
      const res = runDesign(loaded);
      if (!res.feasible) {
        // Not an empty answer: a named limit and an explanation.
        expect(res.binding!.limit.length).toBeGreaterThan(0);
        expect(res.binding!.explanation.length).toBeGreaterThan(20);
        return;
      }
      feasible++;
      for (const route of res.routes) {
        const planText = JSON.stringify(routeToPlan(loaded, route.steps, route.rank));
        const plan = loadPlanText(planText, 'designed.json');
        const ledger = runPlan(plan);
        expect(ledger.allTargetsMet, 'window met').toBe(true);
        let prev = g.d0;
        let since = 0;
        ledger.rows.forEach((r) => {
          if (r.kind === 'anneal') { since = 0; return; }
          since += r.strainIncrement;
          expect(since, 'strain between anneals').toBeLessThanOrEqual(g.sMax * (1 + 1e-9));
          const size = (g.draw ? r.size.diameter! : r.size.thickness!);
          const red = g.draw ? 100 * (1 - (size / prev) ** 2) : 100 * (1 - size / prev);
          const draft = prev - size;
          expect(red, 'reduction per pass').toBeLessThanOrEqual(g.maxPass * (1 + 1e-6));
          prev = size;
          if (g.draw) expect(r.drawabilityRatio!, 'drawability').toBeLessThanOrEqual(g.drawRatio * (1 + 1e-9));
          // Rolls bite unaided only up to a draft μ²·R (Dieter, Mechanical Metallurgy, §17-5; from memory).
          else expect(draft, 'bite').toBeLessThanOrEqual(rollMu * rollMu * 150 * (1 + 1e-9));
          const force = g.draw ? r.drawingForce! : r.rollForce!;
          expect(Number.isFinite(force)).toBe(true);
          if (g.capacity) expect(force, 'force capacity').toBeLessThanOrEqual((g.draw ? g.capacity : g.capacity * 20) * (1 + 1e-9));
          if (g.heat) expect(r.temperatureRise!, 'heating').toBeLessThanOrEqual(g.maxDT * (1 + 1e-9));
        });
        const last = ledger.rows[ledger.rows.length - 1]!;
        expect(last.size.diameter ?? last.size.thickness).toBeCloseTo(g.d0 * g.ratio, 6);
      }
    }), { seed: 7203, numRuns: 60 });
    // The generator must exercise real routes, not only infeasible ones.
    expect(feasible).toBeGreaterThan(15);
  });
});
