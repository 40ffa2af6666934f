import { describeColumn, isMachineTravel, roleScore, ROLES, type ColumnInfo, type Role } from './columns.js';
import { recordError, show } from './errors.js';
import { isNumberToken, ungrouped, type Layout } from './layout.js';
import { allowedUnits, AREA_UNITS, LENGTH_UNITS, normUnit, unitFactor } from './units.js';

/** Options of the record readers. Lengths in mm, areas in mm² unless a unit option says otherwise. */
export interface RecordOptions {
  /** Name used in messages (the file name). */
  file?: string;
  /** Field separator; ' ' for columns aligned by runs of spaces (a fixed-width export). Default: detected. */
  delimiter?: ',' | ';' | '\t' | ' ';
  decimal?: '.' | ',';
  /** Explicit column for a role: its header name or its 1-based number. */
  columns?: Partial<Record<Role, string | number>>;
  stressUnit?: string;
  forceUnit?: string;
  /** Unit of the extension column (mm or in). */
  lengthUnit?: string;
  /** 'fraction' or 'percent' (or '%'). */
  strainUnit?: string;
  /** Cross-section, mm²; or width × thickness, or diameter, mm. */
  area?: number;
  width?: number;
  thickness?: number;
  diameter?: number;
  /** Extensometer gauge length, mm. */
  gaugeLength?: number;
  /** The specimen's parallel length Lc, mm (used with the machine's travel as the extension). */
  parallelLength?: number;
}

/** A record read from a lab export, converted to engineering strain (fraction) and engineering stress (MPa). */
export interface TensileRecord {
  name: string;
  file: string;
  strain: Float64Array;
  stress: Float64Array;
  rows: number;
  /**
   * 'stress-strain' when the lab's stress and strain columns were used; 'force-strain' for a force column with a
   * strain column (the stress is force over the cross-section); else 'force-extension'.
   */
  basis: 'stress-strain' | 'force-strain' | 'force-extension';
  /**
   * The columns read for each role. `averagedWith`: a second channel of the same quantity whose mean with this one is
   * read (the two sides of an averaging extensometer, `Ext 1` and `Ext 2`).
   */
  columns: Partial<Record<Role, { name: string; column: number; unit: string; averagedWith?: { name: string; column: number } }>>;
  /** Cross-section (mm²) and gauge length (mm) used for a force–extension record; a force–strain record needs no gauge length (null). */
  geometry: { area: number; gaugeLength: number | null; parallelLength?: number } | null;
  /** Metadata lines before the header. */
  metadata: Map<string, { key: string; value: string; unit: string; line: number }>;
  /** How a strain column without a unit was read, by its largest value (more than 1: percent), or null when its unit was known. */
  strainUnitGuessed?: 'fraction' | 'percent' | null;
  /** True when the extension is the machine's own travel (crosshead, stroke), not an extensometer's (analyzeRecord's `machineTravel`). */
  machineTravel?: boolean;
  warnings: string[];
  layout: { delimiter: string; decimalComma: boolean; headerLine: number; unitsLine: number | null; dataLine: number };
  /**
   * For one of several tests in one file (the record starts over: testStarts in the core): which test, of how many,
   * and its first and last sample (0-based, in the file's data rows). Absent for a file that holds one test.
   */
  test?: { index: number; of: number; fromSample: number; toSample: number };
  /**
   * Where the samples are in the file: sample `sample` of each run is on line `line` (1-based) and the samples after
   * it on the lines after it, up to the next run's sample (a new run where lines were skipped: blank rows, a row of
   * empty cells). One run for most files; at most MAX_LINE_RUNS (then a last run of line −1: not placed).
   * {@link sampleLine} reads it.
   */
  lineRuns?: { sample: number; line: number }[];
}

/**
 * The file line (1-based) of sample `i` of `rec` (of its own samples: for one test of several in a file, `i` counts
 * from that test's first sample), from `rec.lineRuns`; undefined for an index outside the record (its `rows`) or a
 * record read from something other than a file of rows (no runs).
 * @example sampleLine({ lineRuns: [{ sample: 0, line: 26 }, { sample: 374, line: 401 }] }, 380) // 407
 */
export function sampleLine(rec: Partial<Pick<TensileRecord, 'lineRuns' | 'test' | 'rows'>>, i: number): number | undefined {
  const runs = rec.lineRuns;
  const k = i + (rec.test?.fromSample ?? 0);
  if (!runs?.length || !(i >= 0) || !Number.isInteger(i)) return undefined;
  if (rec.rows !== undefined && i >= rec.rows) return undefined;
  if (rec.test && i > rec.test.toSample - rec.test.fromSample) return undefined;
  let lo = 0, hi = runs.length - 1;
  if (k < runs[0]!.sample) return undefined;
  while (lo < hi) { const mid = (lo + hi + 1) >> 1; if (runs[mid]!.sample <= k) lo = mid; else hi = mid - 1; }
  return runs[lo]!.line < 0 ? undefined : runs[lo]!.line + (k - runs[lo]!.sample);
}

/**
 * Two averaged channels whose largest values differ by more than this factor are not two sides of one extensometer
 * (bending moves the sides apart by a few per cent of the strain, common practice; 1.5 leaves a wide margin).
 */
export const CHANNEL_RATIO = 1.5;

/**
 * Most line runs a record keeps (TensileRecord.lineRuns): a file with a blank line after every row (double-spaced)
 * would need one a row. Past this, the samples are no longer placed (sampleLine gives undefined for them).
 */
export const MAX_LINE_RUNS = 10_000;

/** Most data rows a record may have (memory bound: 16 bytes a row). */
export const MAX_ROWS = 50_000_000;
/** A strain beyond this (as a fraction) is not a tensile strain: the columns are likely swapped or the unit wrong. */
export const MAX_STRAIN = 5;

interface Plan {
  /** Stress and strain; force and extension; force and strain (the machine's strain channel, stress = force/area). */
  mode: 'ss' | 'fe' | 'fs';
  a: ColumnInfo; // strain or extension
  /** A second strain or extension channel read together with `a` (their mean): the other side of an averaging extensometer. */
  a2: ColumnInfo | null;
  b: ColumnInfo; // stress or force
  fa: number;    // factor to fraction (strain) or mm (extension)
  fb: number;    // factor to MPa (stress) or N (force)
  trueValues: boolean;
  area: number;
  gauge: number;
  /** The specimen's parallel length Lc, mm, where an option or a metadata line gives it (force–extension only). */
  parallel?: number;
}

/** Collects rows into growable typed arrays; validates every used cell with its line and column. */
/** Fewest rows of a tensile record. */
const MIN_ROWS = 10;
/**
 * Most consecutive rows with one of the pair lost (stress or strain empty or NaN beside the other) left out as lost
 * samples; a longer run is the error at its first row (a channel fault to look at, which may hide maximum force).
 */
const MAX_HALF_LOST_RUN = 10;
/** Most rows of numbers a results table in the footer may hold under its line of column names. */
const RESULTS_TABLE_ROWS = 20;
/** Most non-number rows read as a footer at the end of a record (more is not a footer: the file is not one record); rows with only the strain cell empty (extensometer taken off) are data, not footer. */
const MAX_FOOTER_ROWS = 1000;

