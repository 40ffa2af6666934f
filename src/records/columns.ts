import { normUnit, unitFactor } from './units.js';

const knownUnit = (u: string) => (['stress', 'force', 'length', 'strain'] as const).some((q) => normUnit(u) !== '' && unitFactor(q, u) !== undefined) || /^(s|sec|min)$/i.test(u);

/** What a column holds. */
export type Role = 'strain' | 'stress' | 'force' | 'extension' | 'time';
export const ROLES: readonly Role[] = ['strain', 'stress', 'force', 'extension', 'time'];

export interface ColumnInfo {
  /** 0-based index. */
  index: number;
  /** The name as written in the header. */
  name: string;
  /** Name without its unit decoration, lower case. */
  base: string;
  /** Unit from the decoration (`Stress [MPa]`, `stress_MPa`, `Strain (%)`), or '' when none. */
  unit: string;
  /** True for true (logarithmic) strain or true stress. */
  isTrue: boolean;
}

const UNIT_SUFFIX = /[_\s,\-](mpa|gpa|ksi|psi|kpa|pa|n|kn|lbf|lbs?|kips?|kgf|mm|in|inch|pct|percent|s|sec|min|%|µε|με|ue|microstrain|mm\/mm|in\/in|n\/mm²|n\/mm2)$/i;
/** `strain_in_per_in`, `Strain mm per mm`: a unit written with "per" after the name. */
const PER_SUFFIX = /^(.*?)[_\s,\-]+([a-zµμ²]+)[_\s]+per[_\s]+([a-zµμ²]+)$/i;
/** `Stress, MPa`, `Load - lbf`, `Strain: %`: a unit after a comma, dash or colon. */
const SEP_SUFFIX = /^(.*?)\s*[,:;]\s*(\S+)$|^(.*?)\s+[-–]\s+(\S+)$/;

/** Splits a header name into base name and unit decoration. */
export function describeColumn(name: string, index: number): ColumnInfo {
  let base = name.trim();
  let unit = '';
  const br = /^(.*?)[\s_]*[[({<]([^\])}>]*)[\])}>]\s*$/.exec(base);
  const per = PER_SUFFIX.exec(base);
  const sep = SEP_SUFFIX.exec(base);
  if (br) {
    base = br[1]!;
    unit = br[2]!;
  } else if (per && /^(in|inch|mm|m|µm|μm|um|ft)$/i.test(per[2]!) && /^(in|inch|mm|m|ft)$/i.test(per[3]!)) {
    base = per[1]!;
    unit = `${per[2]}/${per[3]}`;
  } else if (sep && knownUnit((sep[2] ?? sep[4])!)) {
    base = (sep[1] ?? sep[3])!;
    unit = (sep[2] ?? sep[4])!;
  } else {
    const inU = /^(.*?)\s+in\s+(\S+)$/i.exec(base);
    // `Stress/MPa`, `Strain/µε`, `Force / kN`: quantity/unit (ISO 80000-1 §7.1 notation for a value divided by
    // its unit, as table headings write it). The text after the last slash must be a known unit, so `mm/mm`
    // stays a strain unit and a name such as `Stress/Strain` stays a name.
    const slash = /^(.*?)\s*\/\s*([^/\s]+)$/.exec(base);
    const suf = UNIT_SUFFIX.exec(base);
    // A compound unit at the end (`Strain mm/mm`, `Stress N/mm2`) is one unit, not quantity/unit.
    const compound = suf !== null && suf[1]!.includes('/');
    if (inU) { base = inU[1]!; unit = inU[2]!; }
    else if (!compound && slash && slash[1] && knownUnit(slash[2]!)) { base = slash[1]; unit = slash[2]!; }
    else if (suf) { unit = suf[1]!; base = base.slice(0, base.length - suf[0].length); }
  }
  const b = base.toLowerCase().replace(/[_\-.]+/g, ' ').replace(/\s+/g, ' ').trim();
  return { index, name, base: b, unit: normUnit(unit) === 'pct' ? '%' : unit.trim(), isTrue: /\btrue\b|\blog(arithmic)?\b/.test(toEnglish(b)) };
}

/**
 * Column words of other languages read as their English role words (German, French, Spanish, Italian test
 * reports; plain dictionary words, common practice): a German export's `Dehnung [%]` and `Spannung [MPa]` are
 * strain and stress. Only whole words are mapped.
 */
const FOREIGN_WORDS: Readonly<Record<string, string>> = {
  spannung: 'stress', zugspannung: 'stress', dehnung: 'strain', kraft: 'force', zugkraft: 'force', 'verlängerung': 'extension',
  'längenänderung': 'extension', weg: 'displacement', traverse: 'crosshead', zeit: 'time', wahre: 'true', technische: 'engineering',
  contrainte: 'stress', 'déformation': 'strain', allongement: 'elongation', effort: 'force', charge: 'load', 'déplacement': 'displacement', temps: 'time', vraie: 'true',
  'tensión': 'stress', esfuerzo: 'stress', 'deformación': 'strain', fuerza: 'force', carga: 'load', alargamiento: 'elongation', tiempo: 'time', verdadera: 'true',
  tensione: 'stress', sollecitazione: 'stress', deformazione: 'strain', forza: 'force', carico: 'load', allungamento: 'elongation', tempo: 'time', vera: 'true',
};
/**
 * German compounds put the head noun last (Prüfkraft, Nenndehnung, Zugspannung: a kind of force, strain, stress;
 * plain German grammar): a word ending in one of these reads as it, a transverse strain (Querdehnung) as such.
 */
