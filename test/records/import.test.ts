import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PlanError } from '../../src/plan/problems.js';
import iconv from 'iconv-lite';
import { decodeWindows1252 } from '../../src/records/decode.js';
import { decodeRecord, ENCODING_NOTE, parseRecordText, sampleLine, type RecordOptions } from '../../src/records/index.js';
import { unitFactor } from '../../src/records/units.js';
import { readRecordFile } from '../../src/records/node.js';
import { expectRelClose } from '../helpers.js';

// A small record (invented): 12 rows of a linear-then-flat curve, strain in %, stress in MPa.
const ROWS: [number, number][] = Array.from({ length: 12 }, (_, i) => [i * 0.05, Math.min(i * 100, 700) + i]);
const csv = (header: string, sep = ',', dec = '.', fmt = (r: [number, number]) => r) =>
  [header, ...ROWS.map((r) => fmt(r).map((v) => String(v).replace('.', dec)).join(sep))].join('\n') + '\n';

function problemOf(fn: () => unknown): { line?: number; column?: number; path: string; message: string } {
  try {
    fn();
  } catch (e) {
    expect(e, String(e)).toBeInstanceOf(PlanError);
    const p = (e as PlanError).problems[0]!;
    return { ...p, message: `${p.path ? p.path + ': ' : ''}${p.message}` };
  }
  throw new Error('expected an error');
}