export class RecordBuilder {
  private xs = new Float64Array(1024);
  private ys = new Float64Array(1024);
  private n = 0;
  private lastLine = 0;
  /** TensileRecord.lineRuns as the rows come. */
  private readonly lineRuns: { sample: number; line: number }[] = [];
  private readonly plan: Plan;
  private readonly columns: TensileRecord['columns'] = {};
  private readonly warnings: string[] = [];
  private readonly file: string;
  private readonly layout: Layout;
  private readonly width: number;
  private maxA = -Infinity;
  private maxALine = 0;
  /**
   * Rows are stored converted as they come (strain ×fa, stress ×fb) for a stress–strain record whose units are
   * known (not true values): `finish` then needs no conversion pass and no second pair of columns. The same
   * multiplications as convertColumns, so the same numbers (speed follow-up K).
   */
  private readonly early: boolean;
  private readonly fa: number;
  private readonly fb: number;
  /** Largest |stress| converted so far (early rows). */
  private maxS = 0;
  /**
   * The first row after the data that is not two numbers, kept while only such rows follow: a footer
   * ("Maximum;358.2", "End of test"), or a results table (a line of column names and up to RESULTS_TABLE_ROWS rows
   * of numbers under it; `table` counts the rows still allowed). Any other row of numbers after it makes it the
   * error it is.
   */
  private footer: { error: unknown; line: number; lastLine: number; rows: number; table: number; results: boolean; first: string } | null = null;
  /**
   * Rows whose strain cell is empty or NaN and stress a number, stored with the last strain held: at the end of the
   * data the extensometer taken off (kept, so the force still counts for Rm); followed by a strain again, lost strain
   * samples (taken back out, see resumeStrain).
   */
  private held: { error: unknown; line: number; lastLine: number; rows: number; nan: boolean } | null = null;
  /**
   * Rows inside the data with one of the pair lost (the stress empty or NaN beside a strain, or a short run of held
   * strains that a strain follows again): left out, said in finish with the columns that had no reading.
   */
  private halfLost: { line: number; lastLine: number; rows: number; cols: Set<string> } | null = null;
  /**
   * Rows with one of the pair lost (the stress empty or NaN beside a strain, or one side of an averaging extensometer
   * beside the other and a stress), since the last row with readings (`error`: the first one's; `cols`: the columns
   * that had no reading).
   */
  private pendingHalf: { error: unknown; line: number; lastLine: number; rows: number; cols: Set<string> } | null = null;
  /** Rows with no reading in any used column (empty or NaN cells; see push) between rows with readings: the first and last line and how many. */
  private lost: { line: number; lastLine: number; rows: number } | null = null;
  /** Such rows since the last row with readings (lost samples once another row comes, else rows after the data). */
  private pendingLost: { line: number; lastLine: number; rows: number } | null = null;
  /** Moves pendingLost into lost (and pendingHalf into halfLost): a row with readings came after them. */
  private settleLost(): void {
    const p = this.pendingLost;
    if (p) {
      if (this.lost) { this.lost.rows += p.rows; this.lost.lastLine = p.lastLine; } else this.lost = p;
      this.pendingLost = null;
    }
    const h = this.pendingHalf;
    if (h) {
      // A longer run of stresses lost beside strains is a channel fault, not a dropped sample: the first row's error.
      if (h.rows > MAX_HALF_LOST_RUN) throw h.error;
      this.noteHalfLost(h.line, h.lastLine, h.rows, h.cols);
      this.pendingHalf = null;
    }
  }

  private noteHalfLost(line: number, lastLine: number, rows: number, cols: Iterable<string>): void {
    const l = this.halfLost ??= { line, lastLine, rows: 0, cols: new Set() };
    l.rows += rows; l.line = Math.min(l.line, line); l.lastLine = Math.max(l.lastLine, lastLine);
    for (const c of cols) l.cols.add(c);
  }

  /**
   * A strain again after held rows (strain cells empty or NaN while the stress went on): those rows were lost strain
   * samples, not the extensometer's end. Up to MAX_HALF_LOST_RUN of them are taken back out of the record and said;
   * a longer run stays the error at its first row (a channel that stopped and came back is no dropped sample).
   */
  private resumeStrain(): void {
    const h = this.held;
    if (!h) return;
    if (h.rows > MAX_HALF_LOST_RUN) throw h.error;
    this.n -= h.rows;
    while (this.lineRuns.length > 0 && this.lineRuns[this.lineRuns.length - 1]!.sample >= this.n) this.lineRuns.pop();
    // The next sample starts a new line run (its line is past the rows taken out).
    this.lastLine = h.line - 1;
    this.noteHalfLost(h.line, h.lastLine, h.rows, [this.plan.a.name, ...(this.plan.a2 ? [this.plan.a2.name] : [])]);
    this.held = null;
  }
  /** How a strain column without a unit was read (by its largest value), or null when the unit was known. */
  private strainUnitGuessed: 'fraction' | 'percent' | null = null;
  private machineTravel = false;
  /** Two channels averaged: each one's value of largest magnitude so far (see {@link channels}). */
  private ch1 = 0;
  private ch2 = 0;

  constructor(layout: Layout, opts: RecordOptions) {
    this.file = opts.file ?? 'record';
    this.layout = layout;
    this.width = layout.header.length;
    this.plan = this.resolve(opts);
    const p = this.plan;
    this.early = p.mode === 'ss' && !p.trueValues && !Number.isNaN(p.fa);
    this.fa = p.fa;
    this.fb = p.fb;
  }

  private fail(line: number | undefined, col: number | undefined, field: string, msg: string): never {
    throw recordError(this.file, line, col, field, msg);
  }

