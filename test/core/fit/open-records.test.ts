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
    '46NT71': { points: 236, hollomon: 9.491312814711252, ludwik: 2.165291148540588, swift: 1.6045887708744873, voce: 1.2848449536427557, hockettSherby: 0.7412244634554556, swiftVoce: 1.2848449536427655 },
    '46NT73': { points: 237, hollomon: 9.047077351037812, ludwik: 2.023907467204581, swift: 1.4921261565891295, voce: 1.1694994639609402, hockettSherby: 0.7434598607253985, swiftVoce: 1.1694994639609375 },
    '46NT99': { points: 231, hollomon: 7.372056768886031, ludwik: 1.3166351361271451, swift: 1.095496809413295, voce: 1.0818613299000457, hockettSherby: 0.9775844399951666, swiftVoce: 0.8673372620910241 },
    '46NT9B': { points: 235, hollomon: 7.5793987485420535, ludwik: 1.5061113211755015, swift: 1.2659930251840827, voce: 1.2212543957138697, hockettSherby: 1.1371960375636292, swiftVoce: 1.03451783631308 },
    '46NTA1': { points: 236, hollomon: 6.570675756860561, ludwik: 1.3251961031023773, swift: 1.4126638726007468, voce: 1.8362557915389568, hockettSherby: 1.2460116868279307, swiftVoce: 1.0412951838084203 },
    '46NTA3': { points: 194, hollomon: 6.383190193410159, ludwik: 1.2013904181643966, swift: 1.4349719036635764, voce: 1.9492156877455589, hockettSherby: 1.1907177694132187, swiftVoce: 0.9979168632134345 },
    '46NTAT': { points: 233, hollomon: 3.3601108183169353, ludwik: 1.272036754631495, swift: 1.7622719697002487, voce: 3.622041660792785, hockettSherby: 1.2724131093632751, swiftVoce: 1.0152565480595508 },
    '46NTAV': { points: 229, hollomon: 3.2370674774540786, ludwik: 1.2922418351500926, swift: 1.7712941413474956, voce: 3.698746929655439, hockettSherby: 1.29261305488998, swiftVoce: 1.7712941413474026 },
    '46NTBL': { points: 235, hollomon: 5.411337487611839, ludwik: 1.270951105705057, swift: 1.6420727636884818, voce: 2.474456767850922, hockettSherby: 1.2710497653824822, swiftVoce: 1.0915850462642953 },
    '46NTBN': { points: 226, hollomon: 5.447767981494836, ludwik: 1.2602779717093826, swift: 1.6839976948502033, voce: 2.5110771236763743, hockettSherby: 1.260457569028601, swiftVoce: 1.080035867018796 },
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
