import { describe, expect, it } from 'vitest';
import { describeColumn, parseRecordText, unitFactor } from '../../src/records/index.js';
import { expectRelClose } from '../helpers.js';

// Column names and units as lab exports write them. Factors: NIST SP 811 (2008), Appendix B.8
// (1 lbf = 4.448222 N, 1 in = 25.4 mm exactly, 1 ksi = 6.894757 MPa); 1 µε = 1e-6 (SI prefix micro);
// N/mm² = MPa (SI). Name patterns are common practice of testing-machine exports.
describe('describeColumn(name) reads the unit from the usual brackets and separators', () => {
  const cases: [string, string, string][] = [
    ['Strain [in/in]', 'strain', 'in/in'],
    ['Strain (mm/mm)', 'strain', 'mm/mm'],
    ['strain_in_per_in', 'strain', 'in/in'],
    ['Strain mm per mm', 'strain', 'mm/mm'],
    ['Strain [µε]', 'strain', 'µε'],
    ['Strain {%}', 'strain', '%'],
    ['Stress [MPa]', 'stress', 'MPa'],
    ['Stress (ksi)', 'stress', 'ksi'],
    ['Stress <N/mm²>', 'stress', 'N/mm²'],
    ['Stress, N/mm²', 'stress', 'N/mm²'],
    ['Load - lbf', 'load', 'lbf'],
    ['Force_kN', 'force', 'kN'],
    ['Extension in', 'extension', 'in'],
    ['Extension: mm', 'extension', 'mm'],
    // quantity/unit, the ISO 80000-1 heading notation
    ['Strain/µε', 'strain', 'µε'],
    ['Stress / MPa', 'stress', 'MPa'],
    ['Force/kN', 'force', 'kN'],
    ['Stress/kPa', 'stress', 'kPa'],
    ['Load/kgf', 'load', 'kgf'],
    ['Stress/Strain', 'stress/strain', ''],
    ['Strain mm/mm', 'strain', 'mm/mm'],
    ['Stress N/mm2', 'stress', 'N/mm2'],
    ['Strain in/in', 'strain', 'in/in'],
  ];
  for (const [name, base, unit] of cases) {
    it(`describeColumn(${JSON.stringify(name)}) → base ${base}, unit ${unit}`, () => {
      const c = describeColumn(name, 0);
      expect(c.base).toBe(base);
      expect(c.unit).toBe(unit);
    });
  }
});

