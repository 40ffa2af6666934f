/** The hardening laws the core knows, by their published names. */
export type LawName = 'hollomon' | 'ludwik' | 'swift' | 'voce' | 'hockettSherby' | 'swiftVoce';

/** What a law parameter measures; stresses convert between MPa and ksi at the boundary. */
export type ParamKind = 'stress' | 'dimensionless';

/** One parameter of a law: name, kind, allowed range and a one-line meaning. */
export interface ParamInfo {
  name: string;
  kind: ParamKind;
  lo: number;
  hi: number;
  loOpen: boolean;
  hiOpen: boolean;
  meaning: string;
  /** How a person reads the parameter (σ0, ε0, σsat, α); plan files and JSON keep `name`. */
  symbol: string;
}

export type HollomonParams = { K: number; n: number };
export type LudwikParams = { sigma0: number; K: number; n: number };
export type SwiftParams = { K: number; eps0: number; n: number };
export type VoceParams = { sigma0: number; Q: number; b: number };
export type HockettSherbyParams = { sigmaSat: number; sigma0: number; a: number; p: number };
export type SwiftVoceParams = SwiftParams & VoceParams & { alpha: number };

/** A law as a plan writes it: `{ law: 'hollomon', K: 530, n: 0.44 }`. Stresses in MPa inside the core. */
export type LawSpec =
  | ({ law: 'hollomon' } & HollomonParams)
  | ({ law: 'ludwik' } & LudwikParams)
  | ({ law: 'swift' } & SwiftParams)
  | ({ law: 'voce' } & VoceParams)
  | ({ law: 'hockettSherby' } & HockettSherbyParams)
  | ({ law: 'swiftVoce' } & SwiftVoceParams);

/**
 * A hardening law in true stress σ (MPa) versus true plastic strain ε (dimensionless, ε ≥ 0).
 * Every method returns a finite number for finite ε ≥ 0 or throws; none returns NaN.
 */
export interface FlowLaw {
  readonly law: LawName;
  /** The validated parameters, in MPa for stresses. */
  readonly params: Readonly<Record<string, number>>;
  /** Flow stress σ(ε), MPa. */
  stress(eps: number): number;
  /** Hardening slope dσ/dε, MPa. Laws whose slope is unbounded at ε = 0 evaluate it at ε = 1e-12. */
  slope(eps: number): number;
  /** Plastic work per unit volume W(ε) = ∫₀^ε σ dε, MJ/m³ (numerically MPa). */
  work(eps: number): number;
  /** Inverse: the plastic strain at which σ(ε) = sigma; 0 for sigma ≤ σ(0). Throws above saturation. */
  strainAt(sigma: number): number;
  /** Considère uniform true plastic strain εu (dσ/dε = σ), cached. */
  uniformStrain(): number;
  /** The stress the law approaches but never reaches (Voce, Hockett–Sherby), MPa; undefined when unbounded. */
  readonly saturationStress?: number;
}

/** Smallest strain at which a singular slope (x^(n-1) at 0) is evaluated. */
export const SLOPE_FLOOR = 1e-12;
