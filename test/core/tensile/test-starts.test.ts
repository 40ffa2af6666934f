import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeRecord, synthesizeRecord, xoshiro128ss, type LawSpec } from '../../../src/core/index.js';
import { testStarts } from '../../../src/core/tensile/testStarts.js';
import { parseRecordText } from '../../../src/records/parse.js';
import { recordCurveChart } from '../../../src/charts/records.js';
import { parseHTML } from 'linkedom';

// Several specimens exported one after another into one file, with no header between them. Read as one test, the
// second specimen's elastic rise had been taken for an unload–reload cycle of the first (chord E 6.8 GPa, a negative
// permanent strain) and its top for Rm: 46NT71 followed by 46NT73 gave Rm 1233.1 MPa and Ag 3.05 % (the producers
// report 1198.7 MPa and 5.21 % for 46NT71, 1198.9 MPa for 46NT73) with no warning.

const ROOT = join(import.meta.dirname, '..', '..', '..');
const FIX = join(ROOT, 'test', 'fixtures', '42crmos4');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const OPEN = ['46NT71', '46NT73', '46NTBL'];

/** The data lines of an open 42CrMoS4 record (MaterialDigital, CC BY 4.0): every line after its header and units lines. */
const dataLines = (name: string) => {
  const lines = readFileSync(join(FIX, `${name}.csv`), 'utf8').split(/\r?\n/);
  const header = lines.findIndex((l) => l.startsWith('Time\t'));
  return lines.slice(header + 2).filter((l) => l.trim() !== '');
};
/** The three records as one file: the first whole (metadata, header, units), the others' data lines appended. */
const stackedText = () => readFileSync(join(FIX, `${OPEN[0]}.csv`), 'utf8').trimEnd() + '\n' + OPEN.slice(1).map((n) => dataLines(n).join('\n')).join('\n') + '\n';
const props = (a: ReturnType<typeof analyzeRecord>) => [a.elasticModulus, a.proofStrength, a.tensileStrength, a.uniformElongationPct, a.totalElongationPct];

function invented(law: LawSpec, E: number, seed: number, extra: Partial<Parameters<typeof synthesizeRecord>[0]> = {}) {
  return synthesizeRecord({ law, elasticModulus: E, rng: xoshiro128ss(seed), noise: 0.5, startStrain: 0.002, necking: { extraStrain: 0.03, dropTo: 0.8 }, ...extra });
}