describe('parseRecordText(text) reads what labs export', () => {
  const check = (text: string, opts: RecordOptions = {}) => {
    const r = parseRecordText(text, { file: 't.csv', ...opts });
    expect(r.rows).toBe(12);
    ROWS.forEach(([e, s], i) => {
      expectRelClose(r.strain[i]! || 1e-300, e / 100 || 1e-300, 1e-12, `strain ${i}`);
      expectRelClose(r.stress[i]! || 1e-300, s || 1e-300, 1e-12, `stress ${i}`);
    });
    return r;
  };
  it('comma-separated with units in brackets', () => check(csv('Strain [%],Stress [MPa]')));
  it('semicolon-separated with decimal comma', () => expect(check(csv('Strain (%);Stress (MPa)', ';', ',')).layout.decimalComma).toBe(true));
  it('tab-separated with a units row', () => check(['Strain\tStress', '%\tMPa', ...ROWS.map((r) => r.join('\t'))].join('\n')));
  it('UTF-8 BOM and CRLF line ends', () => check('\uFEFF' + csv('strain_pct,stress_MPa').replace(/\n/g, '\r\n')));
  it('metadata lines before the header are kept as key/value/unit', () => {
    const r = check('Specimen:,A-7\nGauge length:,50,mm\n' + csv('Strain [%],Stress [N/mm²]'));
    expect(r.metadata.get('gauge length')).toMatchObject({ value: '50', unit: 'mm', line: 2 });
  });
  it('stress in GPa, ksi and psi is converted to MPa (NIST SP 811: 1 ksi = 6.894757293168361 MPa)', () => {
    check(csv('Strain [%],Stress [GPa]', ',', '.', ([e, s]) => [e, s / 1000]));
    check(csv('Strain [%],Stress [ksi]', ',', '.', ([e, s]) => [e, s / 6.894757293168361]));
    check(csv('Strain [%],Stress [psi]', ',', '.', ([e, s]) => [e, (s / 6.894757293168361) * 1000]));
  });
  it('stress in kgf/mm², lbf/in², MN/m² and kN/cm² is converted to MPa (NIST SP 811 B.8: 1 kgf = 9.80665 N; MN/m² = MPa by the SI)', () => {
    check(csv('Strain [%],Stress [kgf/mm²]', ',', '.', ([e, s]) => [e, s / 9.80665]));
    check(csv('Strain [%],Stress (kg/mm2)', ',', '.', ([e, s]) => [e, s / 9.80665]));
    check(csv('Strain [%],Stress (lbf/in²)', ',', '.', ([e, s]) => [e, (s / 6.894757293168361) * 1000]));
    check(csv('Strain [%],Stress (MN/m²)', ',', '.', ([e, s]) => [e, s]));
    check(csv('Strain [%],Stress [kN/cm²]', ',', '.', ([e, s]) => [e, s / 10]));
  });
  it('strain as a fraction (mm/mm) and columns in another order', () => {
    check(['Time [s],Stress [MPa],Strain [mm/mm]', ...ROWS.map(([e, s], i) => `${i},${s},${e / 100}`)].join('\n'));
  });
  it('columns headed by symbols with their units (σ [MPa], ε [%], eps, F [kN], ΔL [mm]; ISO 6892-1 and textbook symbols, common practice)', () => {
    check(csv('ε [%],σ [MPa]'));
    check(csv('eps (%);sigma (N/mm²)', ';', ','));
    check(csv('e [%],S [MPa]'));
    const r = check(['Area: 25 mm²', 'Gauge length: 50 mm', 'F [kN]\tΔL [mm]', ...ROWS.map(([e, s]) => `${(s * 25) / 1000}\t${(e / 100) * 50}`)].join('\n'));
    expect(r.basis).toBe('force-extension');
    // Without a unit of its quantity a bare letter is not read as a role.
    expect(() => parseRecordText(csv('e,s'), { file: 'bare.csv' })).toThrow(/no strain and stress columns/);
  });
  it('columns mapped explicitly by name or number', () => {
    const text = ['a,b,c', ...ROWS.map(([e, s]) => `0,${s},${e}`)].join('\n');
    check(text, { columns: { stress: 'b', strain: 3 }, strainUnit: '%', stressUnit: 'MPa' });
  });
  it('force–extension in kN and mm with the cross-section and gauge length from metadata', () => {
    const A = (Math.PI / 4) * 5 * 5, L0 = 25;
    const r = check(['Diameter:\t5\tmm', 'Gauge length:\t25\tmm', 'Force [kN]\tExtension [mm]', ...ROWS.map(([e, s]) => `${(s * A) / 1000}\t${(e / 100) * L0}`)].join('\n'));
    expect(r.basis).toBe('force-extension');
    expect(r.geometry!.gaugeLength).toBe(25);
  });
  // Metadata and column names as testing-machine exports write them (common practice; ISO 6892-1 symbols S0, L0;
  // ASTM E8's spelling "gage"). Rows INVENTED; factors NIST SP 811 B.8 (1 in = 25.4 mm, 1 lbf = 4.4482216152605 N).
  const fe = (meta: string[], header: string, sep: string, force: (s: number) => number, ext: (e: number) => number) =>
    [...meta, header, ...ROWS.map(([e, s]) => `${force(s)}${sep}${ext(e / 100)}`)].join('\n') + '\n';
  it.each([
    ['units in brackets after the key, comma-separated', ['Specimen width (mm),12.5', 'Specimen thickness (mm),2.0', 'Original gauge length (mm),50'], 12.5 * 2, 50],
    ['ASTM "gage", inches in brackets, colon', ['Width (in): 0.500', 'Thickness (in): 0.125', 'Gage Length (in): 2.000'], 0.5 * 0.125 * 645.16, 50.8],
    ['"=" with the unit after the value', ['Diameter = 5.642 mm', 'Gauge length = 50 mm'], (Math.PI / 4) * 5.642 ** 2, 50],
    ['ISO symbols with a capital O for the zero', ['So: 25 mm2', 'Lo: 50 mm'], 25, 50],
    ['value and unit in one field', ['Cross-sectional area,25 mm²', 'Gauge length,50 mm'], 25, 50],
  ])('force–extension with the geometry in metadata lines: %s', (_, meta, A, L0) => {
    const r = check(fe(meta, 'Force [N],Extension [mm]', ',', (s) => s * A, (e) => e * L0));
    expectRelClose(r.geometry!.area, A, 1e-12, 'area');
    expectRelClose(r.geometry!.gaugeLength, L0, 1e-12, 'gauge length');
  });
  // Force with the machine's strain channel (no stress column), as many exports give it: s = F/S0 (ISO 6892-1 §3.10.1
  // with §3.5 for the strain; common practice). Factors NIST SP 811 B.8 (1 kN = 1000 N, 1 lbf = 4.4482216152605 N).
  it.each([
    ['kN and %, the diameter in metadata', ['Diameter: 5 mm'], 'Time [s],Force [kN],Strain [%]', (s: number, A: number) => (s * A) / 1000, (e: number) => e, (Math.PI / 4) * 25, {}],
    ['N and mm/mm, the area as an option', [], 'Load (N);Strain (mm/mm)', (s: number, A: number) => s * A, (e: number) => e / 100, 20, { area: 20 }],
    ['lbf and in/in, width and thickness in inches', ['Width (in): 0.500', 'Thickness (in): 0.125'], 'Force (lbf)\tStrain (in/in)', (s: number, A: number) => (s * A) / 4.4482216152605, (e: number) => e / 100, 0.5 * 0.125 * 645.16, {}],
  ] as const)('force and strain columns (no stress): %s', (_, meta, header, force, strain, A, opts) => {
    const sep = header.includes(';') ? ';' : header.includes('\t') ? '\t' : ',';
    const time = header.startsWith('Time');
    const r = check([...meta, header, ...ROWS.map(([e, s], i) => `${time ? `${i}${sep}` : ''}${force(s, A)}${sep}${strain(e)}`)].join('\n') + '\n', opts);
    expect(r.basis).toBe('force-strain');
    expectRelClose(r.geometry!.area, A, 1e-12, 'area');
    expect(r.geometry!.gaugeLength).toBeNull();
    expect(r.columns.force).toBeDefined();
    expect(r.columns.strain).toBeDefined();
  });
  it('force and strain with no cross-section: a located error that names both columns and the options', () => {
    const text = ['Force [kN],Strain [%]', ...ROWS.map(([e, s]) => `${s / 50},${e}`)].join('\n');
    expect(() => parseRecordText(text, { file: 'fs.csv' })).toThrow(/^fs\.csv:1:1: cross-section: a force–strain record \(force column "Force \[kN\]", strain column "Strain \[%\]"\) needs the cross-section.*--area, --diameter/);
  });
  it('force, extension and strain: the extension with a gauge length, else the strain', () => {
    const A = 25, L0 = 50;
    const rows = ROWS.map(([e, s]) => `${s * A},${(e / 100) * L0},${e}`);
    const withGauge = check(['Area: 25 mm²', 'Gauge length: 50 mm', 'Force [N],Extension [mm],Strain [%]', ...rows].join('\n') + '\n');
    expect(withGauge.basis).toBe('force-extension');
    const without = check(['Area: 25 mm²', 'Force [N],Extension [mm],Strain [%]', ...rows].join('\n') + '\n');
    expect(without.basis).toBe('force-strain');
    expect(without.columns.strain).toMatchObject({ name: 'Strain [%]' });
  });
  it('tension recorded as negative (compression-positive sign convention, common practice): the columns read with the sign reversed, and said', () => {
    const both = check(['Strain [%],Stress [MPa]', ...ROWS.map(([e, s]) => `${-e},${-s}`)].join('\n'));
    expect(both.warnings.join(' ')).toMatch(/"Stress \[MPa\]" and "Strain \[%\]" are negative almost throughout .*read with the sign reversed/);
    const force = check(['Area: 25 mm²', 'Force [N],Strain [%]', ...ROWS.map(([e, s]) => `${-s * 25},${e}`)].join('\n'));
    expect(force.warnings.join(' ')).toMatch(/^"Force \[N\]" is negative almost throughout/);
    // A tensile record's own few negative values (noise about zero before loading) are left alone.
    const plain = parseRecordText(['Strain [%],Stress [MPa]', ...ROWS.map(([e, s], i) => `${i < 2 ? -0.001 : e},${i < 2 ? -0.3 : s}`)].join('\n'), { file: 'p.csv' });
    expect(plain.stress[5]).toBe(ROWS[5]![1]);
    expect(plain.warnings.join(' ')).not.toMatch(/negative almost throughout/);
  });
  it('an extensometer channel named "Strain" but recorded in mm is read as the extension', () => {
    const r = check(fe(['Width: 12.5 mm', 'Thickness: 2 mm', 'Gauge length: 50 mm'], 'Force [N],Strain [mm]', ',', (s) => s * 25, (e) => e * 50));
    expect(r.basis).toBe('force-extension');
    expect(r.columns.extension).toMatchObject({ name: 'Strain [mm]' });
  });
  it('the crosshead is read when it is the only extension, with a warning that it holds the machine\'s compliance; an extensometer beside it wins', () => {
    const meta = ['Area: 25 mm²', 'Gauge length: 50 mm'];
    const r = check(fe(meta, 'Load [N],Crosshead [mm]', ',', (s) => s * 25, (e) => e * 50));
    expect(r.columns.extension).toMatchObject({ name: 'Crosshead [mm]' });
    expect(r.warnings.join(' ')).toMatch(/machine's travel \(column "Crosshead \[mm\]"\), not an extensometer.*--modulus/);
    const both = check([...meta, 'Load [N],Crosshead [mm],Extension [mm]', ...ROWS.map(([e, s]) => `${s * 25},${(e / 100) * 50 * 1.7},${(e / 100) * 50}`)].join('\n') + '\n');
    expect(both.columns.extension).toMatchObject({ name: 'Extension [mm]' });
    expect(both.warnings.join(' ')).not.toMatch(/machine's travel/);
    // An extensometer's own position channel is no machine travel.
    const ext = check(fe(meta, 'Load [N],Extensometer position [mm]', ',', (s) => s * 25, (e) => e * 50));
    expect(ext.warnings.join(' ')).not.toMatch(/machine's travel/);
  });
  it('the crosshead record\'s parallel length from the metadata lines labs write (ISO 6892-1 Lc, ASTM E8 reduced section, German), with units; only for the machine\'s travel', () => {
    const meta = ['Area: 25 mm²', 'Gauge length: 50 mm'];
    for (const [line, mm] of [['Parallel length (mm),60', 60], ['Parallel length: 60 mm', 60], ['Lc [mm]: 60', 60], ['Length of reduced section: 2.25 in', 57.15], ['Reduced section (in): 2.25', 57.15], ['Versuchslänge: 60 mm', 60], ['Parallellänge: 60 mm', 60]] as const) {
      const r = check(fe([...meta, line], 'Load [N],Crosshead [mm]', ',', (x) => x * 25, (e) => e * 50));
      expect(r.geometry?.parallelLength, line).toBeCloseTo(mm, 9);
      expect(r.warnings.join(' '), line).not.toMatch(/--parallel-length/);
    }
    // Without one the warning asks for it; shorter than the gauge length it is refused at its line.
    expect(check(fe(meta, 'Load [N],Crosshead [mm]', ',', (x) => x * 25, (e) => e * 50)).warnings.join(' ')).toMatch(/its parallel length \(--parallel-length, or a metadata line/);
    expect(() => check(fe([...meta, 'Parallel length: 40 mm'], 'Load [N],Crosshead [mm]', ',', (x) => x * 25, (e) => e * 50))).toThrow(/:3:2: Parallel length: got "40 mm", expected a length in mm from the gauge length \(50 mm\) to 10 times it/);
    // An extensometer's record does not need it (nor is it refused there).
    const ext = check(fe([...meta, 'Parallel length: 40 mm'], 'Load [N],Extension [mm]', ',', (x) => x * 25, (e) => e * 50));
    expect(ext.geometry?.parallelLength).toBeUndefined();
  });
  it('data rows with a text column (a phase or status, common practice of machine exports) read through the text and the file reader', async () => {
    const text = ['Specimen,A-7,steel,', 'Time [s],Strain [%],Stress [MPa],Phase', ...ROWS.map(([e, s], i) => `${i},${e},${s},${i < 4 ? 'elastic' : 'plastic'}`)].join('\n') + '\n';
    const r = check(text);
    expect(r.layout.headerLine).toBe(2);
    const dir = mkdtempSync(join(tmpdir(), 'sl-phase-'));
    writeFileSync(join(dir, 'p.csv'), text);
    const f = await readRecordFile(join(dir, 'p.csv'), { file: 'p.csv' });
    expect(Array.from(f.stress)).toEqual(Array.from(r.stress));
    // Text in a column whose header names a role is not data: the record is refused as before.
    const bad = ['Strain [%],Stress [MPa],Time [s]', ...ROWS.map(([e, s]) => `${e},${s},n/a`)].join('\n') + '\n';
    expect(() => parseRecordText(bad, { file: 'b.csv' })).toThrow(/header only: no rows of numbers/);
  });
  it('columns aligned by runs of spaces (a fixed-width text export) read as the comma-separated file, through the text and the file reader', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-aligned-'));
    const pad = (v: number, dec = '.') => ' ' + String(v).replace('.', dec).padStart(11);
    const variants: [string, string][] = [
      ['names with spaces, two or more between columns', ['Strain (%)    Stress (MPa)', ...ROWS.map(([e, s]) => pad(e) + pad(s))].join('\n')],
      ['one space between names', ['Strain Stress', '% MPa', ...ROWS.map(([e, s]) => pad(e) + pad(s))].join('\n')],
      ['units row, decimal comma, CRLF', ['      Strain      Stress', '           %         MPa', ...ROWS.map(([e, s]) => pad(e, ',') + pad(s, ','))].join('\r\n')],
      ['metadata lines kept', ['Specimen:  A-7', 'Operator = J. Doe', '', 'Strain[%]   Stress[MPa]', ...ROWS.map(([e, s]) => ` ${e} ${s}`)].join('\n')],
      ['a time stamp column', ['Time                      Strain [%]   Stress [MPa]', ...ROWS.map(([e, s], i) => `2026-03-01 10:15:${String(i).padStart(2, '0')}.5 ${pad(e)}${pad(s)}`)].join('\n')],
      ['a clock column, 12-hour', ['Time          Strain [%]   Stress [MPa]', ...ROWS.map(([e, s], i) => `10:15:${String(i).padStart(2, '0')} AM ${pad(e)}${pad(s)}`)].join('\n')],
    ];
    for (const [what, text] of variants) {
      const r = check(text + '\n');
      writeFileSync(join(dir, 'a.txt'), text + '\n');
      const f = await readRecordFile(join(dir, 'a.txt'), { file: 'a.txt' });
      expect(Array.from(f.stress), what).toEqual(Array.from(r.stress));
      expect(Array.from(f.strain), what).toEqual(Array.from(r.strain));
      if (what === 'metadata lines kept') expect(r.metadata.get('specimen')?.value).toBe('A-7');
    }
    // Force and extension with the specimen's size in metadata lines: the stress from them, as in a CSV.
    const fe = ['Width: 12.5 mm', 'Thickness: 2 mm', 'Gauge length: 50 mm', '', '   Load [N]   Extension [mm]', ...ROWS.map(([e, s]) => pad(s * 25) + pad((e / 100) * 50))].join('\n') + '\n';
    const g = check(fe);
    expect(g.geometry).toMatchObject({ area: 25, gaugeLength: 50 });
    // A bad cell is named at its own line of the file.
    const bad = ['Strain (%)    Stress (MPa)', ...ROWS.map(([e, s], i) => pad(e) + (i === 5 ? '        oops' : pad(s)))].join('\n') + '\n';
    expect(() => parseRecordText(bad, { file: 'b.txt' })).toThrow(/b\.txt:7:\d+: .*got "oops", expected a number/);
    // One number a line is still one column.
    expect(() => parseRecordText(['Stress', ...ROWS.map(([, s]) => pad(s))].join('\n') + '\n', { file: 'c.txt' })).toThrow(/only one column found/);
    // Asked for (`--delimiter space`): the same record through the text and the file reader; a comma-separated
    // file asked for as aligned is refused at its first line, saying why.
    const aligned = ['Strain (%)    Stress (MPa)', ...ROWS.map(([e, s]) => pad(e) + pad(s))].join('\n') + '\n';
    const asked = parseRecordText(aligned, { file: 'a.txt', delimiter: ' ' });
    expect(Array.from(asked.stress)).toEqual(Array.from(check(aligned).stress));
    writeFileSync(join(dir, 'asked.txt'), aligned);
    expect(Array.from((await readRecordFile(join(dir, 'asked.txt'), { file: 'asked.txt', delimiter: ' ' })).strain)).toEqual(Array.from(asked.strain));
    const csv = ['Strain [%],Stress [MPa]', ...ROWS.map(([e, s]) => `${e},${s}`)].join('\n') + '\n';
    expect(() => parseRecordText(csv, { file: 'c.csv', delimiter: ' ' })).toThrow(/c\.csv:1:1: delimiter: columns aligned by spaces were asked for, but no three lines/);
  });
  it('commas between fields and a decimal comma inside quotes ("0,05","505,0") read as the semicolon file; a quoted thousands group alone is not guessed', async () => {
    const quoted = ['"Strain [%]","Stress [MPa]"', ...ROWS.map(([e, s]) => `"${String(e).replace('.', ',')}","${String(s).replace('.', ',')}"`)].join('\n') + '\n';
    const r = check(quoted);
    expect(r.layout).toMatchObject({ delimiter: ',', decimalComma: true });
    const dir = mkdtempSync(join(tmpdir(), 'sl-qdc-'));
    writeFileSync(join(dir, 'q.csv'), quoted);
    const f = await readRecordFile(join(dir, 'q.csv'), { file: 'q.csv' });
    expect(Array.from(f.stress)).toEqual(Array.from(r.stress));
    // "1,205" quoted in every row could be a thousands group: refused as before, not read as 1.205.
    const grouped = ['"Strain [%]","Force [N]"', ...ROWS.map(([e], i) => `"${e}","${1 + (i % 9)},${String(100 + i * 7).padStart(3, '0')}"`)].join('\n') + '\n';
    expect(() => parseRecordText(grouped, { file: 'g.csv', area: 20 })).toThrow(/g\.csv:2:1: .* holds whole numbers with a comma \("1,205"\): a thousands separator or a decimal comma\?/);
  });
  it('a header, its units row and a row of channel names (either order) before the numbers read as the two-row header', async () => {
    const rows = ROWS.map(([e, s], i) => `${i};${e};${s}`);
    const want = check(['Time;Strain;Stress', 's;%;MPa', ...rows].join('\n') + '\n');
    for (const [what, head] of [['units, then channels', ['Time;Strain;Stress', 's;%;MPa', 'Ch0;Ch1;Ch2']], ['channels, then units', ['Time;Strain;Stress', 'Ch0;Ch1;Ch2', 's;%;MPa']],
      ['metadata lines first', ['Operator;J. Doe', 'Material;steel', 'Time;Strain;Stress', 's;%;MPa', 'Ch0;Ch1;Ch2']]] as const) {
      const text = [...head, ...rows].join('\n') + '\n';
      const r = check(text);
      expect(r.layout.headerLine, what).toBe(head.indexOf('Time;Strain;Stress') + 1);
      expect(r.layout.unitsLine, what).toBe(head.indexOf('s;%;MPa') + 1);
      expect(r.layout.dataLine, what).toBe(head.length + 1);
      expect(r.columns.stress?.unit, what).toBe('MPa');
      expect(Array.from(r.stress), what).toEqual(Array.from(want.stress));
      const dir = mkdtempSync(join(tmpdir(), 'sl-3rows-'));
      writeFileSync(join(dir, 'r.csv'), text);
      expect(Array.from((await readRecordFile(join(dir, 'r.csv'), { file: 'r.csv' })).strain), what).toEqual(Array.from(want.strain));
    }
  });
  it('a time column of clock times or time stamps (as some exports write it) is read past, through the text and the file reader', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-clock-'));
    const stamps: [string, (i: number) => string, string, string][] = [
      ['hh:mm:ss.s', (i) => `00:00:${String(i).padStart(2, '0')}.5`, ',', '.'],
      ['ISO 8601 stamp', (i) => `2026-03-01T10:15:${String(i).padStart(2, '0')}.125`, ',', '.'],
      ['date and time, decimal comma', (i) => `01.03.2026 10:15:${String(i).padStart(2, '0')},25`, ';', ','],
      ['12-hour clock', (i) => `10:15:${String(i).padStart(2, '0')} AM`, '\t', '.'],
    ];
    for (const [what, stamp, sep, dec] of stamps) {
      const text = [['Time', 'Strain [%]', 'Stress [MPa]'].join(sep), ...ROWS.map(([e, s], i) => [stamp(i), String(e).replace('.', dec), String(s).replace('.', dec)].join(sep))].join('\n') + '\n';
      const r = check(text);
      expect(r.layout.headerLine, what).toBe(1);
      writeFileSync(join(dir, 'c.csv'), text);
      const f = await readRecordFile(join(dir, 'c.csv'), { file: 'c.csv' });
      expect(Array.from(f.stress), what).toEqual(Array.from(r.stress));
      expect(Array.from(f.strain), what).toEqual(Array.from(r.strain));
    }
    // A clock time in the strain or stress column is no reading: refused where it stands.
    const bad = ['Time [s],Strain [%],Stress [MPa]', ...ROWS.map(([e, s], i) => `${i},${e},${i === 6 ? '10:15:02' : s}`)].join('\n') + '\n';
    expect(() => parseRecordText(bad, { file: 'b.csv' })).toThrow(/b\.csv:8:3: .*got "10:15:02", expected a number/);
  });
  it('two channels of one kind (Strain 1, Strain 2, one unit): their mean is read (an averaging extensometer) and a warning says how to map one', () => {
    const text = ['Strain 1 [%],Strain 2 [%],Stress [MPa]', ...ROWS.map(([e, s]) => `${e},${e * 1.05},${s}`)].join('\n') + '\n';
    const r = parseRecordText(text, { file: 'x.csv' });
    expect(r.columns.strain).toMatchObject({ name: 'Strain 1 [%]', averagedWith: { name: 'Strain 2 [%]', column: 2 } });
    ROWS.forEach(([e], i) => expect(r.strain[i]).toBeCloseTo((0.5 * (e + e * 1.05)) / 100, 14));
    expect(r.warnings.join(' ')).toMatch(/the mean of "Strain 1 \[%\]" \(column 1\) and "Strain 2 \[%\]" \(column 2\) is read as the strain.*--column strain=NAME/);
    // Mapped explicitly: that channel alone.
    const one = parseRecordText(text, { file: 'x.csv', columns: { strain: 'Strain 2 [%]' } });
    ROWS.forEach(([e], i) => expect(one.strain[i]).toBeCloseTo((e * 1.05) / 100, 14));
    expect(check(csv('Strain [%],Stress [MPa]')).warnings.join(' ')).not.toMatch(/could be|the mean of/);
  });
  it('a spreadsheet\'s UTF-16 text export: UTF-16 LE or BE with its byte-order mark (Unicode Standard §23.8) reads as the UTF-8 file', async () => {
    const text = csv('Strain [%]\tStress [MPa]', '\t', ',').replace(/\n/g, '\r\n');
    const dir = mkdtempSync(join(tmpdir(), 'sl-utf16-'));
    const le = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]);
    const be = Buffer.from(le); be.swap16(); // byte order swapped, the mark becomes FE FF
    const want = check(text);
    for (const [name, bytes] of [['le.txt', le], ['be.txt', be]] as const) {
      writeFileSync(join(dir, name), bytes);
      const r = await readRecordFile(join(dir, name), { file: name });
      expect(Array.from(r.strain), name).toEqual(Array.from(want.strain));
      expect(Array.from(r.stress), name).toEqual(Array.from(want.stress));
    }
    // Without the mark the NUL bytes are refused with their place, and the message says what is read.
    writeFileSync(join(dir, 'nomark.txt'), Buffer.from(text, 'utf16le'));
    await expect(readRecordFile(join(dir, 'nomark.txt'), { file: 'nomark.txt' })).rejects.toThrow(/nomark\.txt:1:2: binary content \(NUL byte\); expected .* in UTF-8, or in UTF-16 with its byte-order mark/);
  });
  it('an export in a Windows code page (not UTF-8: "N/mm²" as the single byte B2, "°C", "ü") reads as its UTF-8 twin, with a warning', async () => {
    // INVENTED rows; the header words are the usual German ones ("Dehnung" strain, "Spannung" stress; common practice).
    const text = 'Prüfer;Müller\nTemperatur;23 °C\n\n' + csv('Dehnung [%];Spannung [N/mm²]', ';', ',').replace(/\n/g, '\r\n');
    const dir = mkdtempSync(join(tmpdir(), 'sl-cp1252-'));
    const want = check(text);
    expect(want.columns.stress?.unit).toBe('N/mm²');
    const bytes = Buffer.from(text, 'latin1'); // the same bytes as Windows-1252 for these characters
    expect(bytes.includes(0xb2)).toBe(true);
    expect(decodeRecord(bytes)).toEqual({ text, encoding: 'windows-1252' });
    expect(decodeRecord(Buffer.from(text, 'utf8'))).toEqual({ text, encoding: 'utf-8' });
    // Every byte 80–FF (and all 256) against the registry's iconv-lite (a general-purpose encoding library): "€" is 80
    // in Windows-1252, U+0080 in ISO-8859-1.
    const all = Uint8Array.from({ length: 256 }, (_, i) => i);
    // iconv-lite leaves the code page's five undefined bytes (81, 8D, 8F, 90, 9D) as U+FFFD; the WHATWG Encoding
    // Standard (what a browser's TextDecoder does) maps them to the C1 control of the same number, as we do.
    const ref = [...iconv.decode(Buffer.from(all), 'windows-1252')];
    expect(ref.filter((c) => c === '\ufffd')).toHaveLength(5);
    expect([...decodeWindows1252(all)]).toEqual(ref.map((c, i) => (c === '\ufffd' ? String.fromCharCode(i) : c)));
    expect(decodeRecord(Uint8Array.of(0x80, 0x3b, 0x31)).text).toBe('€;1');
    writeFileSync(join(dir, 'cp.csv'), bytes);
    const r = await readRecordFile(join(dir, 'cp.csv'), { file: 'cp.csv' });
    expect(Array.from(r.strain)).toEqual(Array.from(want.strain));
    expect(Array.from(r.stress)).toEqual(Array.from(want.stress));
    expect(r.warnings[0]).toBe(ENCODING_NOTE);
    writeFileSync(join(dir, 'u8.csv'), text);
    expect((await readRecordFile(join(dir, 'u8.csv'), { file: 'u8.csv' })).warnings).not.toContain(ENCODING_NOTE);
    // The only byte that is not UTF-8 past the first 256 KiB the reader looks at first (a footer line): read again whole.
    const long = Array.from({ length: 30_000 }, (_, i) => `${(i * 1e-4).toFixed(6).replace('.', ',')};${(Math.min(i * 2e-4, 0.3) * 1000).toFixed(3).replace('.', ',')}`);
    const big = Buffer.from(['Dehnung [%];Spannung [MPa]', ...long, 'Prüfer;Müller', ''].join('\n'), 'latin1');
    expect(big.length).toBeGreaterThan(256 * 1024);
    expect(big.subarray(0, 256 * 1024).includes(0xfc)).toBe(false);
    writeFileSync(join(dir, 'footer.csv'), big);
    const f = await readRecordFile(join(dir, 'footer.csv'), { file: 'footer.csv' });
    expect(f.rows).toBe(30_000);
    expect(f.stress[29_999]).toBeCloseTo(300, 9);
    expect(f.warnings[0]).toBe(ENCODING_NOTE);
    // A workbook instead of its text export: said so, with what to do (its signature, not "binary content").
    const zip = Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00]), Buffer.alloc(64)]);
    const ole = Buffer.concat([Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]), Buffer.alloc(64)]);
    for (const [name, bytes, kind] of [['t.xlsx', zip, /spreadsheet workbook or another ZIP archive \(\.xlsx, \.ods\)/], ['t.xls', ole, /spreadsheet workbook in the older binary format \(\.xls\)/]] as const) {
      writeFileSync(join(dir, name), bytes);
      const say = new RegExp(`${name.replace('.', '\\.')}:1:1: a ${kind.source}, not a text export; expected CSV or tab-separated text: save the sheet .* as CSV`);
      await expect(readRecordFile(join(dir, name), { file: name })).rejects.toThrow(say);
      expect(() => decodeRecord(bytes, name)).toThrow(say);
    }
    // NUL bytes stay binary content, whatever else the bytes hold.
    writeFileSync(join(dir, 'bin.csv'), Buffer.from([0x53, 0x3b, 0x54, 0x0a, 0xb2, 0x00, 0x31]));
    await expect(readRecordFile(join(dir, 'bin.csv'), { file: 'bin.csv' })).rejects.toThrow(/binary content/);
  });
  it('force–extension in lbf and in with width × thickness from options (NIST: 1 lbf = 4.4482216152605 N)', () => {
    const A = 12.5 * 2, L0 = 50;
    check(csv('Load (lbf),Extension (in)', ',', '.', ([e, s]) => [(s * A) / 4.4482216152605, ((e / 100) * L0) / 25.4]).replace(/^([^\n]*)\n/, '$1\n'),
      { width: 12.5, thickness: 2, gaugeLength: 50 });
  });
});

