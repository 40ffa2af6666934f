// An unload–reload loop just past yield (to measure E on unloading, or the permanent-set strength Rr, ISO 6892-1
// practice: from memory) is part of many real test programmes. Its fall along the elastic slope lies below the
// elastic line and was read as a yield drop. The checks compare each analysis with the same invented record without
// the loop (the truth: synthesizeRecord's known law) — invented curves, no outside data.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeRecord, synthesizeRecord, xoshiro128ss, type LawSpec } from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';
import { expectRelClose } from '../../helpers.js';

const E = 200000;
const swift: LawSpec = { law: 'swift', K: 600, eps0: 0.01, n: 0.22 };

function record(plasticStrains: number[], yieldPoint?: { upperRatio: number; luedersStrain: number }, seed = 4) {
  return synthesizeRecord({
    law: swift, elasticModulus: E, rng: xoshiro128ss(seed), noise: 0.3, startStrain: 0.002,
    ...(plasticStrains.length ? { cycles: { plasticStrains, unloadTo: 0.1 } } : {}),
    ...(yieldPoint ? { yieldPoint } : {}),
    necking: { extraStrain: 0.05, dropTo: 0.7 },
  });
}

describe('unload–reload loops near yield are not yield drops', () => {
  for (const ep of [0.001, 0.002, 0.004]) {
    it(`continuous curve, one loop at plastic strain ${ep}: no ReH/ReL, the cycle found, Rp0.2 and Rm as without it`, () => {
      const plain = analyzeRecord({ strain: record([]).strain, stress: record([]).stress });
      const r = record([ep]);
      const a = analyzeRecord({ strain: r.strain, stress: r.stress });
      expect(a.upperYield).toBeNull();
      expect(a.lowerYield).toBeNull();
      expect(a.cycles).toHaveLength(1);
      expectRelClose(a.proofStrength!, plain.proofStrength!, 0.003, 'Rp0.2');
      expectRelClose(a.tensileStrength, plain.tensileStrength, 0.001, 'Rm');
    });
  }

  it('a loop on the Lüders plateau leaves ReH, ReL and Ae as without it', () => {
    const yp = { upperRatio: 1.08, luedersStrain: 0.015 };
    const plain = analyzeRecord({ strain: record([], yp).strain, stress: record([], yp).stress });
    const r = record([0.006], yp);
    const a = analyzeRecord({ strain: r.strain, stress: r.stress });
    expect(plain.upperYield).not.toBeNull();
    expect(a.upperYield).not.toBeNull();
    expect(a.cycles).toHaveLength(1);
    expectRelClose(a.upperYield!, plain.upperYield!, 0.003, 'ReH');
    expectRelClose(a.lowerYield!, plain.lowerYield!, 0.003, 'ReL');
    expect(Math.abs(a.yieldPointElongationPct! - plain.yieldPointElongationPct!)).toBeLessThan(0.1);
  });
});

// Open data: Fraunhofer IWM / IWT Bremen, Platform MaterialDigital, 42CrMoS4 record 46NT71 (CC BY 4.0;
// test/fixtures/42crmos4/ATTRIBUTION.md), with an invented loop spliced in: unloaded along the record's own E
// (the producers' "Slope of linear-elastic region") to a tenth of the stress and reloaded, at several strains.
describe('an invented loop in the open 46NT71 record', () => {
  const f = '46NT71.csv';
  const rec = parseRecordText(readFileSync(join(import.meta.dirname, '..', '..', 'fixtures', '42crmos4', f), 'utf8'), { file: f });
  const E46 = Number(rec.metadata.get('slope of linear-elastic region')!.value);
  const ref = (key: string) => Number(rec.metadata.get(key)!.value);
  for (const at of [0.0062, 0.0075, 0.009, 0.012]) {
    it(`a loop at ${(at * 100).toFixed(2)} % strain: Rp0.2, Rm and A still the producers', no yield drop`, () => {
      const strain: number[] = [], stress: number[] = [];
      let done = false;
      for (let i = 0; i < rec.strain.length; i++) {
        const e = rec.strain[i]!, s = rec.stress[i]!;
        strain.push(e); stress.push(s);
        if (!done && e > at) {
          done = true;
          for (let k = 1; k < 30; k++) { const x = s - (0.9 * s * k) / 29; strain.push(e - (s - x) / E46); stress.push(x); }
          for (let k = 1; k < 30; k++) { const x = 0.1 * s + (0.9 * s * k) / 29; strain.push(e - (s - x) / E46); stress.push(x); }
        }
      }
      const a = analyzeRecord({ strain, stress }, { fit: false });
      expect(a.cycles).toHaveLength(1);
      expect(a.upperYield).toBeNull();
      expectRelClose(a.proofStrength!, ref('yield stress at 0.2% plastic strain'), 3e-3, 'Rp0.2');
      expectRelClose(a.tensileStrength, ref('ultimate tensile strength'), 1e-3, 'Rm');
      expect(Math.abs(a.totalElongationPct - ref('elongation after fracture'))).toBeLessThan(0.3);
    });
  }
});