describe('unitFactor(quantity, unit) for the units labs write', () => {
  it('strain: in/in, mm/mm = 1; % = 0.01; µε (micro sign or Greek mu), ue, microstrain = 1e-6 (SI prefix)', () => {
    for (const u of ['in/in', 'mm/mm', '[in/in]', '(mm/mm)', 'in per in', 'in./in.']) expect(unitFactor('strain', u), u).toBe(1);
    expect(unitFactor('strain', '%')).toBe(0.01);
    for (const u of ['µε', 'με', 'ue', 'microstrain', '[µε]']) expect(unitFactor('strain', u), u).toBe(1e-6);
    // Per mille: 1 ‰ = 0.001, the same as mm/m (common practice; the per mille sign is U+2030).
    for (const u of ['‰', '[‰]', 'permille', 'mm/m']) expect(unitFactor('strain', u), u).toBe(1e-3);
  });
  it('stress: N/mm² = N/mm2 = MPa; ksi = 6.894757 MPa (NIST SP 811 B.8)', () => {
    for (const u of ['N/mm²', 'N/mm2', '[MPa]', '(MPa)']) expect(unitFactor('stress', u), u).toBe(1);
    // A negative exponent as SI typesetting writes it (SI Brochure §5.4.6, from memory).
    for (const u of ['N·mm⁻²', 'N mm-2', '[N.mm^-2]', 'N*mm-2']) expect(unitFactor('stress', u), u).toBe(1);
    expect(unitFactor('stress', 'kgf mm-2')).toBe(9.80665);
    expect(unitFactor('stress', 'N mm-3')).toBeUndefined();
    expectRelClose(unitFactor('stress', '(ksi)')!, 6.894757, 1e-6, 'ksi');
  });
  it('stress of older certificates and other practice: kgf/mm² = 9.80665 MPa (1 kgf = 9.80665 N, NIST SP 811 B.8); lbf/in² = psi; MN/m² = N/m² × 10⁶ = MPa, kN/cm² = 10 MPa (SI)', () => {
    for (const u of ['kgf/mm²', '(kgf/mm2)', '[kg/mm²]', 'kgf/mm^2']) expectRelClose(unitFactor('stress', u)!, 9.80665, 1e-12, u);
    for (const u of ['lbf/in²', 'lb/in2', '(lbf/in^2)']) expectRelClose(unitFactor('stress', u)!, 0.006894757, 1e-6, u);
    for (const u of ['MN/m²', '[MN/m2]', 'MN/m^2']) expect(unitFactor('stress', u), u).toBe(1);
    expect(unitFactor('stress', 'N/m²')).toBe(1e-6);
    expect(unitFactor('stress', 'kN/cm²')).toBe(10);
    expectRelClose(unitFactor('stress', 'kgf/cm²')!, 0.0980665, 1e-12, 'kgf/cm²');
    // mN/m² (10⁻⁹ MPa) is no tensile stress: the case that tells it from MN/m² is kept, a lower-case "mn/m²" refused.
    expect(unitFactor('stress', 'mN/m²')).toBeUndefined();
    expect(unitFactor('stress', 'mn/m2')).toBeUndefined();
  });
  it('European units of older and French certificates: daN = 10 N and daN/mm² = hbar = 10 MPa (SI prefixes deca, hecto); kp = kgf, kp/mm² = 9.80665 MPa (NIST SP 811 B.8)', () => {
    for (const u of ['daN', '[daN]', '(DAN)']) expect(unitFactor('force', u), u).toBe(10);
    for (const u of ['daN/mm²', '(daN/mm2)', 'daN/mm^2', 'hbar']) expect(unitFactor('stress', u), u).toBe(10);
    expect(unitFactor('stress', 'daN/cm²')).toBeCloseTo(0.1, 15);
    expect(unitFactor('force', 'kp')).toBe(9.80665);
    for (const u of ['kp/mm²', '[kp/mm2]']) expect(unitFactor('stress', u), u).toBe(9.80665);
    // Through the reader: a force column in daN over 20 mm² gives the stress in MPa.
    const r = parseRecordText('Area: 20 mm²\n\nStrain [%],Force [daN]\n' + Array.from({ length: 12 }, (_, i) => `${i * 0.05},${i * 40}`).join('\n') + '\n', { file: 'dan.csv' });
    expect(r.stress[5]).toBeCloseTo((5 * 40 * 10) / 20, 12);
  });
  it('force: lbf = 4.448222 N (NIST SP 811 B.8), kN = 1000 N; length: in = 25.4 mm', () => {
    expectRelClose(unitFactor('force', 'lbf')!, 4.448222, 1e-6, 'lbf');
    expect(unitFactor('force', '[kN]')).toBe(1000);
    expect(unitFactor('length', 'in')).toBe(25.4);
    expect(unitFactor('length', '(mm)')).toBe(1);
  });
});

describe('unitFactor: SI prefixes that differ only in case', () => {
  it('mN = 1e-3 N and MN = 1e6 N (SI prefixes milli and mega, SI Brochure Table 7); a lower-case "mn" is refused as ambiguous', () => {
    expect(unitFactor('force', 'mN')).toBe(1e-3);
    expect(unitFactor('force', '[mN]')).toBe(1e-3);
    expect(unitFactor('force', 'MN')).toBe(1e6);
    expect(unitFactor('force', 'mn')).toBeUndefined();
  });
});

