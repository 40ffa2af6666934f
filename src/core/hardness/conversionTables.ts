import type { ConversionGroup, HardnessScale } from './types.js';

/** One conversion table: HV rows ascending, and per scale the value at each row (null where the table has none). */
export interface ConversionTable {
  group: ConversionGroup;
  /** What the table applies to, in words. */
  appliesTo: string;
  /** Where the table is printed and how its values were obtained. */
  source: string;
  hv: readonly number[];
  values: Readonly<Record<HardnessScale, readonly (number | null)[]>>;
}

const _ = null;

/**
 * Non-austenitic (unalloyed and low-alloy) steels, Vickers → Brinell (HBS, 10 mm steel ball, 3000 kgf),
 * Rockwell B, Rockwell C and tensile strength Rm (MPa). The rows are those of the steel table of
 * ISO 18265 (Table A.1, formerly DIN 50150) and ASTM E140 (Table 1, non-austenitic steels).
 * Every value here is FROM MEMORY: written without the printed standard at hand. They agree with
 * the rules of thumb HB ≈ 0.95·HV and Rm ≈ 3.2·HV (common practice), which a test checks, but not
 * with a page that was looked up; confirm against the standard before relying on a converted value.
 * Conversions are approximate by nature (the standards say so): a converted number is an estimate.
 */
export const STEEL_TABLE: ConversionTable = {
  group: 'steel',
  appliesTo: 'unalloyed and low-alloy steels, non-austenitic (not stainless austenitic, not cold-worked austenitic)',
  source: 'ISO 18265 Table A.1 / ASTM E140 Table 1 (values from memory, not checked against a printed copy)',
  hv: [
    85, 90, 95, 100, 110, 120, 130, 140, 150, 160, 170, 180, 190, 200, 210, 220, 230, 240, 250,
    260, 270, 280, 290, 300, 310, 320, 330, 340, 350, 360, 370, 380, 390, 400, 410, 420, 430, 440, 450,
  ],
  values: {
    HB: [
      80.7, 85.5, 90.2, 95.0, 105, 114, 124, 133, 143, 152, 162, 171, 181, 190, 199, 209, 219, 228, 238,
      247, 257, 266, 276, 285, 295, 304, 314, 323, 333, 342, 352, 361, 371, 380, 390, 399, 409, 418, 428,
    ],
    HRB: [
      41.0, 48.0, 52.0, 56.2, 62.3, 66.7, 71.2, 75.0, 78.7, 81.7, 85.0, 87.1, 89.5, 91.5, 93.5, 95.0, 96.7, 98.1, 99.5,
      _, _, _, _, _, _, _, _, _, _, _, _, _, _, _, _, _, _, _, _,
    ],
    HRC: [
      _, _, _, _, _, _, _, _, _, _, _, _, _, _, _, _, _, 20.3, 22.2,
      24.0, 25.6, 27.1, 28.5, 29.8, 31.0, 32.2, 33.3, 34.4, 35.5, 36.6, 37.7, 38.8, 39.8, 40.8, 41.8, 42.7, 43.6, 44.5, 45.3,
    ],
    Rm: [
      270, 285, 305, 320, 350, 385, 415, 450, 480, 510, 545, 575, 610, 640, 675, 705, 740, 770, 800,
      835, 865, 900, 930, 965, 995, 1030, 1060, 1095, 1125, 1155, 1190, 1220, 1255, 1290, 1320, 1350, 1385, 1420, 1455,
    ],
  },
};

/** The conversion tables the project includes, by material group. Copper and aluminium have none yet. */
export const CONVERSION_TABLES: Readonly<Record<ConversionGroup, ConversionTable>> = { steel: STEEL_TABLE };

/** The groups with a table. */
export const CONVERSION_GROUPS = Object.keys(CONVERSION_TABLES) as ConversionGroup[];

/** The scales a Vickers number converts to. */
export const HARDNESS_SCALES: readonly HardnessScale[] = ['HB', 'HRB', 'HRC', 'Rm'];