// Spreadsheets export a formatted column with thousands separators (quoted where the separator is the delimiter);
// ISO 80000-1 groups digits by spaces (from memory). Stresses of 1000–2200 MPa (high-strength steel; INVENTED rows).
describe('numbers with thousands separators', () => {
  const rows = Array.from({ length: 12 }, (_, i) => [i * 0.1, 1000 + i * 111.1] as const);
  const group = (v: number, dec: string, sep: string) => { const [a, b] = v.toFixed(1).split('.'); return a!.replace(/\B(?=(\d{3})+(?!\d))/g, sep) + dec + b; };
  it.each([
    ['comma grouping, decimal point, quoted cells', 'Strain [%],Stress [MPa]', (e: number, s: number) => `${e.toFixed(2)},"${group(s, '.', ',')}"`],
    ['point grouping, decimal comma, semicolons', 'Strain [%];Stress [MPa]', (e: number, s: number) => `${e.toFixed(2).replace('.', ',')};${group(s, ',', '.')}`],
    ['space grouping, decimal comma, semicolons', 'Strain [%];Stress [MPa]', (e: number, s: number) => `${e.toFixed(2).replace('.', ',')};${group(s, ',', ' ')}`],
    ['narrow no-break space grouping, decimal point, tabs', 'Strain [%]\tStress [MPa]', (e: number, s: number) => `${e.toFixed(2)}\t${group(s, '.', '\u202F')}`],
  ] as const)('%s: the same numbers as without them', async (_, header, row) => {
    const text = [header, ...rows.map(([e, s]) => row(e, s))].join('\n') + '\n';
    const r = parseRecordText(text, { file: 'g.csv' });
    expect(Array.from(r.stress)).toEqual(rows.map(([, s]) => Number(s.toFixed(1))));
    expect(Array.from(r.strain)).toEqual(rows.map(([e]) => Number(e.toFixed(2)) / 100));
    // The file reader (fast scanners, then the located reader for these rows) reads the same.
    const dir = mkdtempSync(join(tmpdir(), 'sl-group-'));
    writeFileSync(join(dir, 'g.csv'), text);
    const f = await readRecordFile(join(dir, 'g.csv'));
    expect(Array.from(f.stress)).toEqual(Array.from(r.stress));
  });
  it('whole numbers with a comma ("1,205": thousands or a decimal comma?) are a located error, not a guess', () => {
    const text = ['Strain [%],Stress [MPa]', ...rows.map(([e, s]) => `${e.toFixed(2)},"${group(s, '.', ',').split('.')[0]}"`)].join('\n');
    expect(() => parseRecordText(text, { file: 'w.csv' })).toThrow(/^w\.csv:2:1: .*whole numbers with a comma \("1,205"\): a thousands separator or a decimal comma\?/);
    // The same after ordinary rows (the layout is found, the cell is the error).
    const late = ['Strain [%],Stress [MPa]', '0,0', '0.01,20', ...rows.map(([e, s]) => `${(e + 0.1).toFixed(2)},"${group(s, '.', ',').split('.')[0]}"`)].join('\n');
    expect(() => parseRecordText(late, { file: 'l.csv' })).toThrow(/^l\.csv:4:2: Stress \[MPa\]: got "1,000": a thousands separator or a decimal comma\?/);
  });
});