describe('parseRecordText on US-style and microstrain exports (INVENTED rows)', () => {
  const rows = (f: (e: number, s: number) => string) => Array.from({ length: 20 }, (_, i) => f(i * 1e-4, i * 20)).join('\n');
  it('a strain column named strain_in_per_in and stress in ksi are read (was: unit "in" is not a strain unit)', () => {
    const text = 'time_s,strain_in_per_in,stress_ksi\n' + rows((e, s) => `${e * 10},${e},${s / 6.894757293168361}`);
    const r = parseRecordText(text, { file: 'us.csv' });
    expect(r.columns.strain!.name).toBe('strain_in_per_in');
    expectRelClose(r.strain[10]!, 1e-3, 1e-12, 'strain');
    expectRelClose(r.stress[10]!, 200, 1e-9, 'stress MPa');
  });
  it('strain in µε and stress in N/mm² are converted to fraction and MPa', () => {
    const text = 'Strain [µε];Stress [N/mm²]\n' + rows((e, s) => `${e * 1e6};${s}`);
    const r = parseRecordText(text, { file: 'micro.csv' });
    expectRelClose(r.strain[10]!, 1e-3, 1e-12, 'strain');
    expectRelClose(r.stress[10]!, 200, 1e-12, 'stress');
  });
  it('force in lbf and extension in inches with a gauge length and area convert to MPa and strain', () => {
    const text = 'Load (lbf),Extension (in)\n' + rows((e, s) => `${(s * 20) / 4.4482216152605},${(e * 50) / 25.4}`);
    const r = parseRecordText(text, { file: 'fe.csv', area: 20, gaugeLength: 50 });
    expectRelClose(r.strain[10]!, 1e-3, 1e-9, 'strain');
    expectRelClose(r.stress[10]!, 200, 1e-9, 'stress');
  });
  it('German compound headings (Prüfkraft, Nenndehnung, Querdehnung) and German geometry lines (Anfangsquerschnitt, Durchmesser, Breite, Dicke, Messlänge): plain German, the head noun last', () => {
    const body = rows((e, s) => `${(e * 1e3).toFixed(1).replace('.', ',')};${((s * 20) / 1000).toFixed(6).replace('.', ',')};${(e * 100).toFixed(4).replace('.', ',')};${(-e * 30).toFixed(4).replace('.', ',')}`);
    const r = parseRecordText('Anfangsquerschnitt;20;mm²\n\nZeit [s];Prüfkraft [kN];Nenndehnung [%];Querdehnung [%]\n' + body, { file: 'de-fs.csv' });
    expect(r.basis).toBe('force-strain');
    expect(r.columns.force!.name).toBe('Prüfkraft [kN]');
    expect(r.columns.strain!.name).toBe('Nenndehnung [%]');
    expectRelClose(r.stress[10]!, 200, 1e-6, 'stress = force / 20 mm²');
    for (const [meta, A] of [['Durchmesser: 5 mm', (Math.PI / 4) * 25], ['Breite: 10 mm\nDicke: 2 mm', 20]] as const) {
      const q = parseRecordText(`${meta}\n\nZeit [s];Prüfkraft [kN];Nenndehnung [%];Querdehnung [%]\n` + body, { file: 'de-geo.csv' });
      expectRelClose(q.geometry!.area, A, 1e-12, meta);
    }
    const fe = parseRecordText('Anfangsquerschnitt: 20 mm²\nMesslänge: 50 mm\n\nPrüfkraft [kN];Längenänderung [mm]\n' + rows((e, s) => `${((s * 20) / 1000).toFixed(6).replace('.', ',')};${(e * 50).toFixed(5).replace('.', ',')}`), { file: 'de-fe.csv' });
    expect(fe.basis).toBe('force-extension');
    expect(fe.geometry!.gaugeLength).toBe(50);
  });
  it('French, Spanish and Italian "elongation" in % is the strain (Allongement [%], Alargamiento [%], Allungamento (%)); in mm the extension', () => {
    for (const [head, unit] of [['Allongement', '[%]'], ['Alargamiento', '[%]'], ['Allungamento', '(%)']] as const) {
      const r = parseRecordText(`${head} ${unit};Contrainte [MPa]\n` + rows((e, s) => `${(e * 100).toFixed(4).replace('.', ',')};${s.toFixed(1).replace('.', ',')}`), { file: 'fr.csv' });
      expect(r.columns.strain!.name, head).toBe(`${head} ${unit}`);
      expectRelClose(r.strain[10]!, 1e-3, 1e-9, `${head}: strain`);
    }
    const fe = parseRecordText('Section: 20 mm²\nLongueur: 50 mm\n\nEffort [kN];Allongement [mm]\n' + rows((e, s) => `${((s * 20) / 1000).toFixed(6).replace('.', ',')};${(e * 50).toFixed(5).replace('.', ',')}`), { file: 'fr-fe.csv', area: 20, gaugeLength: 50 });
    expect(fe.basis).toBe('force-extension');
  });
  it('a German export (decimal comma, semicolons, a preamble, Dehnung/Spannung) reads as strain and stress', () => {
    const text = 'Prüfbericht;Probe 7\nDatum;02.12.2026\n\nZeit [s];Dehnung [%];Spannung [MPa]\n' + rows((e, s) => `${(e * 1e3).toFixed(1).replace('.', ',')};${(e * 100).toFixed(4).replace('.', ',')};${s.toFixed(1).replace('.', ',')}`);
    const r = parseRecordText(text, { file: 'de.csv' });
    expect(r.columns.strain!.name).toBe('Dehnung [%]');
    expect(r.columns.stress!.name).toBe('Spannung [MPa]');
    expectRelClose(r.strain[10]!, 1e-3, 1e-9, 'strain');
    expectRelClose(r.stress[10]!, 200, 1e-12, 'stress');
  });
  it('French and Spanish force–extension headings (Effort/Allongement, Fuerza/Alargamiento) read as force and extension; "true" words mark true values', () => {
    for (const head of ['Effort [kN],Allongement [mm]', 'Fuerza (kN),Alargamiento (mm)']) {
      const text = head + '\n' + rows((e, s) => `${(s * 20) / 1000},${e * 50}`);
      const r = parseRecordText(text, { file: 'fr.csv', area: 20, gaugeLength: 50 });
      expectRelClose(r.stress[10]!, 200, 1e-9, `stress from ${head}`);
      expectRelClose(r.strain[10]!, 1e-3, 1e-9, `strain from ${head}`);
    }
    expect(describeColumn('wahre Spannung [MPa]', 0).isTrue).toBe(true);
    expect(describeColumn('contrainte vraie (MPa)', 0).isTrue).toBe(true);
    expect(describeColumn('Spannung [MPa]', 0).isTrue).toBe(false);
    // Words that are object keys in JavaScript are names, not roles.
    expect(describeColumn('constructor', 0).isTrue).toBe(false);
  });
});

