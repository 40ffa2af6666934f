import type { LawName, ParamInfo } from './types.js';

/** Symbols of the parameters as the literature writes them (plan files and JSON keep the ASCII names). */
const SYMBOLS: Readonly<Record<string, string>> = { sigma0: 'σ0', sigmaSat: 'σsat', eps0: 'ε0', alpha: 'α' };

const p = (name: string, kind: ParamInfo['kind'], lo: number, hi: number, loOpen: boolean, hiOpen: boolean, meaning: string): ParamInfo =>
  ({ name, kind, lo, hi, loOpen, hiOpen, meaning, symbol: SYMBOLS[name] ?? name });

/**
 * The parameters of every law, their kinds and allowed ranges: one table used by validation, the
 * plan schema, unit conversion and the fitters' bounds. Ranges cover annealed to heavily worked
 * engineering metals (n up to 1; rates b up to 10⁴).
 */
export const LAW_PARAMETERS: Readonly<Record<LawName, readonly ParamInfo[]>> = {
  hollomon: [
    p('K', 'stress', 0, 1e5, true, false, 'strength coefficient'),
    p('n', 'dimensionless', 0, 1, true, false, 'strain-hardening exponent'),
  ],
  ludwik: [
    p('sigma0', 'stress', 0, 1e5, false, false, 'initial yield stress'),
    p('K', 'stress', 0, 1e5, true, false, 'hardening coefficient'),
    p('n', 'dimensionless', 0, 1, true, false, 'hardening exponent'),
  ],
  swift: [
    p('K', 'stress', 0, 1e5, true, false, 'strength coefficient'),
    p('eps0', 'dimensionless', 0, 1, false, false, 'prestrain offset'),
    p('n', 'dimensionless', 0, 1, true, false, 'hardening exponent'),
  ],
  voce: [
    p('sigma0', 'stress', 0, 1e5, false, false, 'initial yield stress'),
    p('Q', 'stress', 0, 1e5, false, false, 'saturation increase of stress'),
    p('b', 'dimensionless', 0, 1e4, true, false, 'saturation rate'),
  ],
  hockettSherby: [
    p('sigmaSat', 'stress', 0, 1e5, true, false, 'saturation stress'),
    p('sigma0', 'stress', 0, 1e5, false, false, 'initial yield stress (below sigmaSat)'),
    p('a', 'dimensionless', 0, 1e4, true, false, 'rate coefficient'),
    p('p', 'dimensionless', 0, 2, true, false, 'rate exponent'),
  ],
  swiftVoce: [
    p('alpha', 'dimensionless', 0, 1, false, false, 'weight of the Swift part (1 = pure Swift)'),
    p('K', 'stress', 0, 1e5, true, false, 'Swift strength coefficient'),
    p('eps0', 'dimensionless', 0, 1, false, false, 'Swift prestrain offset'),
    p('n', 'dimensionless', 0, 1, true, false, 'Swift hardening exponent'),
    p('sigma0', 'stress', 0, 1e5, false, false, 'Voce initial yield stress'),
    p('Q', 'stress', 0, 1e5, false, false, 'Voce saturation increase'),
    p('b', 'dimensionless', 0, 1e4, true, false, 'Voce saturation rate'),
  ],
};

export const LAW_NAMES = Object.keys(LAW_PARAMETERS) as LawName[];

/**
 * The laws' names as people write them (the authors' names; Swift–Voce is the weighted blend of the two).
 * Plan files, options and JSON keep the identifiers (`hockettSherby`); text for people uses these.
 */
export const LAW_TITLES: Readonly<Record<LawName, string>> = {
  hollomon: 'Hollomon', ludwik: 'Ludwik', swift: 'Swift', voce: 'Voce', hockettSherby: 'Hockett–Sherby', swiftVoce: 'Swift–Voce',
};