describe('parseRecordText(bad record) names the line, the column and what was expected', () => {
  const bad: [string, string, RegExp, number | undefined, number | undefined][] = [
    ['an empty file', '', /empty file; expected a header line/, 1, 1],
    ['blank lines only', '\n\n  \n', /empty file/, 1, 1],
    ['a header only', 'Strain [%],Stress [MPa]\n', /header only: no rows of numbers after the header at line 1/, 1, 1],
    ['text in a numeric column', csv('Strain [%],Stress [MPa]').replace('\n0.25,505', '\n0.25,abc'), /Stress \[MPa\]: got "abc", expected a number/, 7, 2],
    ['NaN', csv('Strain [%],Stress [MPa]').replace('\n0.25,505', '\n0.25,NaN'), /got "NaN", expected a finite number/, 7, 2],
    ['Infinity', csv('Strain [%],Stress [MPa]').replace('\n0.2,404', '\n0.2,Infinity'), /got "Infinity", expected a finite number/, 6, 2],
    ['swapped columns', csv('Strain [%],Stress [MPa]', ',', '.', ([e, s]) => [s, e]), /Strain \[%\]: reaches 711 — not a strain .* swapped/, 13, 1],
    ['a single row', 'Strain [%],Stress [MPa]\n0.1,200\n', /a single data row; expected a tensile record of at least 10 rows/, 2, 1],
    ['duplicate column names', csv('Stress [MPa],Stress [MPa]'), /duplicate column name "Stress \[MPa\]" in columns 1 and 2/, 1, 2],
    ['a broken quoted field', 'Strain [%],Stress [MPa]\n' + ROWS.slice(0, 5).map((r) => r.join(',')).join('\n') + '\n"0.3,606\n' + ROWS.slice(6).map((r) => r.join(',')).join('\n') + '\n', /broken CSV: a quoted field is not closed/, undefined, undefined],
    ['binary content', 'Strain,Stress\n\u0000\u0001\u0002PK\u0003\u0004', /binary content \(character U\+0000\)/, 2, 1],
    ['hostile column names', csv('__proto__,constructor'), /no strain and stress columns, nor force and extension \(or force and strain\); the header has "__proto__", "constructor"/, 1, 1],
    ['a row shorter than the header', csv('Strain [%],Stress [MPa]').replace('\n0.25,505', '\n0.25'), /the row has 1 field; expected 2 as in the header \(line 1\)/, 7, 2],
    ['an unknown stress unit', csv('Strain [%],Stress [bar]'), /unit "bar" is not a stress unit; allowed MPa, N\/mm², MN\/m², GPa, kPa, Pa, kN\/cm², ksi, psi \(lbf\/in²\), kgf\/mm²/, 1, 2],
    ['force without a cross-section', csv('Force [kN],Extension [mm]'), /needs the cross-section .* missing the cross-section/, 1, undefined],
    ['numbers with no header', ROWS.map((r) => r.join(',')).join('\n'), /no header line: the file starts with numbers/, 1, 1],
    ['one column only', 'stress\n1\n2\n', /only one column found/, 3, 1],
    ['columns with different decimal separators', 'Time [s];Strain [%];Stress [MPa]\n' + ROWS.map(([e, sg], i) => `${i}.5;${(e + 0.01).toFixed(2).replace('.', ',')};${(sg + 0.5).toFixed(1).replace('.', ',')}`).join('\n') + '\n', /mixed decimal separators in "0\.5;.*decimal point, others a decimal comma; expected one decimal separator/, 2, 1],
  ];
  for (const [what, text, msg, line, column] of bad) {
    it(`${what}: a PlanError ${msg}`, () => {
      const p = problemOf(() => parseRecordText(text, { file: 'bad.csv' }));
      expect(p.message).toMatch(msg);
      if (line !== undefined) expect(p.line).toBe(line);
      if (column !== undefined) expect(p.column).toBe(column);
      expect(p.message).not.toMatch(/NaN|undefined/i.test(what) ? /(?!)/ : /\bundefined\b/);
    });
  }
  it('a broken quoted field names its line', () => {
    const p = problemOf(() => parseRecordText(bad[9]![1], { file: 'bad.csv' }));
    expect(p.line).toBeGreaterThanOrEqual(7);
  });
  it('hostile names do not touch Object.prototype', () => {
    problemOf(() => parseRecordText(csv('__proto__,constructor'), { file: 'x.csv' }));
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    const r = parseRecordText('__proto__:,x\n' + csv('Strain [%],Stress [MPa]'), { file: 'x.csv' });
    expect(r.metadata.get('__proto__')!.value).toBe('x');
    expect(Object.getPrototypeOf({})).toBe(Object.prototype);
  });
});

describe('readRecordFile(path) streams the same record as parseRecordText', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sl-rec-'));
  it('on a 42CrMoS4 open-data record (MaterialDigital, CC BY 4.0): identical arrays', async () => {
    const f = join(import.meta.dirname, '..', 'fixtures', '42crmos4', '46NTAV.csv');
    const a = parseRecordText(readFileSync(f, 'utf8'), { file: f });
    const b = await readRecordFile(f);
    expect(b.rows).toBe(577); // SOURCE.md: 46NTAV has 577 data rows
    expect(Array.from(b.strain)).toEqual(Array.from(a.strain));
    expect(Array.from(b.stress)).toEqual(Array.from(a.stress));
  });
  it('a missing file and a malformed row give located errors', async () => {
    await expect(readRecordFile(join(dir, 'nope.csv'))).rejects.toThrow(/file not found/);
    const f = join(dir, 'bad.csv');
    writeFileSync(f, csv('Strain [%],Stress [MPa]').replace('\n0.25,505', '\n0.25,oops'));
    await expect(readRecordFile(f)).rejects.toThrow(/bad\.csv:7:2: Stress \[MPa\]: got "oops", expected a number/);
    const g = join(dir, 'bin.csv');
    writeFileSync(g, Buffer.from([0x53, 0x2c, 0x54, 0x0a, 0x00, 0x01, 0x02]));
    await expect(readRecordFile(g)).rejects.toThrow(/binary content/);
  });
});

