/**
 * Standard acceleration of gravity g₀ = 9.80665 m/s², exact by definition (3rd CGPM, 1901; ISO 80000-4).
 * One kilogram-force is g₀ newtons, so a Vickers number in kgf/mm² times g₀ is the same pressure in
 * MPa (N/mm²). Units: MPa per (kgf/mm²).
 * @example 100 * STANDARD_GRAVITY // 100 HV ≈ 980.665 MPa
 */
export const STANDARD_GRAVITY = 9.80665;

/**
 * Contact (sloping-face) area of a Vickers impression over its projected area is 1/sin(68°) ≈ 1.0785,
 * so the load over the contact area (the Vickers number) is sin(68°) ≈ 0.927 times the mean pressure on
 * the projected area. Geometry of the 136° square pyramid of ISO 6507-1 / ASTM E92 (the standards'
 * HV = 1.8544·F/d² with F in kgf and d the mean diagonal in mm is 2·sin(68°)·F/d²).
 * Dimensionless.
 * @example VICKERS_CONTACT_RATIO // 0.92718...
 */
export const VICKERS_CONTACT_RATIO = Math.sin((68 * Math.PI) / 180);

/**
 * Defaults of the Tabor hardness estimate, stated once.
 * - `constraintFactor` 3: mean pressure over projected area ≈ 3 × the flow stress for a fully plastic
 *   indentation (D. Tabor, *The Hardness of Metals*, Oxford 1951; the "about 3" is from memory, not
 *   checked on a printed page).
 * - `taborFactor` = 3 × sin(68°) ≈ 2.78: the plan's `material.hardness.taborFactor`, the Vickers number
 *   in MPa over σ(ε̄ + εr). The Vickers number divides the load by the contact area, so it is 0.927 of
 *   the projected-area pressure (geometry of the indenter, {@link VICKERS_CONTACT_RATIO}).
 * - `representativeStrain` 0.08: the strain a Vickers indentation adds to the prior strain (Tabor 1951,
 *   from memory).
 * Both are estimates for work-hardened metals in general; a user with hardness readings of states of
 * known strain should fit c instead (`fitTaborFactor`).
 */
export const HARDNESS_DEFAULTS = Object.freeze({
  constraintFactor: 3,
  taborFactor: 3 * VICKERS_CONTACT_RATIO,
  representativeStrain: 0.08,
});

/** Allowed ranges of the Tabor parameters (validation at the plan boundary and in the core). */
export const HARDNESS_RANGES = Object.freeze({
  /** c: HV in MPa over σ. Tabor's value is about 2.8; measured values for metals lie near 2.5–3.2 (common practice). */
  taborFactor: [1, 5] as const,
  /** εr: 0 to 0.3 (Tabor's 0.08 for a Vickers pyramid; sharper indenters give more). */
  representativeStrain: [0, 0.3] as const,
});

/**
 * Relative error of a Vickers hardness estimated from the flow curve by Tabor's relation: ±10–15 %
 * against a measured value (common practice, from memory; not looked up in a printed source). The
 * upper end, 0.15, is used so that more close calls are flagged: a met hardness target whose margin is
 * smaller than 0.15 × the predicted HV gets a caution (`checkTargets`), never a clean pass.
 * Dimensionless.
 * @example HARDNESS_MODEL_REL_ERROR * 200 // 30 HV of doubt on a predicted 200 HV
 */
export const HARDNESS_MODEL_REL_ERROR = 0.15;
