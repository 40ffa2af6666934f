// Real-browser test of the record bench with an open measured record.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { synthesizeLabRecord, synthesizeRecord, xoshiro128ss } from '../../src/core/index.js';
import { expectRelClose } from '../helpers.js';
import { withArNoise } from '../core/tensile/lab-records.helpers.js';
import { openPage, settled, startHarness, REPO, SCREENSHOTS, type Harness } from './browser.js';

let h: Harness;
beforeAll(async () => { h = await startHarness(); });
afterAll(async () => { await h?.close(); });

// Fixture: test/fixtures/42crmos4/46NT71.csv — Fraunhofer IWM / IWT Bremen, Platform MaterialDigital,
// materialdigital/demodata_tensiletest_42CrMoS4 (CC BY 4.0). The producers' properties are in the
// file's own header lines (DIN EN ISO 6892-1): Rp0.2 1132.33 MPa, Rm 1198.73 MPa, Ag 5.208 %.
const FIXTURE = join(REPO, 'test', 'fixtures', '42crmos4', '46NT71.csv');

type Page = import('playwright-core').Page;
const num = async (page: Page, q: string) => Number(await page.locator(`[data-q="${q}"] .sl-num`).innerText());

/** Drops a file on the drop zone the way a browser does (a DataTransfer with a File). */
async function dropFile(page: Page, name: string, text: string): Promise<void> {
  const dt = await page.evaluateHandle(([n, t]) => {
    const d = new DataTransfer();
    d.items.add(new File([t!], n!, { type: 'text/csv' }));
    return d;
  }, [name, text]);
  await page.dispatchEvent('#record-drop', 'drop', { dataTransfer: dt });
}

/** Drops `text` as a spreadsheet's UTF-16 text export: UTF-16LE with its byte-order mark, made in the page. */
async function dropUtf16(page: Page, name: string, text: string): Promise<void> {
  const dt = await page.evaluateHandle(([n, t]) => {
    const bytes = new Uint8Array(2 + 2 * t!.length);
    bytes[0] = 0xff; bytes[1] = 0xfe;
    for (let i = 0; i < t!.length; i++) { const c = t!.charCodeAt(i); bytes[2 + 2 * i] = c & 0xff; bytes[3 + 2 * i] = c >> 8; }
    const d = new DataTransfer();
    d.items.add(new File([bytes], n!, { type: 'text/plain' }));
    return d;
  }, [name, text]);
  await page.dispatchEvent('#record-drop', 'drop', { dataTransfer: dt });
}

/** Drops `bytes` as they are (a file in a Windows code page, say), made in the page. */
async function dropBytes(page: Page, name: string, bytes: Uint8Array): Promise<void> {
  const dt = await page.evaluateHandle(([n, b]) => {
    const d = new DataTransfer();
    d.items.add(new File([Uint8Array.from(b as number[])], n as string, { type: 'text/plain' }));
    return d;
  }, [name, Array.from(bytes)] as const);
  await page.dispatchEvent('#record-drop', 'drop', { dataTransfer: dt });
}

