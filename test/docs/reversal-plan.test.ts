import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadPlanText, runPlan } from '../../src/plan/load.js';

// The plan shown in docs/reversal-and-springback.md ("Plan fields") is run as written (documented
// examples are tests, STYLE.md).
const ROOT = join(import.meta.dirname, '..', '..');

describe('docs/reversal-and-springback.md: the plan-fields block is a valid plan that runs', () => {
  it('loads, evaluates, and reports reverse yield and springback', () => {
    const page = readFileSync(join(ROOT, 'docs', 'reversal-and-springback.md'), 'utf8');
    const section = page.slice(page.indexOf('## Plan fields'));
    const block = /```json\n([\s\S]*?)```/.exec(section)![1]!;
    const plan = loadPlanText(block, 'reversal-and-springback.json');
    const led = runPlan(plan);
    expect(led.rows.map((r) => r.kind)).toEqual(['strain', 'reverse', 'bend']);
    expect(led.rows[1]!.reverseReloadYield).toBeGreaterThan(0);
    expect(led.rows[2]!.springbackDeg).toBeGreaterThan(0);
    expect(led.targets.find((t) => t.name === 'maxSpringbackDeg')).toBeDefined();
  });
});