// Acquisition systems that export channels by number (common practice): the unit is the only sign of the quantity.
describe('parseRecordText: channels named only by number are read by their units (INVENTED rows)', () => {
  const rows = (f: (e: number, s: number) => string) => Array.from({ length: 20 }, (_, i) => f(i * 1e-4, i * 20)).join('\n');
  it('stress first, strain in % second ("Kanal 1 (MPa)", "Kanal 2 (%)"): read by unit, and said', () => {
    const r = parseRecordText('Kanal 1 (MPa),Kanal 2 (%)\n' + rows((e, s) => `${s},${e * 100}`), { file: 'ch.csv' });
    expect(r.columns.stress!.name).toBe('Kanal 1 (MPa)');
    expect(r.columns.strain!.name).toBe('Kanal 2 (%)');
    expectRelClose(r.strain[10]!, 1e-3, 1e-12, 'strain');
    expectRelClose(r.stress[10]!, 200, 1e-12, 'stress');
    expect(r.warnings.some((w) => /columns named by channel only, read by their units/.test(w) && /"Kanal 1 \(MPa\)" \(column 1\) as the stress/.test(w))).toBe(true);
  });
  it('time, extension and force channels in a units row (Channel 1/2/3 over s, mm, kN) with the specimen given', () => {
    const text = 'Channel 1;Channel 2;Channel 3\ns;mm;kN\n' + rows((e, s) => `${e * 1e4};${e * 50};${(s * 20) / 1000}`);
    const r = parseRecordText(text, { file: 'ch3.csv', area: 20, gaugeLength: 50 });
    expect(r.basis).toBe('force-extension');
    expect(r.columns.force!.name).toBe('Channel 3');
    expectRelClose(r.strain[10]!, 1e-3, 1e-9, 'strain');
    expectRelClose(r.stress[10]!, 200, 1e-9, 'stress');
  });
  it('a named column keeps its role; only the missing one is read by unit ("Stress [MPa]" with "CH2 [µε]")', () => {
    const r = parseRecordText('Stress [MPa],CH2 [µε]\n' + rows((e, s) => `${s},${e * 1e6}`), { file: 'mix.csv' });
    expect(r.columns.strain!.name).toBe('CH2 [µε]');
    expect(r.warnings.some((w) => w.startsWith('a column named by channel only, read by its unit: "CH2 [µε]" (column 2) as the strain'))).toBe(true);
    expectRelClose(r.strain[10]!, 1e-3, 1e-12, 'strain');
  });
  it('two channels in one stress unit are not guessed: refused, naming both and --column', () => {
    expect(() => parseRecordText('Ch1 [MPa],Ch2 [MPa],Ch3 [%]\n' + rows((e, s) => `${s},${s},${e * 100}`), { file: 'two.csv' }))
      .toThrow(/"Ch1 \[MPa\]" and "Ch2 \[MPa\]" are each in a stress unit: map the one to read with --column ROLE=NAME/);
  });
  it('a bare fraction mark ("-") is no sign of a strain: not guessed', () => {
    expect(() => parseRecordText('Ch1 [MPa],Ch2 [-]\n' + rows((e, s) => `${s},${e}`), { file: 'dash.csv' })).toThrow(/no strain and stress columns/);
  });
});
