import { InputError } from '../../core/errors.js';
import { orderStatisticLowerRank } from '../../core/scatter/orderStatisticBound.js';
import { normalToleranceFactor } from '../../core/scatter/toleranceFactor.js';
import { PlanError } from '../../plan/problems.js';
import { defineCommand } from '../command.js';

const cliError = (path: string, message: string) => new PlanError([{ file: '(command line)', path, message }]);

function numberOption(name: string, v: string | undefined, fallback: number | undefined): number {
  if (v === undefined) {
    if (fallback === undefined) throw cliError(`--${name}`, 'missing; allowed a number');
    return fallback;
  }
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x)) throw cliError(`--${name}`, `got ${JSON.stringify(v)}, allowed a number`);
  return x;
}

/**
 * `tolerance-factor --n N --coverage P --confidence G [--json]`: the one-sided normal tolerance
 * factor k (noncentral t; NIST/SEMATECH e-Handbook §7.2.6.3), so that x̄ − k·s is a lower bound on
 * the fraction P of a normal population with confidence G, from n tests; and the rank of the
 * distribution-free (order-statistic) bound where n is large enough.
 */
export const toleranceFactor = defineCommand({
  name: 'tolerance-factor',
  summary: 'one-sided normal tolerance factor k (x̄ − k·s is the lower bound) and the distribution-free rank',
  options: {
    n: { type: 'string', value: 'N', required: true, help: 'number of tests (sample size), a whole number ≥ 2' },
    coverage: { type: 'string', value: 'P', help: 'fraction of the population above the bound, e.g. 0.90 (default 0.9)' },
    confidence: { type: 'string', value: 'G', help: 'confidence level, e.g. 0.95 (default 0.95)' },
    json: { type: 'boolean', default: false, help: 'print the result as JSON' },
  },
  run({ values }, io) {
    const n = numberOption('n', values.n, undefined);
    const coverage = numberOption('coverage', values.coverage, 0.9);
    const confidence = numberOption('confidence', values.confidence, 0.95);
    let r;
    let rank: number | null;
    try {
      r = normalToleranceFactor(n, coverage, confidence);
      rank = orderStatisticLowerRank(n, coverage, confidence);
    } catch (e) {
      if (e instanceof InputError) throw cliError(`--${e.path}`, `got ${JSON.stringify(e.value)}, allowed ${e.allowed}`);
      throw e;
    }
    if (!r.converged) throw new Error(`tolerance factor did not converge (residual ${r.residual})`);
    const k = Math.round(r.k * 1e4) / 1e4;
    if (values.json) {
      io.stdout(JSON.stringify({ n, coverage, confidence, k, method: 'one-sided normal tolerance factor, noncentral t (NIST/SEMATECH e-Handbook of Statistical Methods §7.2.6.3)', distributionFreeRank: rank }, null, 2) + '\n');
      return 0;
    }
    const pct = (x: number) => `${+(x * 100).toPrecision(6)} %`;
    io.stdout([
      `k = ${k.toFixed(4)}`,
      `one-sided normal tolerance factor for n = ${n}, coverage ${pct(coverage)}, confidence ${pct(confidence)}`,
      `lower bound = mean − ${k.toFixed(4)} × s  (s: sample standard deviation, n − 1 divisor; assumes a normal population)`,
      'method: noncentral t, NIST/SEMATECH e-Handbook of Statistical Methods §7.2.6.3',
      rank === null
        ? `distribution-free: ${n} values are too few for a bound at this coverage and confidence (the smallest needs n ≥ ${Math.ceil(Math.log(1 - confidence) / Math.log(coverage))})`
        : `distribution-free (any continuous population): the ${rank}${rank === 1 ? 'st' : rank === 2 ? 'nd' : rank === 3 ? 'rd' : 'th'} smallest of the ${n} values (Wilks 1941)`,
      '',
    ].join('\n'));
    return 0;
  },
});