describe('unit conversion as rows are stored (speed follow-up K) gives Number(cell) × the unit factor, bit for bit', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sl-conv-'));
  // INVENTED rows: strains and stresses with 1 to 17 significant digits, in the units each header names.
  const cases: [string, string, number, number][] = [
    ['Strain [%],Stress [MPa]', 'percent, MPa', unitFactor('strain', '%')!, unitFactor('stress', 'MPa')!],
    ['Strain [mm/mm],Stress [ksi]', 'fraction, ksi', unitFactor('strain', 'mm/mm')!, unitFactor('stress', 'ksi')!],
    ['Strain [µε],Stress [psi]', 'microstrain, psi', unitFactor('strain', 'µε')!, unitFactor('stress', 'psi')!],
  ];
  for (const [header, what, fa, fb] of cases) {
    it(`${what}: the byte reader, the text reader and the located reader store the same converted numbers`, async () => {
      let seed = 7;
      const next = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
      const rows = Array.from({ length: 3000 }, (_, i) => [((i * 0.0137 + next() * 1e-3) * (0.01 / fa)).toPrecision(1 + (i % 17)), (300 + 200 * next()).toPrecision(1 + ((i * 7) % 17))]);
      const text = header + '\n' + rows.map((r) => r.join(',')).join('\n') + '\n';
      const f = join(dir, `conv-${fa}-${fb}.csv`);
      writeFileSync(f, text);
      const viaBytes = await readRecordFile(f);
      const viaText = parseRecordText(text, { file: f });
      // A quoted cell: the fast readers doubt the record, and csv-parse's located reader reads it (pushing every row).
      const viaLocated = parseRecordText(text.replace(`\n${rows[0]![0]},`, `\n"${rows[0]![0]}",`), { file: f });
      for (const rec of [viaBytes, viaText, viaLocated]) {
        expect(rec.rows).toBe(rows.length);
        for (let i = 0; i < rows.length; i++) {
          const e = Number(rows[i]![0]) * fa, s = Number(rows[i]![1]) * fb;
          if (!Object.is(rec.strain[i], e) || !Object.is(rec.stress[i], s)) expect([rec.strain[i], rec.stress[i]], `row ${i}`).toEqual([e, s]);
        }
      }
    });
  }
});