  private resolve(opts: RecordOptions): Plan {
    const L = this.layout;
    const cols = L.header.map((h, i) => describeColumn(h, i));
    // Duplicate names are ambiguous.
    const seen = new Map<string, number>();
    for (const c of cols) {
      const k = c.name.trim().toLowerCase();
      if (k === '') continue;
      const prev = seen.get(k);
      if (prev !== undefined) this.fail(L.headerLine, c.index + 1, c.name, `duplicate column name ${show(c.name)} in columns ${prev + 1} and ${c.index + 1}; expected unique column names (or map columns explicitly)`);
      seen.set(k, c.index);
    }
    const unitOf = (c: ColumnInfo) => (L.units?.[c.index]?.trim() || c.unit || '');
    const pick = (role: Role): ColumnInfo | undefined => {
      const given = opts.columns?.[role];
      if (given !== undefined) {
        const c = typeof given === 'number' ? cols[given - 1] : cols.find((x) => x.name.trim().toLowerCase() === String(given).trim().toLowerCase());
        if (!c) this.fail(L.headerLine, undefined, `columns.${role}`, `no column ${show(String(given))}; the header has ${cols.map((x) => show(x.name)).join(', ')}`);
        return c;
      }
      let best: ColumnInfo | undefined;
      let bs = 0;
      const scores = cols.map((c) => roleScore(c, role, unitOf(c)));
      cols.forEach((c, i) => { if (scores[i]! > bs) { bs = scores[i]!; best = c; } });
      // Two channels of one kind (two extensometers, `Strain 1` and `Strain 2`): the first is read; say so.
      const alike = cols.filter((c, i) => bs > 0 && scores[i] === bs && c !== best);
      if (best && alike.length) tied.push({ role, used: best, others: alike });
      return best;
    };
    const tied: { role: Role; used: ColumnInfo; others: ColumnInfo[] }[] = [];
    const found: Partial<Record<Role, ColumnInfo>> = {};
    for (const r of ROLES) { const c = pick(r); if (c) found[r] = c; }
    const names = cols.map((x) => show(x.name)).join(', ');
    // Channels named only by their number (`Kanal 1 (MPa)`, `Channel 2 [%]`, `CH3 / kN`: many acquisition systems
    // export the channel, not the quantity) are read by their unit when the names give no pair of columns to read.
    const pairOf = (f: Partial<Record<Role, ColumnInfo>>) => (f.strain && f.stress && f.strain.index !== f.stress.index) || (f.force && (f.extension ?? f.strain) && f.force.index !== (f.extension ?? f.strain)!.index);
    let unitOnly = '';
    if (!pairOf(found)) {
      const r = rolesFromUnits(cols, found, unitOf, opts.columns);
      if (pairOf({ ...found, ...r.roles })) {
        Object.assign(found, r.roles);
        this.warnings.push(`${Object.keys(r.roles).length > 1 ? 'columns' : 'a column'} named by channel only, read by ${Object.keys(r.roles).length > 1 ? 'their units' : 'its unit'}: ${Object.entries(r.roles).map(([role, c]) => `${show(c!.name)} (column ${c!.index + 1}) as the ${role}`).join(', ')}; map columns with --column ROLE=NAME (or the record bench's column choices) if that is wrong`);
      } else unitOnly = r.clash;
    }
    let mode: 'ss' | 'fe' | 'fs';
    // A force column with the machine's strain channel (no stress column) is as common in exports as force with
    // extension: stress = force / cross-section, no gauge length needed. With both an extension and a strain column
    // the extension is read when the gauge length is known (as before), else the strain.
    const fs = !!(found.force && found.strain && found.force.index !== found.strain.index);
    if (found.strain && found.stress && found.strain.index !== found.stress.index) mode = 'ss';
    else if (found.force && found.extension && found.force.index !== found.extension.index && !(fs && this.geometryOf(opts).gauge === undefined)) mode = 'fe';
    else if (fs) mode = 'fs';
    else if (found.stress && !found.strain) this.fail(L.headerLine, found.stress.index + 1, 'strain', `no strain column (nor force and extension); the header has ${names}; expected a column named like "Strain [%]" or map it explicitly`);
    else if (found.strain && !found.stress) this.fail(L.headerLine, found.strain.index + 1, 'stress', `no stress column (nor a force column); the header has ${names}; expected a column named like "Stress [MPa]" or "Force [kN]", or map it explicitly`);
    else this.fail(L.headerLine, 1, 'columns', `no strain and stress columns, nor force and extension (or force and strain); the header has ${names}${unitOnly}; expected names such as strain, stress, force, extension (with units like [MPa], [%], [kN], [mm]) or an explicit column mapping`);
    const a = mode === 'fe' ? found.extension! : found.strain!;
    const b = mode === 'ss' ? found.stress! : found.force!;
    // Two channels of the strain (or extension), alike but for a channel mark and in one unit: the two sides of an
    // averaging extensometer. Their mean is read (it cancels the bending of a specimen gripped slightly off axis;
    // common practice, ISO 9513 and ASTM E83 extensometers average both sides — from memory), and said.
    let a2: ColumnInfo | null = null;
    for (const t of tied) {
      if (t.used !== a || t.others.length !== 1) continue;
      const o = t.others[0]!;
      if (opts.columns?.[mode === 'fe' ? 'extension' : 'strain'] === undefined && unitOf(o) === unitOf(a) && sameChannel(a, o)) a2 = o;
    }
    for (const t of tied) {
      if (t.used !== a && t.used !== b) continue;
      const role = t.used === a ? (mode === 'fe' ? 'extension' : 'strain') : (mode === 'ss' ? 'stress' : 'force');
      if (a2 && t.used === a) {
        this.warnings.push(`the mean of ${show(a.name)} (column ${a.index + 1}) and ${show(a2.name)} (column ${a2.index + 1}) is read as the ${role}: two channels of one quantity, as an averaging extensometer gives them (the two sides of the specimen; their mean cancels bending); map one with --column ${role}=NAME (or the record bench's ${role} column choice) to read it alone`);
        continue;
      }
      this.warnings.push(`${t.others.length + 1} columns could be the ${role}: ${show(t.used.name)} (column ${t.used.index + 1}) is read, ${t.others.map((c) => `${show(c.name)} (column ${c.index + 1})`).join(', ')} ${t.others.length > 1 ? 'are' : 'is'} not; map another with --column ${role}=NAME (or the record bench's ${role} column choice)`);
    }
    const unitCell = (c: ColumnInfo) => ({ line: L.units ? L.unitsLine! : L.headerLine, col: c.index + 1 });
    const factor = (q: 'stress' | 'force' | 'length' | 'strain', c: ColumnInfo, override: string | undefined): number => {
      const u = override ?? unitOf(c);
      if (u === '' && q !== 'strain') {
        if (q === 'stress') { this.warnings.push(`no unit for column ${show(c.name)}; read as MPa`); return 1; }
        this.fail(unitCell(c).line, unitCell(c).col, c.name, `no unit for the ${q} column; expected ${allowedUnits(q)} in the header (e.g. "${q === 'force' ? 'Force [kN]' : 'Extension [mm]'}"), a units row, or an option`);
      }
      const f = unitFactor(q, u === 'percent' ? '%' : u);
      if (f === undefined) this.fail(override !== undefined ? undefined : unitCell(c).line, override !== undefined ? undefined : unitCell(c).col, c.name, `unit ${show(u)} is not a ${q} unit; allowed ${allowedUnits(q)}`);
      return f;
    };
    let fa: number, fb: number, area = 0, gauge = 0, parallel: number | undefined;
    if (mode === 'ss' || mode === 'fs') {
      fb = mode === 'ss' ? factor('stress', b, opts.stressUnit) : factor('force', b, opts.forceUnit);
      const su = opts.strainUnit ?? unitOf(a);
      fa = su === '' ? NaN : factor('strain', a, opts.strainUnit === 'percent' ? '%' : opts.strainUnit);
      if (mode === 'fs') {
        const g = this.geometryOf(opts);
        if (g.area === undefined) {
          this.fail(L.headerLine, undefined, 'cross-section', `a force–strain record (force column ${show(b.name)}, strain column ${show(a.name)}) needs the cross-section (area, width × thickness, or diameter) to give stress; give options (--area, --diameter, --width and --thickness) or metadata lines such as "Diameter: 10 mm"`);
        }
        area = g.area;
      }
    } else {
      fb = factor('force', b, opts.forceUnit);
      fa = factor('length', a, opts.lengthUnit);
      ({ area, gauge } = this.geometry(opts));
      if (isMachineTravel(a)) {
        this.machineTravel = true;
        parallel = this.parallelLengthOf(opts, gauge);
        this.warnings.push(`${TRAVEL_WARNING} (column ${show(a.name)}), not an extensometer: it includes the compliance of the machine and grips, so E from it is too low and Rp0.2 and A are uncertain; give the specimen's modulus (--modulus, or the record bench's modulus field) and that compliance is taken out${parallel === undefined ? ', and its parallel length (--parallel-length, or a metadata line such as "Parallel length: 30 mm") and Ag and A are read over it' : ''}; or prefer an extensometer channel`);
      }
    }
    this.columns[mode === 'fe' ? 'extension' : 'strain'] = { name: a.name, column: a.index + 1, unit: unitOf(a), ...(a2 ? { averagedWith: { name: a2.name, column: a2.index + 1 } } : {}) };
    this.columns[mode === 'ss' ? 'stress' : 'force'] = { name: b.name, column: b.index + 1, unit: unitOf(b) };
    const trueValues = mode === 'ss' && a.isTrue && b.isTrue;
    if (trueValues) this.warnings.push('only true stress and true strain columns: converted to engineering values (s = σ/exp(ε), e = exp(ε) − 1); valid to maximum force only');
    return { mode, a, a2, b, fa, fb, trueValues, area, gauge, ...(parallel !== undefined ? { parallel } : {}) };
  }

