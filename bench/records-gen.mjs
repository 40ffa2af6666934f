// Writes INVENTED tensile records for the record benchmarks: a Swift-law steel (K 600 MPa, ε0 0.01,
// n 0.22, E 200 GPa), seeded Gaussian noise of 1 MPa, a toe and a necking branch, as a two-column
// CSV "Strain [%],Stress [MPa]" (about 21 bytes a row). Used by bench/import.mjs, bench/analyze.mjs
// and bench/notebook-records.mjs; also runnable: node bench/records-gen.mjs ROWS FILE
import { createWriteStream } from 'node:fs';
import { synthesizeRecord, xoshiro128ss } from '../dist/core/index.js';

/** The invented record with about `rows` points (the strain step scales with 1/rows). */
export function inventedRecord(rows) {
  return synthesizeRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, elasticModulus: 200000, rng: xoshiro128ss(42), noise: 1, toe: 1e-4, step: 2.712e-6 * 100_000 / rows, necking: { extraStrain: 0.06, dropTo: 0.7 } });
}

/** Writes the invented record as CSV; resolves to the number of data rows. */
export function writeInventedRecord(file, rows) {
  const rec = inventedRecord(rows);
  return new Promise((resolve, reject) => {
    const w = createWriteStream(file);
    w.on('error', reject);
    w.write('Strain [%],Stress [MPa]\n');
    const n = rec.strain.length;
    let i = 0;
    const write = () => {
      let ok = true;
      while (i < n && ok) {
        let chunk = '';
        for (let k = 0; k < 2000 && i < n; k++, i++) chunk += `${(rec.strain[i] * 100).toFixed(6)},${rec.stress[i].toFixed(4)}\n`;
        ok = w.write(chunk);
      }
      if (i < n) w.once('drain', write);
      else w.end(() => resolve(n));
    };
    write();
  });
}

if (import.meta.filename === process.argv[1]) {
  const n = await writeInventedRecord(process.argv[3], Number(process.argv[2]));
  console.log(`${n} rows written to ${process.argv[3]}`);
}
