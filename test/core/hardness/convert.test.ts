import { describe, expect, it } from 'vitest';
import { convertHardness, hardnessConversions, hardnessTableRange, InputError, STEEL_TABLE } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

// The steel table's values are FROM MEMORY of ISO 18265 Table A.1 / ASTM E140 Table 1 (see
// src/core/hardness/conversionTables.ts): these tests check the conversion code and the table's
// internal consistency against rules of thumb, not the printed standard.
describe('convertHardness(hv, "steel", scale)', () => {
  it('returns the table row at a tabulated Vickers number', () => {
    expect(convertHardness(200, 'steel', 'HRB').value).toBe(91.5);
    expect(convertHardness(300, 'steel', 'HRC').value).toBe(29.8);
    expect(convertHardness(240, 'steel', 'HRC').value).toBe(20.3); // first HRC row: no interpolation with a blank
    expect(convertHardness(100, 'steel', 'Rm').value).toBe(320);
    expect(convertHardness(450, 'steel', 'HB').value).toBe(428);
  });
  it('interpolates linearly between rows and marks every value approximate, with its source', () => {
    const c = convertHardness(205, 'steel', 'HB');
    expectRelClose(c.value, (190 + 199) / 2, 1e-15);
    expect(c.approximate).toBe(true);
    expect(c.source).toMatch(/ISO 18265.*from memory/);
  });
  it('refuses a value outside the table range, naming the value and the range', () => {
    const refused = (hv: number, scale: 'HB' | 'HRB' | 'HRC' | 'Rm') => {
      try {
        convertHardness(hv, 'steel', scale);
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
        return (e as Error).message;
      }
      throw new Error(`HV ${hv} → ${scale} was not refused`);
    };
    expect(refused(84, 'HRB')).toMatch(/hardnessHV.*got 84.*\[85, 250\] HV/);
    expect(refused(251, 'HRB')).toMatch(/got 251.*\[85, 250\]/);
    expect(refused(239, 'HRC')).toMatch(/got 239.*\[240, 450\]/);
    expect(refused(460, 'Rm')).toMatch(/got 460.*\[85, 450\]/);
    expect(refused(Number.NaN, 'HB')).toMatch(/got NaN/);
  });
  it('hardnessConversions leaves out the scales whose range does not cover the value', () => {
    expect(Object.keys(hardnessConversions(120, 'steel')).sort()).toEqual(['HB', 'HRB', 'Rm']);
    expect(Object.keys(hardnessConversions(245, 'steel')).sort()).toEqual(['HB', 'HRB', 'HRC', 'Rm']);
    expect(hardnessConversions(50, 'steel')).toEqual({});
    expect(hardnessTableRange('steel', 'HRC')).toEqual([240, 450]);
  });
});

describe('convertHardness between the table\'s rows against ASTM E140 Table 1 rows indexed by HRC (values FROM MEMORY)', () => {
  // ASTM E140 Table 1 (non-austenitic steels) is printed by Rockwell C number; the code's table is
  // printed by Vickers number (ISO 18265 Table A.1 layout), so these HV values fall BETWEEN its rows and
  // check the interpolation as well as the rows. Recalled values (not looked up), HRC → HV, HB:
  // 25 → 266, 253; 30 → 302, 286; 35 → 345, 327; 40 → 392, 371; 45 → 446, 421.
  // Tolerances: ±0.5 HRC (half the table's 1-point step) and 2 % on HB (HB above ~400 is read with a
  // carbide ball in newer editions; the recalled value may be from either column).
  const rows: [hrc: number, hv: number, hb: number][] = [[25, 266, 253], [30, 302, 286], [35, 345, 327], [40, 392, 371], [45, 446, 421]];
  for (const [hrc, hv, hb] of rows) {
    it(`HV ${hv} → HRC ${hrc} (± 0.5) and HB ${hb} (± 2 %)`, () => {
      expect(Math.abs(convertHardness(hv, 'steel', 'HRC').value - hrc), `HRC at HV ${hv}`).toBeLessThanOrEqual(0.5);
      expectRelClose(convertHardness(hv, 'steel', 'HB').value, hb, 0.02, `HB at HV ${hv}`);
    });
  }
});

// A CONSISTENCY check, not a check against a printed table: the rules of thumb below are the ones the
// table's values were checked against when they were written down (see conversionTables.ts).
describe('the steel table is consistent with itself and with rules of thumb (consistency check only)', () => {
  it('every column rises with HV (a conversion must be monotone to be inverted)', () => {
    for (const [scale, col] of Object.entries(STEEL_TABLE.values)) {
      let prev = -Infinity;
      col.forEach((v, i) => {
        if (v === null) return;
        expect(v, `${scale} at HV ${STEEL_TABLE.hv[i]}`).toBeGreaterThan(prev);
        prev = v;
      });
    }
  });
  it('HB ≈ 0.95·HV within 3 % and Rm ≈ 3.2·HV within 5 % (common practice for steels)', () => {
    STEEL_TABLE.hv.forEach((hv, i) => {
      expectRelClose(STEEL_TABLE.values.HB[i]!, 0.95 * hv, 0.03, `HB at HV ${hv}`);
      expectRelClose(STEEL_TABLE.values.Rm[i]!, 3.2 * hv, 0.05, `Rm at HV ${hv}`);
    });
  });
});
