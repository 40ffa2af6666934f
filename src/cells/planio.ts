import { loadPlanText, type LoadedPlan } from '../plan/load.js';
import type { PlanDoc } from '../plan/schema.js';
import { decodeRecord, type RecordEncoding } from '../records/decode.js';

/**
 * Plan import and export in exactly the runner's format: the plan document (plan units) as JSON,
 * read back by the same `loadPlanText` the runner uses, so an exported file runs unchanged.
 */

/** The plan file text for a plan document: 2-space JSON with a final newline. */
export function planText(doc: PlanDoc): string {
  return JSON.stringify(doc, null, 2) + '\n';
}

/** A safe file name from a plan name (letters, digits, dashes), ending `.json`. */
export function planFileName(name: string): string {
  const base = name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60);
  return `${base || 'plan'}.json`;
}

/** Validates plan text as the runner does. @throws PlanError naming line, field, value and range. */
export function importPlan(text: string, fileName: string): LoadedPlan {
  return loadPlanText(text, fileName);
}

/** Offers `text` as a file download (no server involved). */
export function downloadText(fileName: string, text: string, type = 'application/json'): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** Maximum size of a file read into a notebook (matches the runner's plan limit). */
export const MAX_FILE_BYTES = 5 * 1024 * 1024;

/** Reads a chosen or dropped file as text, refusing files over {@link MAX_FILE_BYTES}. */
export async function readFileText(file: File): Promise<string> {
  if (file.size > MAX_FILE_BYTES) throw new Error(`${file.name}: ${file.size} bytes; files up to ${MAX_FILE_BYTES} bytes are accepted`);
  return file.text();
}

/**
 * Largest tensile-record export the record bench reads (parsed and analysed in a worker): a 1,000,000-row export
 * with a few columns is 20–60 MB.
 */
export const MAX_RECORD_BYTES = 256 * 1024 * 1024;

/**
 * Reads a dropped tensile-record export: up to {@link MAX_RECORD_BYTES}, UTF-8, or UTF-16 with its byte-order mark
 * (a spreadsheet's UTF-16 text export), decoded by decodeRecordBytes as the runner decodes it.
 */
export async function readRecordFileText(file: File): Promise<string> {
  return (await readRecordFileDecoded(file)).text;
}

/**
 * {@link readRecordFileText} with how the bytes were read (`windows-1252` for a file that is not UTF-8: the page
 * says so, as the runner's warning does).
 */
export async function readRecordFileDecoded(file: File): Promise<{ text: string; encoding: RecordEncoding }> {
  if (file.size > MAX_RECORD_BYTES) throw new Error(`${file.name}: ${file.size} bytes; records up to ${MAX_RECORD_BYTES} bytes are accepted`);
  return decodeRecord(new Uint8Array(await file.arrayBuffer()), file.name);
}

/**
 * Makes `zone` accept a dropped file and wires `input` (a file chooser) to the same handler (`read`: how the file
 * becomes text, {@link readFileText} by default).
 * The zone is focusable and opens the chooser on Enter or Space, so it works from the keyboard.
 */
export function fileDrop(zone: HTMLElement, input: HTMLInputElement, onFile: (name: string, text: string) => void, onError: (e: unknown) => void, read: (f: File) => Promise<string> = readFileText): void {
  const take = (f: File | undefined) => {
    if (!f) return;
    read(f).then((t) => onFile(f.name, t), onError);
  };
  zone.tabIndex = 0;
  zone.addEventListener('dragover', (e) => { e.preventDefault(); zone.classList.add('sl-drop-over'); });
  zone.addEventListener('dragleave', () => zone.classList.remove('sl-drop-over'));
  zone.addEventListener('drop', (e) => {
    e.preventDefault();
    zone.classList.remove('sl-drop-over');
    take(e.dataTransfer?.files[0]);
  });
  zone.addEventListener('keydown', (e) => {
    if (e.key === 'Enter' || e.key === ' ') { e.preventDefault(); input.click(); }
  });
  input.addEventListener('change', () => { take(input.files?.[0]); input.value = ''; });
}