  private geometry(o: RecordOptions): { area: number; gauge: number } {
    const { area, gauge } = this.geometryOf(o);
    if (area === undefined || gauge === undefined) {
      this.fail(this.layout.headerLine, undefined, area === undefined ? 'cross-section' : 'gaugeLength',
        `a force–extension record needs the cross-section (area, width × thickness, or diameter) and the gauge length; missing ${area === undefined ? 'the cross-section' : 'the gauge length'}: give options (--area, --diameter, --width and --thickness, --gauge-length) or metadata lines such as "Gauge length: 50 mm"`);
    }
    return { area, gauge };
  }

  /** Cross-section (mm²) and gauge length (mm) from the options, else the metadata lines; undefined where neither gives one (a malformed value is an error). */
  private geometryOf(o: RecordOptions): { area: number | undefined; gauge: number | undefined } {
    const md = this.layout.metadata;
    const find = (re: RegExp) => {
      for (const [k, v] of md) if (re.test(k)) return v;
      return undefined;
    };
    const num = (v: { value: string; unit: string; line: number; key: string } | undefined, table: Readonly<Record<string, number>>) => {
      if (!v) return undefined;
      const x = Number(v.value.replace(',', '.'));
      const u = normUnit(v.unit || 'mm');
      const f = Object.prototype.hasOwnProperty.call(table, u) ? table[u] : undefined;
      if (!Number.isFinite(x) || !(x > 0) || f === undefined) this.fail(v.line, 2, v.key, `got ${show(v.value + ' ' + v.unit)}, expected a positive number in ${table === AREA_UNITS ? 'mm² or in²' : 'mm or in'}`);
      return x * f;
    };
    const pos = (name: string, v: number | undefined) => {
      if (v !== undefined && !(Number.isFinite(v) && v > 0)) this.fail(undefined, undefined, name, `got ${v}, expected a positive number (mm or mm²)`);
      return v;
    };
    let area = pos('area', o.area);
    const d = pos('diameter', o.diameter), w = pos('width', o.width), t = pos('thickness', o.thickness);
    if (area === undefined && d !== undefined) area = (Math.PI / 4) * d * d;
    if (area === undefined && w !== undefined && t !== undefined) area = w * t;
    // Keys as exports write them (ISO 6892-1 symbols S0, d0, b0, a0, L0, Le, with a capital O for the zero as some
    // exports type it; ASTM E8's "gage"; common practice otherwise).
    // German keys as German test reports write them (Querschnitt, Durchmesser, Breite, Dicke, Messlänge; plain German
    // words, common practice), with or without the Anfangs- (initial) prefix.
    if (area === undefined) area = num(find(/^(original |specimen |initial )?(cross[ -]?section(al)?( area)?|area)$|^s[0o]$|^(anfangs)?querschnitt(sfläche)?$/), AREA_UNITS);
    if (area === undefined) { const dd = num(find(/diameter|^d[0o]$|^(anfangs)?durchmesser$/), LENGTH_UNITS); if (dd !== undefined) area = (Math.PI / 4) * dd * dd; }
    if (area === undefined) {
      const ww = num(find(/^(original |specimen |initial )?width$|^b[0o]$|^(anfangs|proben)?breite$/), LENGTH_UNITS), tt = num(find(/^(original |specimen |initial )?thickness$|^a[0o]$|^(anfangs|proben)?dicke$/), LENGTH_UNITS);
      if (ww !== undefined && tt !== undefined) area = ww * tt;
    }
    let gauge = pos('gaugeLength', o.gaugeLength);
    if (gauge === undefined) gauge = num(find(/ga(u)?ge length|^(original |initial )?ga(u)?ge$|^l[0o]$|^le$|extensometer (gauge |gage )?length|^(anfangs)?messlänge$/), LENGTH_UNITS);
    return { area, gauge };
  }

  /**
   * The specimen's parallel length Lc (mm) from the option, else a metadata line ("Parallel length", "Lc", ASTM E8's
   * "Length of reduced section", "Versuchslänge" as German reports write ISO 6892-1's term; common practice);
   * undefined where neither gives one.
   */
  private parallelLengthOf(o: RecordOptions, gauge: number): number | undefined {
    // The parallel length holds the gauge length (ISO 6892-1 §3.2, common practice): at least L0, at most 10 L0.
    const want = `a length in mm from the gauge length (${+gauge.toPrecision(6)} mm) to 10 times it`;
    if (o.parallelLength !== undefined) {
      if (!(Number.isFinite(o.parallelLength) && o.parallelLength >= gauge && o.parallelLength <= 10 * gauge)) this.fail(undefined, undefined, 'parallelLength', `got ${o.parallelLength}, expected ${want}`);
      return o.parallelLength;
    }
    for (const [k, v] of this.layout.metadata) {
      if (!/^(specimen |original )?parallel length$|^lc$|^(length of )?reduced section( length)?$|^(parallele länge|parallellänge|versuchslänge)$/.test(k)) continue;
      const x = Number(v.value.replace(',', '.'));
      const u = normUnit(v.unit || 'mm');
      const f = Object.prototype.hasOwnProperty.call(LENGTH_UNITS, u) ? LENGTH_UNITS[u] : undefined;
      const mm = f === undefined ? NaN : x * f;
      if (!(mm >= gauge && mm <= 10 * gauge)) this.fail(v.line, 2, v.key, `got ${show(v.value + ' ' + v.unit)}, expected ${want}`);
      return mm;
    }
    return undefined;
  }