const GERMAN_HEADS: readonly [RegExp, string][] = [[/^quer\S*dehnung$/, 'transverse strain'], [/^\S+kraft$/, 'force'], [/^\S+spannung$/, 'stress'], [/^\S+dehnung$/, 'strain'], [/^\S+(verlängerung|längenänderung)$/, 'extension']];
const toEnglish = (b: string) => b.split(' ').map((w) => (Object.prototype.hasOwnProperty.call(FOREIGN_WORDS, w) ? FOREIGN_WORDS[w]! : GERMAN_HEADS.find(([re]) => re.test(w))?.[1] ?? w)).join(' ');

/**
 * True when a column is the machine's own travel (crosshead, stroke, actuator or piston position), not an
 * extensometer: its extension includes the elastic compliance of the machine, load train and grips, so E from it is
 * low and the strains are not ISO 6892-1 extensometer strains (common practice).
 */
export function isMachineTravel(c: ColumnInfo): boolean {
  const b = toEnglish(c.base);
  return /machine|crosshead|cross head|stroke|position|actuator|piston|travel/.test(b) && !/extensometer/.test(b);
}

/** Score of a column for a role (0 = not this role). Higher wins; engineering values beat true ones. */
export function roleScore(c: ColumnInfo, role: Role, unitHint: string): number {
  const b = toEnglish(c.base);
  const lengthUnit = /^(mm|in|inch|m|cm|µm|um)$/i.test(normUnit(unitHint));
  const eng = c.isTrue ? 0 : 1;
  // Symbols as papers and lab sheets head columns (σ, ε, F, ΔL, and their spelled-out or short forms), read only
  // with a unit of their quantity (a bare "s" or "e" could be anything else): 9, below a named column.
  const sym = (q: 'stress' | 'strain' | 'force' | 'length') => unitHint !== '' && unitFactor(q, unitHint) !== undefined;
  switch (role) {
    case 'stress':
      if (/^(σ|sig|s)$/.test(b) && sym('stress')) return 9;
      return /\bstress\b|^sigma$/.test(b) ? 10 + eng * 5 + (/^(eng(ineering)? )?stress$/.test(b) ? 2 : 0) : 0;
    case 'strain':
      if (/^(ε|ϵ|eps|e)$/.test(b) && sym('strain')) return 9;
      // "Strain [mm]": an extensometer channel named strain but recorded as a length is an extension (below).
      if (/\bstrain\b|^epsilon$/.test(b) && lengthUnit) return 0;
      if (/\bstrain\b|^epsilon$/.test(b)) return 10 + eng * 5 + (/^(eng(ineering)? |axial |longitudinal )?strain$/.test(b) ? 2 : 0) - (/rate/.test(b) ? 20 : 0) - (/lateral|transverse|width|thickness/.test(b) ? 9 : 0);
      if (/^elongation$|^elong$/.test(b) && !lengthUnit) return 8;
      // An extensometer channel written as a strain (`Extensometer [%]`, `Ext. 1 (mm/mm)`): the machine already divided
      // by the gauge length (common practice in exports), so it is the strain, below a column named strain.
      if (/\bextension\b|\bextensometer\b|\bext\b/.test(b) && !lengthUnit && sym('strain')) return 9;
      return 0;
    case 'force':
      if (/^f$/.test(b) && sym('force')) return 9;
      return /\bforce\b|\bload\b/.test(b) ? 10 + (/^(force|load)$/.test(b) ? 2 : 0) : 0;
    case 'extension': {
      if (/^(δl|∆l|dl|δ|∆)$/.test(b) && lengthUnit) return 9;
      if (/\bstrain\b/.test(b) && lengthUnit) return 9;
      // The machine's own travel (crosshead, stroke, actuator position) only when nothing better is there: it holds
      // the compliance of the machine and grips (isMachineTravel; the reader warns).
      if (isMachineTravel(c) && lengthUnit && !/\bextension\b|\bdisplacement\b|\belongation\b|\bextensometer\b|\bext\b|\bdeformation\b/.test(b)) return 3;
      if (!/\bextension\b|\bdisplacement\b|\belongation\b|\bextensometer\b|\bext\b|\bdeformation\b/.test(b)) return 0;
      if (/elongation/.test(b) && !lengthUnit && unitHint !== '') return 0;
      if (!lengthUnit && sym('strain')) return 0; // in a strain unit: the strain role takes it
      return 10 - (isMachineTravel(c) ? 6 : 0) + (/^(extension|displacement)$/.test(b) ? 2 : 0);
    }
    case 'time': return /^time\b|\btime$/.test(b) ? 10 : 0;
  }
}