describe('lost samples: rows with no reading in the used columns (empty or NaN) while other columns were written', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sl-lost-'));
  // INVENTED record: time, strain %, stress MPa; rows 20–22 lose their strain and stress (the time goes on).
  const rows = Array.from({ length: 40 }, (_, i) => [`${(i * 0.1).toFixed(1)}`, `${(i * 0.05).toFixed(2)}`, `${(i < 10 ? i * 20 : 200 + i).toFixed(1)}`]);
  const text = (cell: (i: number, j: number) => string) => 'Time [s],Strain [%],Stress [MPa]\n' + rows.map((r, i) => r.map((c, j) => cell(i, j) ?? c).join(',')).join('\n') + '\n';
  const whole = parseRecordText(text((i, j) => rows[i]![j]!), { file: 'w.csv' });
  for (const [what, lost] of [['empty cells', ''], ['NaN', 'NaN'], ['nan with spaces', ' nan ']] as const) {
    it(`${what} in both used cells: left out, said with the lines, through every reader; the other rows as written`, async () => {
      const t = text((i, j) => (i >= 20 && i <= 22 && j > 0 ? lost : rows[i]![j]!));
      const f = join(dir, `lost-${what.replace(/ /g, '-')}.csv`);
      writeFileSync(f, t);
      for (const rec of [await readRecordFile(f), parseRecordText(t, { file: 'l.csv' })]) {
        expect(rec.rows).toBe(37);
        expect(rec.warnings.join('\n')).toMatch(/3 rows from line 22 to line 24 hold no reading in "Strain \[%\]", "Stress \[MPa\]" \(empty or NaN, the other columns written\): left out as lost samples/);
        const keep = [...Array(40).keys()].filter((i) => i < 20 || i > 22);
        expect(Array.from(rec.strain)).toEqual(keep.map((i) => whole.strain[i]));
        expect(Array.from(rec.stress)).toEqual(keep.map((i) => whole.stress[i]));
      }
    });
  }
  it('such rows at the end (a machine that logs the time on after the test): left out as rows after the data', async () => {
    const t = text((i, j) => (i >= 37 && j > 0 ? '' : rows[i]![j]!));
    const f = join(dir, 'trailing.csv');
    writeFileSync(f, t);
    for (const rec of [await readRecordFile(f), parseRecordText(t, { file: 'l.csv' })]) {
      expect(rec.rows).toBe(37);
      expect(rec.warnings.join('\n')).toMatch(/lines 39–41 after the data hold no reading in "Strain \[%\]", "Stress \[MPa\]" .*: left out; the record ends at line 38/);
      expect(rec.warnings.join('\n')).not.toMatch(/lost samples/);
    }
    // Both: a lost sample inside and rows after the data.
    const both = parseRecordText(text((i, j) => ((i === 20 || i >= 38) && j > 0 ? 'NaN' : rows[i]![j]!)), { file: 'b.csv' });
    expect(both.rows).toBe(37);
    expect(both.warnings.join('\n')).toMatch(/line 22 holds no reading in .*lost samples/);
    expect(both.warnings.join('\n')).toMatch(/lines 40–41 after the data hold no reading/);
  });
  it('a row cut short inside the data is still an error, and a text footer still a footer (their cells are missing, not empty)', () => {
    const cut = 'Time [s],Strain [%],Stress [MPa]\n' + rows.map((r, i) => (i === 20 ? r[0]! : r.join(','))).join('\n') + '\n';
    expect(() => parseRecordText(cut, { file: 'c.csv' })).toThrow(/^c\.csv:22:2: Strain \[%\]: the row has 1 field; expected 3 as in the header/);
    const foot = parseRecordText(text((i, j) => rows[i]![j]!) + 'Results\nMaximum force,23.5\n', { file: 'f.csv' });
    expect(foot.rows).toBe(40);
    expect(foot.warnings.join('\n')).toMatch(/lines 42–43 after the data are not rows of numbers .*read as a footer and left out/);
  });
  // One of the pair lost (a machine that writes NaN for a channel it did not read in time, or leaves the cell empty):
  // no sample without both, so the row is left out and said, as the rows with both lost are; common practice.
  for (const [what, cell, col, name] of [['the stress NaN', 'NaN', 2, 'Stress \\[MPa\\]'], ['the stress empty', '', 2, 'Stress \\[MPa\\]'], ['the strain NaN', 'NaN', 1, 'Strain \\[%\\]'], ['the strain empty', '', 1, 'Strain \\[%\\]']] as const) {
    it(`one of the pair lost inside the data (${what}): the rows left out and said with their lines, through every reader`, async () => {
      const lostRows = new Set([20, 27, 28]);
      const t = text((i, j) => (lostRows.has(i) && j === col ? cell : rows[i]![j]!));
      const f = join(dir, `half-${what.replace(/ /g, '-')}.csv`);
      writeFileSync(f, t);
      for (const rec of [await readRecordFile(f), parseRecordText(t, { file: 'h.csv' })]) {
        expect(rec.rows).toBe(37);
        expect(rec.warnings.join('\n')).toMatch(new RegExp(`3 rows between line 22 and line 30 hold no reading in "${name}" \\(empty or NaN\\) beside a reading in the other column: left out as lost samples`));
        const keep = [...Array(40).keys()].filter((i) => !lostRows.has(i));
        expect(Array.from(rec.strain)).toEqual(keep.map((i) => whole.strain[i]));
        expect(Array.from(rec.stress)).toEqual(keep.map((i) => whole.stress[i]));
        // Errors about later samples still name their own file lines (the line runs skip the rows left out).
        expect(sampleLine(rec, 19)).toBe(21);
        expect(sampleLine(rec, 20)).toBe(23);
        expect(sampleLine(rec, 26)).toBe(31);
      }
    });
  }
  it('one of the pair lost in a run of more than 10 rows, or among the first rows, is still an error naming line and column', () => {
    const run = (i: number) => i >= 20 && i <= 30;
    expect(() => parseRecordText(text((i, j) => (run(i) && j === 2 ? 'NaN' : rows[i]![j]!)), { file: 'o.csv' })).toThrow(/^o\.csv:22:3: Stress \[MPa\]: got "NaN", expected a finite number/);
    expect(() => parseRecordText(text((i, j) => (run(i) && j === 1 ? '' : rows[i]![j]!)), { file: 'o.csv' })).toThrow(/^o\.csv:22:2: Strain \[%\]: got "", expected a number/);
    expect(() => parseRecordText(text((i, j) => (i === 3 && j > 0 ? '' : rows[i]![j]!)), { file: 'o.csv' })).toThrow(/^o\.csv:5:2: Strain \[%\]: got "", expected a number/);
    expect(() => parseRecordText(text((i, j) => (i === 3 && j === 2 ? 'NaN' : rows[i]![j]!)), { file: 'o.csv' })).toThrow(/^o\.csv:5:3: Stress \[MPa\]: got "NaN", expected a finite number/);
    // Ten rows are still lost samples.
    expect(parseRecordText(text((i, j) => (i >= 20 && i <= 29 && j === 2 ? 'NaN' : rows[i]![j]!)), { file: 'o.csv' }).rows).toBe(30);
  });
  it('the strain NaN from a row to the end (an extensometer taken off that writes NaN): held as with empty cells, said as NaN', () => {
    const rec = parseRecordText(text((i, j) => (i >= 35 && j === 1 ? 'NaN' : rows[i]![j]!)), { file: 'n.csv' });
    expect(rec.rows).toBe(40);
    expect(rec.warnings.join('\n')).toMatch(/strain column "Strain \[%\]" is NaN from line 37 to the end \(5 rows; extensometer taken off\?\)/);
    expect(rec.strain[39]).toBe(rec.strain[34]);
    // The stress NaN in the last rows: rows after the data.
    const end = parseRecordText(text((i, j) => (i >= 38 && j === 2 ? 'NaN' : rows[i]![j]!)), { file: 'e.csv' });
    expect(end.rows).toBe(38);
    expect(end.warnings.join('\n')).toMatch(/lines 40–41 after the data hold no reading in "Stress \[MPa\]" \(empty or NaN\): left out; the record ends at line 39/);
  });
});