  /** Parses one number cell; errors name the line, the column and what was expected. */
  private cell(f: string[], c: ColumnInfo, line: number): number {
    const raw = f[c.index];
    if (raw === undefined) this.fail(line, c.index + 1, c.name, `the row has ${f.length} field${f.length === 1 ? '' : 's'}; expected ${this.width} as in the header (line ${this.layout.headerLine})`);
    let t = raw.trim();
    if (this.layout.decimalComma) t = t.replace(',', '.');
    if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) {
      const g = ungrouped(raw.trim(), this.layout.decimalComma);
      if (g !== null) return g;
      if (/^[+-]?(nan|inf|infinity)$/i.test(t)) this.fail(line, c.index + 1, c.name, `got ${show(raw)}, expected a finite number`);
      if (/^[+-]?\d{1,3}(,\d{3})+$/.test(raw.trim())) this.fail(line, c.index + 1, c.name, `got ${show(raw)}: a thousands separator or a decimal comma? expected a number; export the column without thousands separators (or with decimals, such as "1,205.0")`);
      this.fail(line, c.index + 1, c.name, `got ${show(raw)}, expected a number${this.layout.decimalComma ? ' with a decimal comma' : ''}`);
    }
    const v = Number(t);
    if (!Number.isFinite(v)) this.fail(line, c.index + 1, c.name, `got ${show(raw)}, expected a finite number`);
    return v;
  }

  /** Adds one data row (fields as split by the CSV reader) found at 1-based `line`. */
  push(f: string[], line: number): void {
    // An empty line, or a row of empty cells (only delimiters, as spreadsheets export blank rows), is no row.
    if (f.every((c) => c.trim() === '')) return;
    const { a, a2, b } = this.plan;
    // A lost sample: every used cell empty or NaN while other columns (time, crosshead) were written. No reading to
    // keep; left out and said in finish (it had ended the data as a "footer" and then failed on the next row).
    if (this.n >= MIN_ROWS && noReading(f[a.index]) && (!a2 || noReading(f[a2.index])) && noReading(f[b.index])) {
      // Pending until a row with readings follows (then lost samples inside the record) or the file ends (then rows
      // after the test, such as a machine that logs on after fracture).
      this.pendingLost ??= { line, lastLine: line, rows: 0 };
      this.pendingLost.rows++;
      this.pendingLost.lastLine = line;
      return;
    }
    // One of the pair lost: the stress cell empty or NaN beside a strain (the row has the cell: a row cut short is
    // the located error below). No sample without a stress; left out and said, as a lost sample.
    // So is one side of an averaging extensometer lost beside the other and a stress (the mean needs both sides; one
    // side alone is bent by the specimen's bending).
    // A reading beside the lost cell must be a number (a text row such as "End of test," is a footer, below).
    const reading = (c: string | undefined) => c !== undefined && isNumberToken(c.trim(), this.layout.decimalComma) && !/^[+-]?(nan|inf|infinity)$/i.test(c.trim());
    const sideLost = a2 && reading(f[b.index]) && (reading(f[a.index]) ? noReading(f[a2.index]) : reading(f[a2.index]) && noReading(f[a.index])) ? (reading(f[a.index]) ? a2 : a) : null;
    if (this.n >= MIN_ROWS && !this.footer && (sideLost || (noReading(f[b.index]) && reading(f[a.index]) && (!a2 || reading(f[a2.index]))))) {
      this.resumeStrain();
      const col = sideLost ?? b;
      let error: unknown = null;
      try { this.cell(f, col, line); } catch (e) { error = e; }
      this.pendingHalf ??= { error, line, lastLine: line, rows: 0, cols: new Set() };
      this.pendingHalf.rows++;
      this.pendingHalf.lastLine = line;
      this.pendingHalf.cols.add(col.name);
      return;
    }
    let x: number, y: number;
    try {
      x = this.cell(f, a, line);
      if (a2) { const x2 = this.cell(f, a2, line); this.channels(x, x2); x = 0.5 * (x + x2); }
      y = this.cell(f, b, line);
    } catch (e) {
      // An extensometer taken off: after the record's first rows, the strain cell empty and the stress a number.
      // The row keeps the strain's last value (as a machine that holds the reading would write it), so the force
      // after it still counts for Rm; the analysis finds where the strain stopped (extensometerEnd) and reads Ag
      // and A before it.
      if (this.n >= MIN_ROWS && !this.footer && noReading(f[a.index]) && (!a2 || noReading(f[a2.index])) && (f[b.index] ?? '').trim() !== '') {
        let held: number | null = null;
        try { held = this.cell(f, b, line); } catch { /* not a number: a footer row, below */ }
        if (held !== null) {
          this.held ??= { error: e, line, lastLine: line, rows: 0, nan: false };
          if ((f[a.index] ?? '').trim() !== '') this.held.nan = true;
          this.held.rows++;
          this.held.lastLine = line;
          this.settleLost();
          this.pushHeld(held, line);
          return;
        }
      }
      // Before a record of at least MIN_ROWS rows the row is an error; after it, a footer candidate.
      if (this.n < MIN_ROWS || (this.footer && this.footer.rows === MAX_FOOTER_ROWS)) throw this.footer?.error ?? e;
      this.footer ??= { error: e, line, lastLine: line, rows: 0, table: 0, results: false, first: f.map((c) => c.trim()).filter((c) => c !== '').join(' ') };
      this.footer.rows++;
      this.footer.lastLine = line;
      // A line of column names in the footer opens a results table ("Rp0.2 [MPa],Rm [MPa],A [%]"): a few rows of
      // numbers may follow it (below).
      const cells = f.map((c) => c.trim()).filter((c) => c !== '');
      if (cells.length >= 2 && cells.every((c) => !isNumberToken(c, this.layout.decimalComma))) { this.footer.table = RESULTS_TABLE_ROWS; this.footer.results = true; }
      return;
    }
    // Numbers after a footer: a few rows under a results table's column names are part of the footer (a summary the
    // machine appends, common practice); anything else — numbers again after a bad line, the rest of the curve —
    // makes the footer's first line the error it is, so a bad cell in the middle of the data is never skipped.
    if (this.footer && this.footer.table > 0) {
      this.footer.table--;
      this.footer.rows++;
      this.footer.lastLine = line;
      return;
    }
    // Numbers after a footer, or a strain again after empty strain cells: the first of those rows is the error.
    if (this.footer) throw this.footer.error;
    this.resumeStrain();
    this.settleLost();
    this.pushValues(x, y, line);
  }

  /**
   * What the fast row scanner needs: the 0-based columns of the two values, the header's width and
   * the decimal mark. Cells it cannot read as the located reader would are left to that reader.
   */
  get cells(): { a: number; a2: number; b: number; width: number; decimalComma: boolean; delimiter: string; dataLine: number; fa: number; fb: number } {
    return {
      a: this.plan.a.index, a2: this.plan.a2 ? this.plan.a2.index : -1, b: this.plan.b.index, width: this.width, decimalComma: this.layout.decimalComma, delimiter: this.layout.delimiter, dataLine: this.layout.dataLine,
      // The factors rows are stored with (see `early`; 1 when the builder converts in finish): for pushStored.
      fa: this.early ? this.fa : 1, fb: this.early ? this.fb : 1,
    };
  }

  /**
   * Makes room for `rows` rows in all (a reader that can estimate the count from the file size calls
   * it once, so the columns are not grown by doubling and copying: less garbage on large records).
   * Never more than MAX_ROWS; never shrinks.
   */
  reserve(rows: number): void {
    const want = Math.min(MAX_ROWS, Math.floor(rows));
    if (!(want > this.xs.length)) return;
    const nx = new Float64Array(want); nx.set(this.xs.subarray(0, this.n)); this.xs = nx;
    const ny = new Float64Array(want); ny.set(this.ys.subarray(0, this.n)); this.ys = ny;
  }

  /** Rows added so far. */
  get rowCount(): number {
    return this.n;
  }

  /** Adds a row whose strain cell was empty: the last strain as stored, the stress `y` as pushValues stores it. */
  private pushHeld(y: number, line: number): void {
    if (this.n === this.xs.length) {
      if (this.n >= MAX_ROWS) this.fail(line, 1, '', `more than ${MAX_ROWS} data rows; split the record`);
      this.reserve(this.n * 2);
    }
    if (line !== this.lastLine + 1) this.newRun(this.n, line);
    this.xs[this.n] = this.xs[this.n - 1]!;
    const sy = this.early ? y * this.fb : y;
    this.ys[this.n] = sy;
    if (this.early) this.maxS = Math.max(this.maxS, Math.abs(sy));
    this.n++;
    this.lastLine = line;
  }

  /** A new line run from sample `sample` at `line`; past MAX_LINE_RUNS one last run of line −1 (not placed), then none. */
  private newRun(sample: number, line: number): void {
    const k = this.lineRuns.length;
    if (k < MAX_LINE_RUNS) this.lineRuns.push({ sample, line });
    else if (k === MAX_LINE_RUNS) this.lineRuns.push({ sample, line: -1 });
  }

  /** Adds the two numbers of one data row found at 1-based `line` (already checked as {@link push} checks cells). */
  /**
   * Notes one row's two averaged channels (`a` and `a2`) before their mean is pushed: finish refuses a pair that does
   * not read one quantity (its largest values of opposite sign or more than CHANNEL_RATIO apart).
   */
  channels(x1: number, x2: number): void {
    if (Math.abs(x1) > Math.abs(this.ch1)) this.ch1 = x1;
    if (Math.abs(x2) > Math.abs(this.ch2)) this.ch2 = x2;
  }

  pushValues(x: number, y: number, line: number): void {
    if (this.n === this.xs.length) {
      if (this.n >= MAX_ROWS) this.fail(line, 1, '', `more than ${MAX_ROWS} data rows; split the record`);
      const nx = new Float64Array(this.n * 2); nx.set(this.xs); this.xs = nx;
      const ny = new Float64Array(this.n * 2); ny.set(this.ys); this.ys = ny;
    }
    if (this.early) {
      const sy = y * this.fb;
      this.xs[this.n] = x * this.fa;
      this.ys[this.n] = sy;
      this.maxS = Math.max(this.maxS, Math.abs(sy));
    } else {
      this.xs[this.n] = x;
      this.ys[this.n] = y;
    }
    if (Math.abs(x) > this.maxA) { this.maxA = Math.abs(x); this.maxALine = line; }
    if (this.n === 0 || line !== this.lastLine + 1) this.newRun(this.n, line);
    this.n++;
    this.lastLine = line;
  }

  /**
   * Adds `count` rows at once that the caller has already multiplied by the factors of {@link cells} (`fa`, `fb`:
   * strain x·fa and stress y·fb, the multiplications pushValues makes), with what pushValues would track over
   * them: the largest |raw x| (> the builder's, first row wins) and its line, the largest |stored y|, the last
   * line. The values are copied with `set` (no loop in the engine's slow tiers). `lines` (the rows' lines) is read
   * only when the rows would pass MAX_ROWS, to name the row there. Same columns as `count` calls of pushValues.
   */
  pushStored(xs: Float64Array, ys: Float64Array, lines: Float64Array, count: number, maxA: number, maxALine: number, maxS: number, lastLine: number): void {
    if (count <= 0) return;
    if (this.n + count > this.xs.length) {
      if (this.n + count > MAX_ROWS) {
        const at = Math.max(0, MAX_ROWS - this.n);
        this.fail(lines[at]!, 1, '', `more than ${MAX_ROWS} data rows; split the record`);
      }
      this.reserve(Math.max(this.xs.length * 2, this.n + count));
    }
    // Lines skipped inside the batch (its lines not consecutive) or before it: new runs. The lines only increase, so a
    // batch whose last line is count − 1 after its first has no gap (the usual case: no pass over the lines).
    if (this.n === 0 || lines[0] !== this.lastLine + 1) this.newRun(this.n, lines[0]!);
    if (lastLine - lines[0]! !== count - 1 && this.lineRuns.length <= MAX_LINE_RUNS) {
      for (let j = 1; j < count; j++) if (lines[j] !== lines[j - 1]! + 1) this.newRun(this.n + j, lines[j]!);
    }
    this.xs.set(xs.subarray(0, count), this.n);
    this.ys.set(ys.subarray(0, count), this.n);
    this.n += count;
    if (maxA > this.maxA) { this.maxA = maxA; this.maxALine = maxALine; }
    if (this.early) this.maxS = Math.max(this.maxS, maxS);
    this.lastLine = lastLine;
  }

  /** The record: converted, checked for swapped columns and too few rows. */
  finish(name: string): TensileRecord {
    const L = this.layout;
    const p = this.plan;
    if (this.n === 0) this.fail(L.dataLine, 1, '', 'no data rows; expected rows of numbers after the header');
    if (this.n < MIN_ROWS) this.fail(this.lastLine, 1, '', `${this.n === 1 ? 'a single data row' : `only ${this.n} data rows`}; expected a tensile record of at least ${MIN_ROWS} rows`);
    const ft = this.footer;
    if (ft) {
      const why = (ft.error as { problems?: { message: string }[] }).problems?.[0]?.message ?? String(ft.error);
      const span = ft.rows === 1 ? `line ${ft.line}` : `lines ${ft.line}–${ft.lastLine}`;
      this.warnings.push(ft.results
        ? `${span} after the data hold a results table (from ${show(ft.first.slice(0, 40))}): read as a footer and left out; the record ends at line ${this.lastLine}`
        : `${span} after the data ${ft.rows === 1 ? 'is not a row' : 'are not rows'} of numbers (first: ${why}): read as a footer and left out; the record ends at line ${this.lastLine}`);
    }
    if (p.a2) {
      // Two sides of one extensometer agree to within the bending of the specimen (a few per cent); a pair whose largest
      // values differ in sign or by more than CHANNEL_RATIO is two quantities (an axial and a transverse strain, say).
      const [u, v] = [Math.abs(this.ch1), Math.abs(this.ch2)];
      if (this.ch1 * this.ch2 <= 0 || Math.max(u, v) > CHANNEL_RATIO * Math.min(u, v)) {
        this.fail(L.headerLine, p.a2.index + 1, p.a2.name, `${show(p.a.name)} and ${show(p.a2.name)} look like two channels of one extensometer, but their largest values (${+this.ch1.toPrecision(4)} and ${+this.ch2.toPrecision(4)}) ${this.ch1 === 0 || this.ch2 === 0 ? 'show one of them reading zero throughout' : this.ch1 * this.ch2 < 0 ? 'differ in sign' : `differ by more than ${CHANNEL_RATIO}×`}: not the two sides of one specimen; map the axial one with --column ${p.mode === 'fe' ? 'extension' : 'strain'}=NAME (or the record bench's column choice)`);
      }
    }
    const lo = this.lost, tr = this.pendingLost;
    const cols = [p.a, ...(p.a2 ? [p.a2] : []), p.b].map((c) => show(c.name)).join(', ');
    if (lo) this.warnings.push(`${lo.rows === 1 ? `line ${lo.line} holds` : `${lo.rows} rows from line ${lo.line} to line ${lo.lastLine} hold`} no reading in ${cols} (empty or NaN, the other columns written): left out as lost samples; check the export if there are many`);
    const hl = this.halfLost;
    if (hl) this.warnings.push(`${hl.rows === 1 ? `line ${hl.line} holds` : `${hl.rows} rows between line ${hl.line} and line ${hl.lastLine} hold`} no reading in ${[...hl.cols].map(show).join(' or ')} (empty or NaN) beside a reading in the other column: left out as lost samples (a sample needs both); check the export if there are many`);
    const ph = this.pendingHalf;
    if (ph) this.warnings.push(`${ph.rows === 1 ? `line ${ph.line} after the data holds` : `lines ${ph.line}–${ph.lastLine} after the data hold`} no reading in ${[...ph.cols].map(show).join(' or ')} (empty or NaN): left out; the record ends at line ${this.lastLine}`);
    if (tr) this.warnings.push(`${tr.rows === 1 ? `line ${tr.line} after the data holds` : `lines ${tr.line}–${tr.lastLine} after the data hold`} no reading in ${cols} (empty or NaN, the other columns written, as a machine that logs on after the test): left out; the record ends at line ${this.lastLine}`);
    const hd = this.held;
    if (hd) {
      this.warnings.push(`the ${p.mode === 'fe' ? 'extension' : 'strain'} column ${show(p.a.name)} is ${hd.nan ? 'NaN' : 'empty'} from line ${hd.line} to ${hd.lastLine === this.lastLine ? 'the end' : `line ${hd.lastLine}`} (${hd.rows} rows; extensometer taken off?): its last value is held there, so the force still counts for Rm; properties that need strain are read where it still changes`);
    }
    let fa = p.fa;
    if (Number.isNaN(fa)) {
      fa = this.maxA > 1 ? 0.01 : 1;
      this.warnings.push(`no unit for strain column ${show(p.a.name)}; read as ${fa === 1 ? 'a fraction' : 'percent'} because its largest value is ${+this.maxA.toPrecision(6)}`);
      this.strainUnitGuessed = fa === 1 ? 'fraction' : 'percent';
    }
    const n = this.n;
    let strain: Float64Array, stress: Float64Array, maxS: number;
    if (this.early) {
      // Already converted: views of the columns' filled part. Not copies: a fresh 16 MB pair costs a page fault per
      // 4 KiB on first touch (about 0.25 ms per MB on the benchmark machine); the spare capacity the views leave in
      // their buffers is at most the reader's 2 % estimate margin plus 1024 rows (or a doubling for a reader that
      // could not estimate the row count; then the filled part is copied when more than a quarter would be spare).
      const keep = n >= 0.75 * this.xs.length;
      strain = keep ? this.xs.subarray(0, n) : this.xs.slice(0, n);
      stress = keep ? this.ys.subarray(0, n) : this.ys.slice(0, n);
      maxS = this.maxS;
    } else {
      strain = new Float64Array(n);
      stress = new Float64Array(n);
      maxS = convertColumns(this.xs, this.ys, n, p, fa, strain, stress);
    }
    const maxE = this.maxA * fa / (p.mode === 'fe' ? p.gauge : 1);
    if (maxE > MAX_STRAIN) {
      this.fail(this.maxALine, p.a.index + 1, p.a.name, `reaches ${this.maxA} — not a ${p.mode === 'fe' ? 'extension' : 'strain'} of a tensile test (expected at most ${MAX_STRAIN * 100} %); are the ${p.mode === 'ss' ? 'strain and stress' : p.mode === 'fs' ? 'strain and force' : 'extension and force'} columns swapped, or is the unit wrong?`);
    }
    if (!(maxS > 0)) this.fail(L.dataLine, p.b.index + 1, p.b.name, 'every stress is 0; expected a loaded specimen');
    // Tension recorded as negative (a machine or channel set up with compression positive): a column whose values
    // are nearly all negative is read with its sign reversed, and the warning names it.
    const flipped: string[] = [];
    if (mostlyNegative(stress)) { negate(stress); flipped.push(show(p.b.name)); }
    if (mostlyNegative(strain)) { negate(strain); flipped.push(show(p.a.name)); }
    if (flipped.length) this.warnings.push(`${flipped.join(' and ')} ${flipped.length > 1 ? 'are' : 'is'} negative almost throughout (tension recorded as negative, a compression-positive sign convention): read with the sign reversed, as tension`);
    return {
      name, file: this.file, strain, stress, rows: n,
      basis: p.mode === 'ss' ? 'stress-strain' : p.mode === 'fs' ? 'force-strain' : 'force-extension',
      columns: this.columns,
      geometry: p.mode === 'fe' ? { area: p.area, gaugeLength: p.gauge, ...(p.parallel !== undefined ? { parallelLength: p.parallel } : {}) } : p.mode === 'fs' ? { area: p.area, gaugeLength: null } : null,
      metadata: L.metadata,
      strainUnitGuessed: this.strainUnitGuessed,
      ...(this.machineTravel ? { machineTravel: true } : {}),
      warnings: this.warnings,
      layout: { delimiter: L.delimiter, decimalComma: L.decimalComma, headerLine: L.headerLine, unitsLine: L.unitsLine, dataLine: L.dataLine },
      lineRuns: this.lineRuns,
    };
  }
}

