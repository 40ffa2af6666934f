import type { TargetName, Warning } from './types.js';

/**
 * What each target is called where a person reads it (reports, notebooks, window notes, design
 * messages). The plan keys (`minYield`, ...) are field names for files and JSON; people read these
 * words. One table: notebooks and every report format use it through `src/report/labels.ts`.
 * A new target must add its words here (the type makes the table exhaustive).
 */
export const TARGET_LABELS: Readonly<Record<TargetName, string>> = {
  minYield: 'minimum reload yield (Rp0.2)',
  maxYield: 'maximum reload yield (Rp0.2)',
  minTensile: 'minimum tensile strength (Rm)',
  minRemainingElongationPct: 'minimum remaining uniform elongation',
  minHardnessHV: 'minimum hardness (HV)',
  maxHardnessHV: 'maximum hardness (HV)',
  maxSpringbackDeg: 'maximum springback',
  temper: 'temper',
};

/**
 * A target's name in words; a temper target with its designation and, when given, its name
 * (`temper H04 (hard)`).
 * @example targetLabel('maxYield') // 'maximum reload yield (Rp0.2)'
 */
export function targetLabel(name: string, temper?: string, temperName?: string): string {
  if (name === 'temper') return temper ? `temper ${temper}${temperName ? ` (${temperName})` : ''}` : 'temper';
  const l = (TARGET_LABELS as Readonly<Record<string, string>>)[name];
  if (l === undefined) throw new Error(`targetLabel: no words known for target "${name}"; add it to TARGET_LABELS in src/core/route/targetLabels.ts`);
  return l;
}

/**
 * A ledger warning's code in words, for the warnings column of human reports (the message says the
 * rest; CSV and JSON keep the codes). Exhaustive over `Warning['code']`.
 */
export const WARNING_LABELS: Readonly<Record<Warning['code'], string>> = {
  necking: 'necking',
  extrapolated: 'extrapolated',
  yieldRatio: 'yield ratio',
  drawability: 'drawability',
  capacity: 'capacity',
  heating: 'heating',
  bite: 'bite',
  sheetLimit: 'sheet limit',
  reversal: 'reversal',
  bend: 'bend',
  grainGrowth: 'grain growth',
};
