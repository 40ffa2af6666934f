import { synthesizeRecord, xoshiro128ss } from '../../../src/core/index.js';

// INVENTED specimens: six coupons of one annealed copper heat, each a noise-free record generated
// from a Hollomon law whose K and n are known (around Callister's copper, K 530 MPa, n 0.44, with
// K and n negatively correlated).
export const TRUE = [
  { K: 545, n: 0.425 }, { K: 512, n: 0.455 }, { K: 530, n: 0.44 }, { K: 561, n: 0.43 }, { K: 505, n: 0.448 }, { K: 538, n: 0.437 },
];
export const specimens = TRUE.map((p, i) => ({
  name: `coupon-${i + 1}`,
  ...synthesizeRecord({ law: { law: 'hollomon', ...p }, elasticModulus: 115000, rng: xoshiro128ss(900 + i), step: 5e-4 }),
}));