/** How the reader's warning about the machine's travel starts ({@link readingWarnings} finds it by this). */
const TRAVEL_WARNING = "extension from the machine's travel";

/**
 * A record's reading warnings as shown beside its analysis: once the analysis took the machine's compliance out with a
 * given modulus (its `machineCompliance` warning says how), the reader's advice to give the modulus and the parallel
 * length is cut back to the fact it states — the extension is the machine's travel, from that column.
 * @example readingWarnings(rec, analysis) // ['extension from the machine\'s travel (column "Crosshead"), not an extensometer']
 */
export function readingWarnings(rec: Pick<TensileRecord, 'warnings' | 'machineTravel'>, analysis: { warnings: readonly { code: string }[] } | null | undefined): string[] {
  if (!rec.machineTravel || !analysis?.warnings.some((w) => w.code === 'machineCompliance')) return rec.warnings;
  return rec.warnings.map((w) => (w.startsWith(TRAVEL_WARNING) && w.includes(': it includes') ? w.slice(0, w.indexOf(': it includes')) : w));
}

/**
 * What a record says about how to analyse it, as analyzeRecord's options: a strain from the machine's travel
 * (`machineTravel`) and, where the gauge length and the parallel length are both known, the two lengths its plastic
 * part is spread over (`travelLengths`; they act only with a given modulus). Empty for an extensometer's record.
 * @example travelOptions({ machineTravel: true, geometry: { area: 19.6, gaugeLength: 25, parallelLength: 30 } }) // { machineTravel: true, travelLengths: { gaugeLength: 25, parallelLength: 30 } }
 */
