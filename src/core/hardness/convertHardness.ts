import { InputError } from '../errors.js';
import { CONVERSION_GROUPS, CONVERSION_TABLES, HARDNESS_SCALES } from './conversionTables.js';
import type { ConversionGroup, HardnessScale } from './types.js';

/** A converted value: always approximate, with the table it came from. */
export interface ConvertedHardness {
  scale: HardnessScale;
  value: number;
  approximate: true;
  source: string;
}

/**
 * The range of Vickers numbers a group's table covers for a scale, [lowest, highest] HV, or null when
 * the group has no table or the table no values for the scale.
 * @example hardnessTableRange('steel', 'HRB') // [85, 250]
 */
export function hardnessTableRange(group: ConversionGroup, scale: HardnessScale): readonly [number, number] | null {
  const t = CONVERSION_TABLES[group];
  if (!t) return null;
  const col = t.values[scale];
  let lo: number | null = null;
  let hi: number | null = null;
  for (let i = 0; i < t.hv.length; i++) {
    if (col[i] === null) continue;
    if (lo === null) lo = t.hv[i]!;
    hi = t.hv[i]!;
  }
  return lo === null || hi === null ? null : [lo, hi];
}

/**
 * Converts a Vickers number to another scale (HB, HRB, HRC) or to an estimated tensile strength Rm
 * (MPa) with a published conversion table for the material group (ISO 18265 / ASTM E140; see
 * {@link STEEL_TABLE} for what is included and how the values were obtained), by linear
 * interpolation between adjacent rows. Conversions are empirical and approximate; outside the table's
 * range, or for a group without a table, there is no conversion and the call is refused.
 * Units: HV kgf/mm²; HB kgf/mm²; HRB, HRC Rockwell numbers; Rm MPa.
 * @throws InputError naming `path` with the value and the table's range when `hv` is outside it, and
 * naming the group when no table applies.
 * @example convertHardness(200, 'steel', 'HRB').value // 91.5 (approximate)
 */
export function convertHardness(hv: number, group: ConversionGroup, scale: HardnessScale, path = 'hardnessHV'): ConvertedHardness {
  const t = CONVERSION_TABLES[group];
  if (!t) throw new InputError('conversionGroup', group, `one of ${CONVERSION_GROUPS.join(', ')}`, 'no hardness conversion table for this material group');
  if (!HARDNESS_SCALES.includes(scale)) throw new InputError('scale', scale, `one of ${HARDNESS_SCALES.join(', ')}`);
  const range = hardnessTableRange(group, scale);
  if (range === null || !(hv >= range[0] && hv <= range[1])) {
    throw new InputError(path, hv, range ? `a Vickers number in [${range[0]}, ${range[1]}] HV, the range of the ${group} table for ${scale}` : `a scale the ${group} table has`, `no ${scale} conversion outside the table`);
  }
  const col = t.values[scale];
  // An exact row, or linear interpolation between the rows around hv (both inside the scale's range,
  // since the range ends are rows and the scale's column has no gaps).
  const exact = t.hv.indexOf(hv);
  let value: number;
  if (exact >= 0) value = col[exact]!;
  else {
    let i = 0;
    while (t.hv[i + 1]! < hv) i++;
    const h0 = t.hv[i]!;
    const h1 = t.hv[i + 1]!;
    const v0 = col[i]!;
    const v1 = col[i + 1]!;
    value = v0 + ((v1 - v0) * (hv - h0)) / (h1 - h0);
  }
  return { scale, value, approximate: true, source: t.source };
}

/**
 * Every conversion of `hv` the group's table allows, keyed by scale; scales outside their range are
 * left out (no value rather than an extrapolated one).
 * @example hardnessConversions(200, 'steel') // { HB: 190, HRB: 91.5, Rm: 640 }
 */
export function hardnessConversions(hv: number, group: ConversionGroup): Partial<Record<HardnessScale, number>> {
  const out: Partial<Record<HardnessScale, number>> = {};
  for (const s of HARDNESS_SCALES) {
    const r = hardnessTableRange(group, s);
    if (r && hv >= r[0] && hv <= r[1]) out[s] = convertHardness(hv, group, s).value;
  }
  return out;
}
