import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeRecord, LAW_NAMES } from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';

// Issue 12's aim for the law fits, checked on real records: each law's RMSE no worse than SciPy's by more than 1 %.
// Records: the ten open 42CrMoS4 tensile tests (MaterialDigital, CC BY 4.0; test/fixtures/42crmos4/ATTRIBUTION.md),
// flow curves as analyzeRecord extracts them. Reference: scipy.optimize.curve_fit (method 'trf', bounds of
// LAW_PARAMETERS, ftol = xtol = gtol = 1e-14) from our start values, the blend with α free; RMSE in MPa.
// Re-run with `npm run build && node bench/fitter-scipy-open.mjs` whenever the record estimators move the flow curves.
// Before the blend held α (fitLawGroup) it stuck at its Swift part on six of these records (RMSE 1.36–1.74× SciPy's)
// and Hockett–Sherby did not converge on four (σsat crawling towards its bound).
const ref: Record<string, { points: number } & Record<string, number>> = {
    // SciPy 1.17.1, numpy 2.4.6
    '46NT71': { points: 238, hollomon: 9.49942437621394, ludwik: 2.2062267126405226, swift: 1.6341750216407631, voce: 1.299924168764659, hockettSherby: 0.7395494062513255, swiftVoce: 1.2999241687646275 },
    '46NT73': { points: 238, hollomon: 9.049722159329198, ludwik: 2.04471812204214, swift: 1.5074858983858859, voce: 1.1774468893942873, hockettSherby: 0.743155983832211, swiftVoce: 1.177446889394297 },
    '46NT99': { points: 231, hollomon: 7.37205676888604, ludwik: 1.3166351361271331, swift: 1.0954968094132966, voce: 1.0818613299000486, hockettSherby: 0.9775844399951509, swiftVoce: 0.8673372713404248 },
    '46NT9B': { points: 235, hollomon: 7.57939874854204, ludwik: 1.5061113211755006, swift: 1.265993025184088, voce: 1.2212543957138762, hockettSherby: 1.1371960375636099, swiftVoce: 1.034518123280051 },
    '46NTA1': { points: 236, hollomon: 6.570676953396008, ludwik: 1.325196115847141, swift: 1.4126638804780298, voce: 1.8362558037228298, hockettSherby: 1.2460116604782254, swiftVoce: 1.0412951164516986 },
    '46NTA3': { points: 194, hollomon: 6.383190193410148, ludwik: 1.2013904181643928, swift: 1.4349719036635713, voce: 1.9492156877455473, hockettSherby: 1.190717769402755, swiftVoce: 0.99791686323625 },
    '46NTAT': { points: 233, hollomon: 3.3601103572799143, ludwik: 1.2720368279047205, swift: 1.7622719597810215, voce: 3.622041646820745, hockettSherby: 1.2724131826008063, swiftVoce: 1.0152566314505798 },
    '46NTAV': { points: 229, hollomon: 3.237067477454079, ludwik: 1.292241835150093, swift: 1.7712941413474985, voce: 3.698746929655435, hockettSherby: 1.292613054885348, swiftVoce: 1.7712941413473227 },
    '46NTBL': { points: 235, hollomon: 5.4113374876118305, ludwik: 1.2709511057050504, swift: 1.6420727636884969, voce: 2.474456767850915, hockettSherby: 1.271049765383469, swiftVoce: 1.0915850456407254 },
    '46NTBN': { points: 226, hollomon: 5.447767981494831, ludwik: 1.2602779717093782, swift: 1.6839976948501825, voce: 2.5110771236763783, hockettSherby: 1.2604575690292037, swiftVoce: 1.0800358669974743 },
};

const dir = join(import.meta.dirname, '..', '..', 'fixtures', '42crmos4');
describe('every law on every open 42CrMoS4 record: converged, RMSE within 1 % of SciPy curve_fit', () => {
  for (const [name, r] of Object.entries(ref)) {
    it(`${name}: six laws converged, each RMSE ≤ 1.01 × SciPy's, the blend no worse than its better part`, () => {
      const a = analyzeRecord(parseRecordText(readFileSync(join(dir, `${name}.csv`), 'utf8'), { file: `${name}.csv` }));
      const fits = a.fits!.fits;
      expect(fits.map((f) => f.law)).toEqual(LAW_NAMES);
      for (const f of fits) {
        expect(f.points, `${name} flow-curve points`).toBe(r.points);
        expect(f.converged, `${name} ${f.law} converged`).toBe(true);
        expect(f.rmse, `${name} ${f.law} RMSE against SciPy's ${r[f.law]}`).toBeLessThanOrEqual(1.01 * r[f.law]!);
      }
      const by = Object.fromEntries(fits.map((f) => [f.law, f]));
      // A blend can always do at least as well as either of its parts (α = 1 or 0 with the part's parameters).
      expect(by.swiftVoce!.rmse).toBeLessThanOrEqual(Math.min(by.swift!.rmse, by.voce!.rmse) * (1 + 1e-9));
    });
  }
});