export function travelOptions(rec: Pick<TensileRecord, 'machineTravel' | 'geometry'>): { machineTravel?: true; travelLengths?: { gaugeLength: number; parallelLength: number } } {
  if (!rec.machineTravel) return {};
  const g = rec.geometry;
  return g && g.gaugeLength !== null && g.parallelLength !== undefined ? { machineTravel: true, travelLengths: { gaugeLength: g.gaugeLength, parallelLength: g.parallelLength } } : { machineTravel: true };
}

/**
 * An empty or NaN cell: no reading. A cell the row does not have (a short row: a footer line, a line cut short) is
 * not one — such a row goes on to the footer rules and, inside the data, to the located error.
 */
function noReading(c: string | undefined): boolean {
  return c !== undefined && /^\s*([+-]?nan)?\s*$/i.test(c);
}

/**
 * A hint for an impossible E measured on a record whose strain unit was guessed: the factor 100 between a fraction
 * and percent moves E by 100, so an E a hundred times too small (or large) is most likely that guess. The hint
 * names the option and the E it would give; null when the guess does not explain E.
 * @example strainUnitHint({ strainUnitGuessed: 'fraction' }, 2050) // "… give --strain-unit percent … E 205 GPa …"
 */
export function strainUnitHint(rec: Pick<TensileRecord, 'strainUnitGuessed'>, measuredE: number): string | null {
  const g = rec.strainUnitGuessed;
  if (!g || !(measuredE > 0)) return null;
  const other = g === 'fraction' ? measuredE * 100 : measuredE / 100;
  if (!(other >= 40000 && other <= 450000)) return null;
  return `the strain column has no unit and was read as ${g === 'fraction' ? 'a fraction' : 'percent'}; if it is in ${g === 'fraction' ? 'percent' : 'fractions'}, give --strain-unit ${g === 'fraction' ? 'percent' : 'fraction'} (or the record bench's strain unit): E would be ${(other / 1000).toFixed(0)} GPa`;
}