describe('a record that holds several tests (testStarts)', () => {
  it('three open 42CrMoS4 records in one file: found where each begins; the first analysed exactly as its own file, the others said', () => {
    const stacked = parseRecordText(stackedText(), { file: 'stacked.csv' });
    const alone = OPEN.map((n) => parseRecordText(readFileSync(join(FIX, `${n}.csv`), 'utf8'), { file: `${n}.csv` }));
    const n0 = alone[0]!.strain.length, n1 = alone[1]!.strain.length;
    expect(stacked.strain.length).toBe(n0 + n1 + alone[2]!.strain.length);
    expect(testStarts(stacked.strain, stacked.stress)).toEqual([n0, n0 + n1]);
    const a = analyzeRecord(stacked);
    // Every property of the first test is the one its own file gives (the same samples, the same analysis).
    expect(props(a)).toEqual(props(analyzeRecord(alone[0]!)));
    expect(a.warnings[0]!.code).toBe('secondTest');
    expect(a.warnings[0]!.message).toContain(`sample ${n0}, sample ${n0 + n1}`);
    expect(a.warnings[0]!.message).toContain('3 tests');
    expect(a.cycles).toHaveLength(0);
    expect(a.furtherTests).toEqual([n0, n0 + n1]);
    // The record bench's curve chart draws the first test only: one vertex per sample of it (768, under the chart's
    // 2,000-point thinning), not the 2,212 of the file with lines running back from one test's end to the next start.
    const { document } = parseHTML('<!doctype html><html><body></body></html>');
    const svg = recordCurveChart(stacked, a, { document: document as unknown as Document });
    const paths = [...(svg as unknown as Element).querySelectorAll('path')].map((p) => (p.getAttribute('d') ?? '').split(/[ML]/).filter(Boolean).length);
    expect(Math.max(...paths)).toBe(n0);
    // Reference: the producers' Rm of 46NT71, "Ultimate tensile strength: 1198.73 MPa" in the file's header (0.1 %, as open-data.test.ts).
    expect(Math.abs(a.tensileStrength / 1198.73 - 1)).toBeLessThan(1e-3);
  });

  it('INVENTED records of three materials in one file, noisy: each start found at the first sample of the next test', () => {
    const parts = [
      invented({ law: 'swift', K: 800, eps0: 0.01, n: 0.2 }, 205000, 1),
      invented({ law: 'voce', sigma0: 240, Q: 110, b: 14 }, 70000, 2),
      invented({ law: 'hollomon', K: 1500, n: 0.06 }, 200000, 3), // a high-strength steel: Ag about 6 %
    ];
    const strain = parts.flatMap((p) => p.strain), stress = parts.flatMap((p) => p.stress);
    const n0 = parts[0]!.strain.length, n1 = parts[1]!.strain.length;
    expect(testStarts(strain, stress)).toEqual([n0, n0 + n1]);
    const a = analyzeRecord({ strain, stress });
    expect(props(a)).toEqual(props(analyzeRecord(parts[0]!)));
    expect(a.warnings[0]!.code).toBe('secondTest');
  });

  it('no start in one specimen: unload–reload cycles just past 1 % strain (steel and aluminium), dropped readings, a strain reset under load, samples at zero after fracture', () => {
    // Unloaded from e_max to zero load the strain keeps e_max − s/E: with e_max just over 1 % that is the closest an
    // unloading comes to a start. A 1,500 MPa steel (s/E 0.75 %) and a 400 MPa aluminium alloy (0.57 %), INVENTED.
    const steel = invented({ law: 'swift', K: 1700, eps0: 0.02, n: 0.05 }, 200000, 4, { cycles: { plasticStrains: [0.003, 0.005, 0.02], unloadTo: 0 } });
    const alu = invented({ law: 'voce', sigma0: 300, Q: 120, b: 12 }, 70000, 5, { cycles: { plasticStrains: [0.005, 0.006, 0.03], unloadTo: 0 } });
    for (const r of [steel, alu]) {
      expect(testStarts(r.strain, r.stress)).toEqual([]);
      const a = analyzeRecord(r);
      expect(a.warnings.map((w) => w.code)).not.toContain('secondTest');
      expect(a.cycles.length).toBe(3);
      // A reading dropped to zero on both channels while the last cycle reloads (strain below its largest so far,
      // stress above half the highest): the reload goes on at more than half the largest strain, no new specimen.
      let eMax = 0, sMax = 0, at = -1;
      for (let i = 0; i < r.strain.length && at < 0; i++) {
        if (r.strain[i]! < eMax - 0.0005 && r.stress[i]! > 0.6 * sMax && r.strain[i - 1]! < r.strain[i]!) at = i;
        eMax = Math.max(eMax, r.strain[i]!); sMax = Math.max(sMax, r.stress[i]!);
      }
      expect(at).toBeGreaterThan(0);
      const strain = r.strain.slice(), stress = r.stress.slice();
      strain[at] = 0; stress[at] = 0;
      expect(testStarts(strain, stress)).toEqual([]);
    }
    const base = invented({ law: 'swift', K: 800, eps0: 0.01, n: 0.2 }, 205000, 6);
    const N = base.strain.length;
    // One to three samples dropped to zero on both channels mid-test: the strain comes back where it left.
    for (const run of [1, 2, 3]) {
      const strain = base.strain.slice(), stress = base.stress.slice();
      for (let i = 0; i < run; i++) { strain[Math.floor(N / 2) + i] = 0; stress[Math.floor(N / 2) + i] = 0; }
      expect(testStarts(strain, stress), `run ${run}`).toEqual([]);
    }
    // The extensometer taken off under load (strain channel back to zero while the force goes on), then fracture.
    {
      const strain = base.strain.map((e, i) => (i > 0.7 * N ? 1e-5 * (i % 3) : e));
      expect(testStarts(strain, base.stress)).toEqual([]);
    }
    // 200,000 samples at zero strain and zero load after fracture (a logger left running; every one a candidate):
    // none, and one forward search for them all (this would take minutes if each searched on its own).
    {
      const strain = base.strain.concat(new Array(200_000).fill(0)), stress = base.stress.concat(Array.from({ length: 200_000 }, (_, i) => 0.3 * Math.sin(i)));
      expect(testStarts(strain, stress)).toEqual([]);
    }
  });

  it('strainledger analyze splits such a file: one specimen per test, each as its own file gives it, with its sample range', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-starts-'));
    const file = join(dir, 'three-specimens.csv');
    writeFileSync(file, stackedText());
    const r = spawnSync(process.execPath, [BIN, 'analyze', file, '--format', 'json'], { encoding: 'utf8' });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.records).toHaveLength(3);
    let from = 0;
    OPEN.forEach((name, k) => {
      const own = JSON.parse(spawnSync(process.execPath, [BIN, 'analyze', join(FIX, `${name}.csv`), '--format', 'json'], { encoding: 'utf8' }).stdout);
      const part = j.records[k];
      expect(part.record.test).toEqual({ index: k + 1, of: 3, fromSample: from, toSample: from + own.record.rows - 1 });
      for (const key of ['elasticModulus', 'proofStrength', 'tensileStrength', 'uniformElongationPct', 'totalElongationPct']) expect(part[key], `${name} ${key}`).toBe(own[key]);
      from += own.record.rows;
    });
    expect(j.summary.tensileStrength.n).toBe(3);
    const t = spawnSync(process.execPath, [BIN, 'analyze', file], { encoding: 'utf8' }).stdout;
    expect(t).toContain('test 2 of 3 (samples');
  });
});
