import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

// The batch scheduler (src/cli/batch.ts) on its worker path, forced on: the worker thread runs the
// built module (dist/, built by test/globalSetup.ts), as in the shipped runner. Outcomes must come
// back in the order of the plans, the same as on one thread, with the worker having done some of them
// (HTML reports: ~5 ms a plan, so the worker is surely up before the main thread is done).
const ROOT = join(import.meta.dirname, '..', '..');
const TMP = mkdtempSync(join(tmpdir(), 'sl-batch-'));
afterAll(() => rmSync(TMP, { recursive: true, force: true }));
const NOOP = { tick() {}, stop() {} };

describe('runTasks with worker threads', () => {
  it('gives the outcomes of one thread, in plan order, with the worker sharing the work (an invalid plan included)', async () => {
    const { runTasks } = await import(join(ROOT, 'dist', 'cli', 'batch.js')) as typeof import('../../src/cli/batch.js');
    const base = JSON.parse(readFileSync(join(ROOT, 'examples', 'contact-spring-strip.json'), 'utf8'));
    const files: string[] = [];
    for (let i = 0; i < 240; i++) {
      const p = structuredClone(base);
      p.name = `plan ${i} (INVENTED variation)`;
      p.steps[p.steps.length - 1].reductionPct = i === 123 ? 100 : 5 + (i % 40);
      const f = join(TMP, `p${i}.json`);
      writeFileSync(f, JSON.stringify(p));
      files.push(f);
    }
    const tasks = files.map((file) => ({ file, format: 'html' as const, overrides: [], render: true }));
    const one = await runTasks(tasks, 1, NOOP);
    const stats = { byWorkers: 0 };
    const seen: string[] = [];
    const two = await runTasks(tasks, 2, NOOP, (o) => seen.push(o.file), { eagerWorkers: true, stats });
    expect(stats.byWorkers).toBeGreaterThan(0);
    expect(stats.byWorkers).toBeLessThan(240);
    expect(seen.sort()).toEqual([...files].sort()); // every outcome announced once
    expect(two.map((o) => o.file)).toEqual(files);
    expect(two.map((o) => o.exit)).toEqual(one.map((o) => o.exit));
    expect(two[123]!.exit).toBe(2);
    expect(two.map((o) => o.output)).toEqual(one.map((o) => o.output));
    expect(two.every((o, i) => i === 123 || o.report!.plan.name === `plan ${i} (INVENTED variation)`)).toBe(true);
  });
});