/**
 * True when at least 90 % of the nonzero values among up to 2001 evenly spaced samples of `a` are negative (a
 * tension record whose sign convention is compression-positive; a tensile record's own negative values — a toe,
 * the noise about zero before loading or after fracture — are a few percent of it).
 */
function mostlyNegative(a: Float64Array): boolean {
  const step = Math.max(1, Math.floor(a.length / 2000));
  let neg = 0, nonzero = 0;
  for (let i = 0; i < a.length; i += step) {
    const v = a[i]!;
    if (v !== 0) { nonzero++; if (v < 0) neg++; }
  }
  return nonzero >= 5 && neg >= 0.9 * nonzero;
}

function negate(a: Float64Array): void {
  for (let i = 0; i < a.length; i++) a[i] = -a[i]!;
}

/**
 * Engineering strain (fraction) and stress (MPa) of n read rows into `strain` and `stress`: ×fa and
 * ×fb for a stress–strain record (true values converted, s = σ/exp(ε), e = exp(ε) − 1), extension
 * ×fa / gauge length and force ×fb / area for a force–extension record. Returns the largest |stress|.
 * A function of its own (not a loop in `finish`, which runs once per record) so the engine
 * optimises the loop at once (bench/RESULTS.md, issue 12 E).
 */
function convertColumns(xs: Float64Array, ys: Float64Array, n: number, p: Plan, fa: number, strain: Float64Array, stress: Float64Array): number {
  let maxS = 0;
  const fb = p.fb, gauge = p.gauge, area = p.area;
  if (p.mode === 'ss' && !p.trueValues) {
    for (let i = 0; i < n; i++) {
      const s = ys[i]! * fb;
      strain[i] = xs[i]! * fa;
      stress[i] = s;
      maxS = Math.max(maxS, Math.abs(s));
    }
    return maxS;
  }
  for (let i = 0; i < n; i++) {
    let e: number, s: number;
    if (p.mode === 'ss') {
      e = xs[i]! * fa;
      s = ys[i]! * fb;
      if (p.trueValues) { s = s / Math.exp(e); e = Math.expm1(e); }
    } else if (p.mode === 'fs') {
      e = xs[i]! * fa;
      s = (ys[i]! * fb) / area;
    } else {
      e = (xs[i]! * fa) / gauge;
      s = (ys[i]! * fb) / area;
    }
    strain[i] = e;
    stress[i] = s;
    maxS = Math.max(maxS, Math.abs(s));
  }
  return maxS;
}

/**
 * True when two columns name one quantity on two channels: their names, lower case, are the same but for a channel
 * mark at the end or the start (a number, a letter A/B or L/R, left/right, front/back, top/bottom, upper/lower, side),
 * as `Extensometer 1` and `Extensometer 2`, `Strain A` and `Strain B`, `Left extension` and `Right extension`.
 */
export function sameChannel(a: ColumnInfo, b: ColumnInfo): boolean {
  const MARK = '(?:\\d+|[abcdlr]|left|right|front|back|top|bottom|upper|lower|side [ab12])';
  const strip = (s: string) => s.replace(new RegExp(`(?:(?:^|\\s)(?:ch(?:annel)? ?)?${MARK}|\\d+)$`), '').replace(new RegExp(`^${MARK}\\s`), '').trim();
  const x = strip(a.base), y = strip(b.base);
  return x !== '' && x === y && a.base !== b.base;
}

/**
 * Roles of columns that no name reads (a score of 0 for every role: `Kanal 1`, `Channel 2`, `CH3`, `Input 4`), from
 * their units alone: a stress unit (MPa, ksi…) the stress, a force unit the force, a strain unit other than a bare
 * fraction mark (%, mm/mm, µε…) the strain, a length unit the extension, s or min the time. A role is filled only
 * where no column was found for it by name or mapped, and only when exactly one such column has its unit; `clash`
 * says (for the error) where two or more had.
 */
function rolesFromUnits(cols: readonly ColumnInfo[], found: Partial<Record<Role, ColumnInfo>>, unitOf: (c: ColumnInfo) => string, mapped: RecordOptions['columns']): { roles: Partial<Record<Role, ColumnInfo>>; clash: string } {
  const taken = new Set(Object.values(found).map((c) => c!.index));
  const generic = cols.filter((c) => !taken.has(c.index) && ROLES.every((r) => roleScore(c, r, unitOf(c)) === 0));
  const roleOf = (u: string): Role | null => {
    if (u === '') return null;
    if (unitFactor('stress', u) !== undefined) return 'stress';
    if (unitFactor('force', u) !== undefined) return 'force';
    if (!/^(-|1|fraction)$/i.test(normUnit(u)) && unitFactor('strain', u) !== undefined) return 'strain';
    if (unitFactor('length', u) !== undefined) return 'extension';
    return /^(s|sec|min)$/i.test(normUnit(u)) ? 'time' : null;
  };
  const by = new Map<Role, ColumnInfo[]>();
  for (const c of generic) { const r = roleOf(unitOf(c)); if (r) by.set(r, [...(by.get(r) ?? []), c]); }
  const roles: Partial<Record<Role, ColumnInfo>> = {};
  const clashes: string[] = [];
  for (const [r, cs] of by) {
    if (found[r] || mapped?.[r] !== undefined) continue;
    if (cs.length === 1) roles[r] = cs[0]!;
    else clashes.push(`${cs.map((c) => show(c.name)).join(' and ')} are each in a ${r} unit`);
  }
  return { roles, clash: clashes.length ? ` (${clashes.join('; ')}: map the one to read with --column ROLE=NAME, or the record bench's column choices)` : '' };
}