describe('record bench', () => {
  it('shows the INVENTED demo record before any file is dropped (no error cells); a dropped 100,000-point record is read and fitted in a web worker', async () => {
    const workers: string[] = [];
    const { page, errors } = await openPage(h, '/records/');
    page.on('worker', (w) => workers.push(w.url()));
    await settled(page, 'records');
    expect(await page.locator('.sl-error').count()).toBe(0);
    expect(await page.locator('#cell-record-name').innerText()).toContain('INVENTED demo record');
    expect(await page.locator('#demo-note').innerText()).toContain('INVENTED');
    expect(await page.locator('#fits-table tbody tr').count()).toBeGreaterThanOrEqual(5);
    await page.screenshot({ path: `${SCREENSHOTS}/records-demo.png`, fullPage: true });
    // An INVENTED 100,000-point record from a known Swift law (K 600 MPa, ε0 0.01, n 0.22, E 200 GPa).
    const rec = synthesizeRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, elasticModulus: 200000, rng: xoshiro128ss(42), noise: 1, toe: 1e-4, step: 2.712e-6, necking: { extraStrain: 0.06, dropTo: 0.7 } });
    let text = 'Strain [%],Stress [MPa]\n';
    for (let i = 0; i < rec.strain.length; i++) text += `${(rec.strain[i]! * 100).toFixed(6)},${rec.stress[i]!.toFixed(4)}\n`;
    expect(rec.strain.length).toBeGreaterThan(99_000);
    await dropFile(page, 'invented-100k.csv', text);
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('invented-100k'), { timeout: 60_000 }).toBe(true);
    await settled(page, 'records');
    expect(workers.some((u) => /records\/worker/.test(u)), workers.join(', ')).toBe(true);
    expect(await page.locator('#record-summary').innerText()).toContain(`${rec.strain.length} rows`);
    // The Swift fit recovers the law the record was made from (the noise is 1 MPa on ~600 MPa).
    const swiftRow = await page.locator('#fits-table tr[data-law="swift"]').innerText();
    expect(swiftRow).toMatch(/K 60[01]\.?\d*|K 599\.\d+/);
    expect(await page.locator('.sl-error').count()).toBe(0);
    await page.screenshot({ path: `${SCREENSHOTS}/records-100k.png`, fullPage: true });
    expect(errors).toEqual([]);
  });


  it('a spreadsheet\'s UTF-16 text export (UTF-16LE with its mark, tab-separated) of over 5 MB is read and fitted', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    // INVENTED: 150,000 points from a known Swift law (K 600 MPa, ε0 0.01, n 0.22, E 200 GPa); 6 MB as UTF-16.
    const rec = synthesizeRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, elasticModulus: 200000, rng: xoshiro128ss(7), noise: 1, toe: 0, step: 1.8e-6, necking: { extraStrain: 0.06, dropTo: 0.7 } });
    let text = 'Dehnung [%]\tSpannung [MPa]\r\n';
    for (let i = 0; i < rec.strain.length; i++) text += `${(rec.strain[i]! * 100).toFixed(6).replace('.', ',')}\t${rec.stress[i]!.toFixed(4).replace('.', ',')}\r\n`;
    expect(2 * text.length).toBeGreaterThan(5 * 1024 * 1024); // over the 5 MB the notebooks take for a plan
    await dropUtf16(page, 'unicode-export.txt', text);
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('unicode-export'), { timeout: 60_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('#record-summary').innerText()).toContain(`${rec.strain.length} rows`);
    expect(await page.locator('#fits-table tr[data-law="swift"]').innerText()).toMatch(/K 60[01]\.?\d*|K 599\.\d+/);
    expect(await page.locator('.sl-error').count()).toBe(0);
    expect(errors).toEqual([]);
  });

  it('a fixed-width text export in a Windows code page ("N/mm²" as one byte, columns aligned by spaces) is read as the runner reads it', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    // 46NT71 (MaterialDigital, CC BY 4.0) rewritten as such an export: its engineering strain and stress columns.
    const lines = readFileSync(FIXTURE, 'utf8').split(/\r?\n/);
    const head = lines.findIndex((l) => l.startsWith('Time\t'));
    const cols = lines[head]!.split('\t');
    const [e, s] = ['Engineering Strain', 'Engineering Stress'].map((c) => cols.indexOf(c));
    const rows = lines.slice(head + 2).filter((l) => l.trim() !== '').map((l) => l.split('\t')).filter((c) => c[e!] !== '' && c[s!] !== '')
      .map((c) => `${(Number(c[e!]) * 100).toFixed(5).padStart(12)}${Number(c[s!]).toFixed(3).padStart(12)}`);
    const text = ['Prüfer:  Müller', 'Temperatur:  23 °C', '', '  Dehnung    Spannung', '        %       N/mm²', ...rows].join('\r\n') + '\r\n';
    await dropBytes(page, 'aligned-cp1252.txt', Uint8Array.from(Buffer.from(text, 'latin1')));
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('aligned-cp1252'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('.sl-error').count()).toBe(0);
    expect(await page.locator('#record-summary').innerText()).toContain(`${rows.length} rows`);
    // Said as the runner says it; the header's words read right, and the column choices list them.
    expect(await page.locator('#cell-import').innerText()).toMatch(/read as Windows-1252 text: the file is not valid UTF-8/);
    expect(await page.locator('#record-summary').innerText()).toMatch(/stress: "Spannung" N\/mm²/);
    expect(await page.locator('#map-stress option').allInnerTexts()).toEqual(['(recognise by name)', '1: Dehnung', '2: Spannung']);
    await page.screenshot({ path: `${SCREENSHOTS}/records-code-page-aligned.png`, fullPage: true });
    // The producers' Rp0.2 1132.3 MPa and Rm 1198.7 MPa (header lines of 46NT71.csv).
    expectRelClose(await num(page, 'proofStrength'), 1132.3, 0.01, 'Rp0.2');
    expectRelClose(await num(page, 'tensileStrength'), 1198.7, 0.002, 'Rm');
    // A workbook dropped instead of its export: said so, with what to do; the record read before stays.
    await dropBytes(page, 'results.xlsx', Uint8Array.from([0x50, 0x4b, 0x03, 0x04, ...new Array(60).fill(0)]));
    await expect.poll(() => page.locator('#cell-import').innerText(), { timeout: 30_000 }).toMatch(/The file could not be read\nline 1, column 1: a spreadsheet workbook or another ZIP archive \(\.xlsx, \.ods\), not a text export; .*save the sheet/s);
    expectRelClose(await num(page, 'proofStrength'), 1132.3, 0.01, 'Rp0.2 still shown');
    expect(errors).toEqual([]);
  });

  it('a dropped 42CrMoS4 record gives its properties; a malformed record shows an error cell while the previous state stays', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    await dropFile(page, '46NT71.csv', readFileSync(FIXTURE, 'utf8'));
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('46NT71'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    // CHECKS.md: the producers' Rp0.2, Rm, Ag are reproducible to well under 1 % by the standard
    // definitions; Rm is the record's highest stress (shown to 0.1 MPa), Rp0.2 depends on the
    // fitted E (1 %), Ag on E and the toe (0.05 percentage points of 5.2 %, i.e. 1 %).
    expectRelClose(await num(page, 'tensileStrength'), 1198.73, 0.0001, 'Rm');
    expectRelClose(await num(page, 'proofStrength'), 1132.33, 0.01, 'Rp0.2');
    // Ag: the producers read it at the highest raw sample; on this flat top (within the noise over ~1.5 % strain)
    // ours is the top of a local fit (issue 12), checked against the producers' within the fitted span in
    // test/core/tensile/open-data.test.ts; here 0.2 point of 5.2 % (4 %). Measured 5.36 %.
    expectRelClose(await num(page, 'uniformElongation'), 5.208, 0.04, 'Ag');
    // E depends on the fit window (a few per cent, CHECKS.md); producer's slope 201876 MPa.
    expectRelClose(await num(page, 'elasticModulus'), 201.876, 0.05, 'E (GPa)');
    expect(await page.locator('[data-q="elasticModulus"]').innerText()).toMatch(/^\d+\.\d GPa$/);
    // A continuous curve has no upper yield point: it says so in words, not a dash.
    expect(await page.locator('[data-q="upperYield"]').innerText()).toBe('none (continuous yielding)');
    expect(await page.locator('#fits-table tbody tr').count()).toBeGreaterThanOrEqual(5);
    expect(await page.locator('#spread-table tbody tr').count()).toBeGreaterThanOrEqual(2);
    expect(await page.locator('#elastic-window').innerText()).toContain('points');
    // The record's noise, in MPa; 46NT71 follows its own curve's small wiggles, so no correlation of the noise is said.
    expect(await page.locator('#record-noise').innerText()).toMatch(/^Noise of the stress \(standard deviation\): \d\.\d MPa \(estimated from the record\)\.$/);
    // Every stress on a stated basis (docs/bases-and-units.md): certificate values engineering, laws true.
    expect(await page.locator('#stress-basis').innerText()).toMatch(/engineering stresses .* true stress against true plastic strain/);
    await page.screenshot({ path: `${SCREENSHOTS}/records.png`, fullPage: true });

    // A malformed record: the error names the line; the 46NT71 properties stay on screen.
    await dropFile(page, 'broken.csv', 'strain,stress [MPa]\n0,0\n0.001,abc\n');
    await expect.poll(() => page.locator('#cell-import .sl-error').count()).toBe(1);
    await settled(page, 'records');
    const msg = await page.locator('#cell-import .sl-error').innerText();
    expect(msg).toMatch(/line 3/);
    expect(msg).toContain('abc');
    expectRelClose(await num(page, 'tensileStrength'), 1198.73, 0.0001, 'Rm kept after a bad file');
    expect(await page.locator('#cell-record-name').innerText()).toContain('46NT71');
    await page.screenshot({ path: `${SCREENSHOTS}/records-error.png`, fullPage: true });

    // Send the chosen law to the route planner and use it there.
    await page.click('#save-material');
    expect(await page.locator('#save-state').innerText()).toContain('Saved');
    await page.goto(h.base + '/route/');
    await settled(page, 'route');
    await page.click('#use-bench');
    await settled(page, 'route');
    expect(await page.locator('#material-summary').innerText()).toContain('46NT71');
    expect(await page.locator('#ledger-table tbody tr').count()).toBeGreaterThan(0);
    expect(errors).toEqual([]);
  });

  it('the machine\'s travel as the strain: E refused, then the modulus field gives the specimen\'s E and the compliance is taken out', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    // 46NT71 (MaterialDigital, CC BY 4.0) read through its Machine Displacement and Force columns.
    const lines = readFileSync(FIXTURE, 'utf8').split(/\r?\n/);
    const head = lines.findIndex((l) => l.startsWith('Time\t'));
    const rows = lines.slice(head + 2).filter((l) => l.trim() !== '').map((l) => { const c = l.split('\t'); return [c[0], c[3], c[2]].join('\t'); });
    await dropFile(page, 'travel.csv', [...lines.slice(0, head), 'Time\tCrosshead\tForce', 's\tmm\tkN', ...rows].join('\n') + '\n');
    await expect.poll(() => page.locator('#cell-properties .sl-error').count(), { timeout: 30_000 }).toBe(1);
    expect(await page.locator('#cell-properties .sl-error').innerText()).toMatch(/outside the range of metals .*modulus field/s);
    // A value that is no modulus is said in the field's words and unit.
    await page.fill('#map-modulus', 'abc');
    await page.click('#apply-mapping');
    await expect.poll(async () => (await page.locator('#cell-properties .sl-error').innerText().catch(() => '')).includes('specimen\'s modulus E'), { timeout: 30_000 }).toBe(true);
    expect(await page.locator('#cell-properties .sl-error').innerText()).toMatch(/specimen's modulus E: got "?not a number"?, allowed a modulus in GPa above 0/);
    await page.fill('#map-modulus', '201.876');
    await page.click('#apply-mapping');
    await expect.poll(() => page.locator('#cell-properties .sl-error').count(), { timeout: 30_000 }).toBe(0);
    await settled(page, 'records');
    // Producers' Rp0.2 1132.3 MPa (header line of 46NT71.csv); the travel read as it is gives 873 MPa.
    expectRelClose(await num(page, 'proofStrength'), 1132.3, 0.01, 'Rp0.2 with the compliance taken out');
    expect(await page.locator('[data-q="elasticModulus"]').innerText()).toMatch(/^201\.9 GPa$/);
    expect(await page.locator('#cell-properties').innerText()).toMatch(/compliance, taken out as a linear spring/);
    expect(await page.locator('#map-modulus').inputValue()).toBe('201.876');
    // The curve as analysed: the axis says the compliance is out, and the elastic rise ends near 0.56 % (Rp0.2/E + 0.2 %), not 4 %.
    expect(await page.locator('#cell-curve-chart').innerText()).toContain('machine compliance taken out');
    // The parallel length (30 mm, a metadata line of the file) takes the plastic travel: Ag and A against the
    // producers' 5.21 % and 14.60 % (header lines of 46NT71.csv), 0.6 and 1.0 point high over the gauge length alone.
    expect(await page.locator('#cell-curve-chart').innerText()).toContain('plastic over Lc');
    expect(Math.abs(await num(page, 'uniformElongation') - 5.21)).toBeLessThan(0.5);
    expect(Math.abs(await num(page, 'totalElongation') - 14.60)).toBeLessThan(0.3);
    await page.screenshot({ path: `${SCREENSHOTS}/records-machine-travel.png`, fullPage: true });
    // The page's parallel-length field replaces the file's; one shorter than the gauge length is refused, naming both.
    await page.fill('#map-parallelLength', '20');
    await page.click('#apply-mapping');
    await expect.poll(async () => (await page.locator('.sl-error').allInnerTexts()).join('\n'), { timeout: 30_000 }).toMatch(/parallelLength: got 20, expected a length in mm from the gauge length \(25 mm\)/);
    expect(errors).toEqual([]);
  });

  it('the machine\'s travel sends no law to the other notebooks until the specimen\'s modulus and parallel length are given', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    // 46NT71 (MaterialDigital, CC BY 4.0) through its Machine Displacement, without its "Parallel length" metadata line.
    const lines = readFileSync(FIXTURE, 'utf8').split(/\r?\n/);
    const head = lines.findIndex((l) => l.startsWith('Time\t'));
    const rows = lines.slice(head + 2).filter((l) => l.trim() !== '').map((l) => { const c = l.split('\t'); return [c[0], c[3], c[2]].join('\t'); });
    await dropFile(page, 'travel-no-lc.csv', [...lines.slice(0, head).filter((l) => !l.startsWith('Parallel length')), 'Time\tCrosshead\tForce', 's\tmm\tkN', ...rows].join('\n') + '\n');
    await page.fill('#map-modulus', '201.876');
    await page.click('#apply-mapping');
    await expect.poll(() => page.locator('#cell-properties .sl-error').count(), { timeout: 30_000 }).toBe(0);
    await settled(page, 'records');
    await expect.poll(() => page.locator('#cell-save').innerText(), { timeout: 30_000 }).toMatch(/extension is the machine's travel: give the specimen's parallel length .* before a law from it is sent/);
    expect(await page.locator('#save-material').count()).toBe(0);
    await page.fill('#map-parallelLength', '30');
    await page.click('#apply-mapping');
    await expect.poll(() => page.locator('#save-material').count(), { timeout: 30_000 }).toBe(1);
    expect(await page.locator('#cell-curve-chart').innerText()).toContain('plastic over Lc');
    expect(errors).toEqual([]);
  });

  it('a record whose columns are not recognised reads once its columns and units are mapped', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    // The invented demo record with its column names replaced by ones no reader can recognise.
    const original = readFileSync(join(REPO, 'examples', 'stamping-strip-loops.csv'), 'utf8');
    const renamed = original.replace('Time [s],Strain [%],Stress [MPa]', 'c1,c2,c3');
    expect(renamed).not.toBe(original);
    await dropFile(page, 'renamed.csv', renamed);
    await expect.poll(() => page.locator('#cell-import .sl-error').count(), { timeout: 30_000 }).toBe(1);
    await settled(page, 'records');
    await page.selectOption('#map-strain', '2');
    await page.selectOption('#map-stress', '3');
    await page.selectOption('#map-strainUnit', 'percent');
    await page.selectOption('#map-stressUnit', 'MPa');
    await page.click('#apply-mapping');
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('renamed'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('#cell-import .sl-error').count()).toBe(0);
    const mapped = { E: await num(page, 'elasticModulus'), Rm: await num(page, 'tensileStrength') };
    // The same numbers as the file read with its own names (mapping must not change the data).
    await dropFile(page, 'stamping-strip-loops.csv', original);
    await expect.poll(async () => { const t = await page.locator('#cell-record-name').innerText(); return t.includes('stamping') && !t.includes('INVENTED'); }, { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await num(page, 'elasticModulus')).toBe(mapped.E);
    expect(await num(page, 'tensileStrength')).toBe(mapped.Rm);
    expect(errors).toEqual([]);
  });

  it('a strip record of force and strain reads once its width and thickness are given, with the stresses of the stress record', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    // The invented demo record as a machine exports a strip test: force in N (stress × 12.5 mm × 0.8 mm), strain in %.
    const original = readFileSync(join(REPO, 'examples', 'stamping-strip-loops.csv'), 'utf8');
    // Its Width and Thickness lines left out, so the export holds no cross-section.
    const lines = original.split('\n').filter((l) => !/^(Width|Thickness):/.test(l));
    const head = lines.findIndex((l) => l.startsWith('Time [s],Strain [%],Stress [MPa]'));
    const strip = lines.map((l, i) => {
      if (i < head) return l;
      if (i === head) return 'Time [s],Strain [%],Force [N]';
      const f = l.split(',');
      return f.length === 3 && l.trim() !== '' ? `${f[0]},${f[1]},${(Number(f[2]) * 12.5 * 0.8).toPrecision(10)}` : l;
    }).join('\n');
    await dropFile(page, 'strip-force.csv', strip);
    await expect.poll(() => page.locator('#cell-import .sl-error').count(), { timeout: 30_000 }).toBe(1);
    expect(await page.locator('#cell-import .sl-error').innerText()).toMatch(/force–strain record .* needs the cross-section/);
    await settled(page, 'records');
    await page.fill('#map-width', '12.5');
    await page.fill('#map-thickness', '0.8');
    await page.click('#apply-mapping');
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('strip-force'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('#cell-import .sl-error').count()).toBe(0);
    expect(await page.locator('#record-summary').innerText()).toMatch(/force and strain columns, stress = force \/ 10\.00 mm²/);
    const fromForce = { E: await num(page, 'elasticModulus'), Rm: await num(page, 'tensileStrength') };
    await dropFile(page, 'stamping-strip-loops.csv', original);
    await expect.poll(async () => { const t = await page.locator('#cell-record-name').innerText(); return t.includes('stamping') && !t.includes('INVENTED'); }, { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expectRelClose(fromForce.E, await num(page, 'elasticModulus'), 1e-3, 'E');
    expectRelClose(fromForce.Rm, await num(page, 'tensileStrength'), 1e-3, 'Rm');
    expect(errors).toEqual([]);
  });

  it('opens an invented demo record from examples/ and labels it invented', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    const options = await page.locator('#example-select option').allInnerTexts();
    expect(options).toContain('stamping-strip-loops.csv');
    await page.selectOption('#example-select', { label: 'stamping-strip-loops.csv' });
    await page.click('#load-example');
    await expect.poll(() => page.locator('#properties').count(), { timeout: 30_000 }).toBe(1);
    await settled(page, 'records');
    expect(await page.locator('#record-input').innerText()).toContain('INVENTED');
    // The file says it was generated from a Swift law with E 207 GPa (invented); the elastic
    // window must find that modulus within the few per cent a fit window allows (CHECKS.md).
    expectRelClose(await num(page, 'elasticModulus'), 207, 0.05, 'E of the invented record (GPa)');
    // Its four unload–reload loops give the fall of the chord modulus, which travels with the law
    // to the prestrain explorer: the unloading modulus there falls below E after prestrain.
    expect(await page.locator('#modulus-decay').innerText()).toContain('4 unload–reload loops');
    const E0 = (await num(page, 'elasticModulus')) * 1000;
    await page.click('#save-material');
    await page.goto(h.base + '/prestrain/');
    await settled(page, 'prestrain');
    await page.selectOption('#material-select', { label: 'the law saved from the record bench' });
    await page.fill('#prestrain-number', '0.1');
    await settled(page, 'prestrain');
    const E1 = await num(page, 'modulus');
    expect(E1).toBeLessThan(E0 * 0.97);
    expect(E1).toBeGreaterThan(150000);
    await page.screenshot({ path: `${SCREENSHOTS}/prestrain-bench-law.png`, fullPage: true });
    expect(errors).toEqual([]);
  });

  it('a record that stops before maximum force shows Rm, Ag and A as lower bounds, and a yield drop shows ReL and Ae', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    // INVENTED: a Swift-law record cut at 60 % of its samples (before maximum force), as a test stopped early.
    const rec = synthesizeRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, elasticModulus: 200000, rng: xoshiro128ss(7), noise: 0.2, step: 2e-4, necking: { extraStrain: 0.06, dropTo: 0.7 } });
    const cut = Math.round(rec.strain.length * 0.6);
    let text = 'Strain [%],Stress [MPa]\n';
    for (let i = 0; i < cut; i++) text += `${(rec.strain[i]! * 100).toFixed(6)},${rec.stress[i]!.toFixed(4)}\n`;
    await dropFile(page, 'stopped-early.csv', text);
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('stopped-early'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('[data-q="tensileStrength"]').innerText()).toMatch(/^≥ \d/);
    expect(await page.locator('[data-q="totalElongation"]').innerText()).toMatch(/^≥ \d/);
    expect(await page.locator('#properties').innerText()).toContain('A (record ends before fracture)');
    // The same INVENTED record whole, its strain cells empty from 8 % strain (extensometer taken off before maximum
    // force): Rm from the force (no ≥, within 0.4 % of the whole record's), Ag and A lower bounds.
    let whole = 'Strain [%],Stress [MPa]\n', off = whole;
    for (let i = 0; i < rec.strain.length; i++) {
      whole += `${(rec.strain[i]! * 100).toFixed(6)},${rec.stress[i]!.toFixed(4)}\n`;
      off += `${rec.strain[i]! < 0.08 ? (rec.strain[i]! * 100).toFixed(6) : ''},${rec.stress[i]!.toFixed(4)}\n`;
    }
    await dropFile(page, 'whole.csv', whole);
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('whole'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    const rmWhole = await num(page, 'tensileStrength');
    await dropFile(page, 'extensometer-off.csv', off);
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('extensometer-off'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('[data-q="tensileStrength"]').innerText()).not.toContain('≥');
    expectRelClose(await num(page, 'tensileStrength'), rmWhole, 0.004, 'Rm from the force after the extensometer came off');
    expect(await page.locator('[data-q="uniformElongation"]').innerText()).toMatch(/^≥ \d/);
    expect(await page.locator('[data-q="totalElongation"]').innerText()).toMatch(/^≥ \d/);
    expect(await page.locator('#properties').innerText()).toContain('Rm (from the force after the strain ended)');
    expect(await page.locator('#properties').innerText()).toContain('A (strain channel ends before fracture)');
    expect(await page.locator('#ag-basis').innerText()).toMatch(/^Ag: not in the record — the strain channel ends before maximum force/);
    expect(await page.locator('#cell-properties').innerText()).toMatch(/the strain holds one value from sample \d+/);
    // INVENTED: a clear 8 % yield drop with a 2 % Lüders plateau and little noise.
    const { synthesizeLabRecord } = await import('../../src/core/index.js');
    const lab = synthesizeLabRecord({ law: { law: 'voce', sigma0: 280, Q: 200, b: 12 }, elasticModulus: 205000, rng: xoshiro128ss(3), points: 8000, noise: 0.5, yieldDrop: { drop: 0.08, luedersStrain: 0.02 } });
    let t2 = 'Strain [%],Stress [MPa]\n';
    for (let i = 0; i < lab.strain.length; i++) t2 += `${(lab.strain[i]! * 100).toFixed(6)},${lab.stress[i]!.toFixed(4)}\n`;
    await dropFile(page, 'yield-drop.csv', t2);
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('yield-drop'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expectRelClose(await num(page, 'upperYield'), lab.truth.upperYield!, 0.015, 'ReH');
    expectRelClose(await num(page, 'lowerYield'), lab.truth.lowerYield!, 0.015, 'ReL');
    expect(Math.abs(await num(page, 'yieldPointElongation') - lab.truth.yieldPointElongationPct!)).toBeLessThan(0.4);
    expect(await page.locator('[data-q="tensileStrength"]').innerText()).not.toContain('≥');
    expect(errors).toEqual([]);
  });

  it('two extensometer channels are read as their mean, a file of three specimens shows the first with the warning and only its curve, and a block of dropped rows names its line', async () => {
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    // 46NT71 as force and two extension channels, the specimen bent 4 % at the start of loading (each side off by 4 %).
    const lines = readFileSync(FIXTURE, 'utf8').split(/\r?\n/);
    const head = lines.findIndex((l) => l.startsWith('Time\t'));
    const rows = lines.slice(head + 2).filter((l) => l.trim() !== '').map((l) => l.split('\t'));
    let two = 'Diameter: 5.003 mm\nGauge length: 25 mm\nTime [s];Force [kN];Extensometer 1 [mm];Extensometer 2 [mm]\n';
    for (const c of rows) { const d = +c[1]!; const b = 0.04 * Math.max(0, 1 - d / 0.5); two += `${c[0]};${c[2]};${(d * (1 + b)).toFixed(7)};${(d * (1 - b)).toFixed(7)}\n`; }
    await dropFile(page, 'two-sides.csv', two);
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('two-sides'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('#record-summary').innerText()).toContain('the mean of "Extensometer 1 [mm]" and "Extensometer 2 [mm]"');
    // The published record's E from this page (204.2 GPa in the analyze table; its own strain is that mean).
    expectRelClose(await num(page, 'elasticModulus'), 204.2, 3e-3, 'E');
    // Three open records in one file (46NT71, 46NT73, 46NTBL; MaterialDigital, CC BY 4.0): the first is analysed.
    const data = (n: string) => { const l = readFileSync(join(REPO, 'test', 'fixtures', '42crmos4', `${n}.csv`), 'utf8').split(/\r?\n/); const k = l.findIndex((x) => x.startsWith('Time\t')); return l.slice(k + 2).filter((x) => x.trim() !== '').join('\n'); };
    await dropFile(page, 'three-specimens.csv', readFileSync(FIXTURE, 'utf8').trimEnd() + '\n' + data('46NT73') + '\n' + data('46NTBL') + '\n');
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('three-specimens'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expectRelClose(await num(page, 'tensileStrength'), 1198.7, 1e-3, 'Rm of the first specimen (46NT71)');
    expect(await page.locator('#cell-properties').innerText()).toMatch(/the record starts over 2 times .* read as 3 tests in one file\. Only the first/);
    // Its curve only: one line of 768 vertices (the first test's samples), none back from one test's end to the next.
    const vertices = await page.locator('#cell-curve-chart svg path').evaluateAll((ps) => Math.max(...ps.map((p) => (p.getAttribute('d') ?? '').split(/[ML]/).filter(Boolean).length)));
    expect(vertices).toBe(768);
    // The choice of test: the second (46NT73) analysed on its own, as its own file gives it.
    expect(await page.locator('#tests').innerText()).toContain('This file holds 3 tests');
    await page.selectOption('#test-choice', '2');
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('(test 2 of 3)'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    // Reference: 46NT73's own file through this page's analysis (Rm 1198.4 MPa in the analyze table; the producers report 1198.9).
    expectRelClose(await num(page, 'tensileStrength'), 1198.4, 1e-3, 'Rm of the second specimen (46NT73)');
    expect(await page.locator('#record-summary').innerText()).toContain(`${data('46NT73').split('\n').length} rows`);
    expect(await page.locator('#cell-properties').innerText()).not.toMatch(/starts over/);
    await page.screenshot({ path: `${SCREENSHOTS}/records-three-specimens.png`, fullPage: true });

    // A block of dropped rows (46NT71 with lines 400–402 zeroed): the error names the samples and the file's line.
    const zeroed = readFileSync(FIXTURE, 'utf8').split('\n').map((l, i) => (i >= 399 && i <= 401 ? l.replace(/[^\t\r]+/g, '0') : l)).join('\n');
    await dropFile(page, 'dropped-rows.csv', zeroed);
    await expect.poll(() => page.locator('#cell-properties .sl-error').count(), { timeout: 30_000 }).toBe(1);
    expect(await page.locator('#cell-properties .sl-error').innerText()).toMatch(/samples 374–376 read 0 in both strain and stress.*\(line 400 of dropped-rows\.csv\)/s);
    expect(errors).toEqual([]);
  });
  it('46NT71 exported by channel number with an unload–reload loop past yield: read by units and said; no yield drop, the producers\' Rp0.2 and Rm', async () => {
    // The open record (as above) rewritten as a channel-numbered export, with an INVENTED loop at 0.75 % strain
    // (unloaded along the producers' slope 201,876 MPa to a tenth of the stress and reloaded).
    const lines = readFileSync(FIXTURE, 'utf8').split('\n');
    const head = lines.findIndex((l) => l.startsWith('Time\t'));
    const out = ['Kanal 1 (MPa),Kanal 2 (%)'];
    let done = false;
    for (const l of lines.slice(head + 2)) {
      if (!l.trim()) continue;
      const c = l.split('\t'), e = Number(c[4]), st = Number(c[5]);
      out.push(`${st},${e * 100}`);
      if (!done && e > 0.0075) {
        done = true;
        for (let k = 1; k < 30; k++) { const x = st - (0.9 * st * k) / 29; out.push(`${x},${(e - (st - x) / 201876) * 100}`); }
        for (let k = 1; k < 30; k++) { const x = 0.1 * st + (0.9 * st * k) / 29; out.push(`${x},${(e - (st - x) / 201876) * 100}`); }
      }
    }
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    await dropFile(page, 'kanal-loop.csv', out.join('\n') + '\n');
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('kanal-loop'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('.sl-notice').first().innerText()).toMatch(/columns named by channel only, read by their units: "Kanal 1 \(MPa\)" \(column 1\) as the stress, "Kanal 2 \(%\)" \(column 2\) as the strain/);
    expect(await page.locator('[data-q="upperYield"]').innerText()).toBe('none (continuous yielding)');
    expectRelClose(await num(page, 'proofStrength'), 1132.33, 0.01, 'Rp0.2');
    expectRelClose(await num(page, 'tensileStrength'), 1198.73, 0.001, 'Rm');
    await page.screenshot({ path: `${SCREENSHOTS}/records-kanal-loop.png`, fullPage: true });
    expect(errors).toEqual([]);
  });
  it('46NT71 with an INVENTED rate change (×8 at 1 % strain, the flow stress 2.1 % higher after it): said with its step, marked on the curve chart, Rp0.2 as the producers\' and Rm as recorded', async () => {
    // The open record (as above) with every 8th sample kept past 1 % strain and the stress there times 8^0.01 (m = 0.01).
    const lines = readFileSync(FIXTURE, 'utf8').split('\n');
    const head = lines.findIndex((l) => l.startsWith('Time\t'));
    const out = ['strain (%),stress (MPa)'];
    let k = 0;
    for (const l of lines.slice(head + 2)) {
      if (!l.trim()) continue;
      const c = l.split('\t'), e = Number(c[4]), st = Number(c[5]);
      if (e < 0.01) out.push(`${e * 100},${st}`);
      else if (k++ % 8 === 0) out.push(`${e * 100},${st * 8 ** 0.01}`);
    }
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    await dropFile(page, 'rate-change.csv', out.join('\n') + '\n');
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('rate-change'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('#cell-properties').innerText()).toMatch(/the strain per sample rises 7\.\d× at 1\.0\d % strain \(sample \d+\) and the flow stress steps up there by 2\d\.\d MPa \(2\.\d %/);
    expect(await page.locator('#cell-curve-chart').innerText()).toMatch(/rate ×7\.\d, flow stress \+2\.\d %/);
    // Rp0.2 lies before the change: the producers' 1132.33 MPa. Rm after it, at the later rate: theirs times 8^0.01.
    expectRelClose(await num(page, 'proofStrength'), 1132.33, 0.01, 'Rp0.2');
    expectRelClose(await num(page, 'tensileStrength'), 1198.73 * 8 ** 0.01, 0.002, 'Rm');
    await page.screenshot({ path: `${SCREENSHOTS}/records-rate-change.png`, fullPage: true });
    expect(errors).toEqual([]);
  });
  it('an INVENTED steel record with a Lüders plateau and no upper yield point clear of its noise: the plateau said, no ReH, the laws fitted from its end', async () => {
    // As in test/core/tensile/yield-plateau.test.ts: Swift past a 2 % plateau, a drop of 0.4 % under noise of 0.6 % of Rm.
    const rec = synthesizeLabRecord({ law: { law: 'swift', K: 760, eps0: 0.012, n: 0.21 }, elasticModulus: 205000, points: 4000, noise: 0.006 * 480, rng: xoshiro128ss(31), yieldDrop: { drop: 0.004, luedersStrain: 0.02, serration: 0.003, serrationPeriod: 0.001 } });
    const out = ['strain (%),stress (MPa)'];
    for (let i = 0; i < rec.strain.length; i++) out.push(`${(rec.strain[i]! * 100).toFixed(5)},${rec.stress[i]!.toFixed(2)}`);
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    await dropFile(page, 'plateau-steel.csv', out.join('\n') + '\n');
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('plateau-steel'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    expect(await page.locator('[data-q="upperYield"]').innerText()).toBe('none clear of the noise (yield plateau, see below)');
    expect(await page.locator('#cell-curve-chart').innerText()).toContain('yield plateau ends: laws fitted from here');
    expect(await page.locator('#cell-properties').innerText()).toMatch(/yields at about constant force \(\d+\.\d MPa over [12]\.\d\d % strain.*no upper yield point.*ReH, ReL and Ae are not reported/s);
    await page.screenshot({ path: `${SCREENSHOTS}/records-yield-plateau.png`, fullPage: true });
    expect(errors).toEqual([]);
  });

  it('an INVENTED record whose load noise is correlated from sample to sample: the noise line gives its sd and lag-1 correlation, as made', async () => {
    // AR(1) noise of sd 2.5 MPa and lag-1 correlation 0.7 (an acquisition filter) on a noise-free Swift curve; what the
    // page says is checked against how the noise was made, not against the analysis.
    const clean = synthesizeLabRecord({ law: { law: 'swift', K: 1100, eps0: 0.01, n: 0.3 }, elasticModulus: 193000, points: 3000, noise: 0, rng: xoshiro128ss(5) });
    const stress = withArNoise(clean.stress, 2.5, 0.7, 5);
    const out = ['strain (%),stress (MPa)'];
    for (let i = 0; i < stress.length; i++) out.push(`${(clean.strain[i]! * 100).toFixed(5)},${stress[i]!.toFixed(2)}`);
    const { page, errors } = await openPage(h, '/records/');
    await settled(page, 'records');
    await dropFile(page, 'filtered-load.csv', out.join('\n') + '\n');
    await expect.poll(async () => (await page.locator('#cell-record-name').innerText()).includes('filtered-load'), { timeout: 30_000 }).toBe(true);
    await settled(page, 'records');
    const line = await page.locator('#record-noise').innerText();
    const m = /^Noise of the stress \(standard deviation\): (\d+\.\d) MPa \(estimated from the record; correlated from sample to sample, lag-1 (0\.\d\d): E's interval and Rp's range are widened for it\)\.$/.exec(line);
    expect(m, line).not.toBeNull();
    // The sd about a local smooth reads correlated noise a little low (its blocks take up some of it): 0.7–1.1 of 2.5.
    expect(Number(m![1])).toBeGreaterThanOrEqual(0.7 * 2.5);
    expect(Number(m![1])).toBeLessThanOrEqual(1.1 * 2.5);
    expect(Math.abs(Number(m![2]) - 0.7)).toBeLessThan(0.1);
    // Rp0.2 of the noise-free curve (the generator's, ISO 6892-1 offset construction) within 1 %.
    expectRelClose(await num(page, 'proofStrength'), clean.truth.proofStrength, 0.01, 'Rp0.2');
    expect(errors).toEqual([]);
  });
});
