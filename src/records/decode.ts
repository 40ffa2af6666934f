import { recordError } from './errors.js';

/** How a record file's bytes were read as text ({@link decodeRecord}). */
export type RecordEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

/**
 * The warning a record read as Windows-1252 carries (its bytes are not valid UTF-8).
 * @example ENCODING_NOTE // 'read as Windows-1252 text: …'
 */
export const ENCODING_NOTE = 'read as Windows-1252 text: the file is not valid UTF-8, and the single-byte code page that testing-machine software on Windows commonly writes (with "N/mm²", "°C", "µm" in its header; common practice) is assumed; check that the header\'s names and units read right';

/**
 * The text of a record file from its bytes, and how it was read. UTF-16 with its byte-order mark — what a
 * spreadsheet's UTF-16 text export writes (tab-separated, little-endian, BOM FF FE; common practice) — is decoded as
 * UTF-16 (LE or BE, by the mark; the Unicode Standard §23.8 / RFC 2781 §3.2). Valid UTF-8 (with or without its own
 * mark, which the readers skip) as UTF-8. Bytes that are not valid UTF-8 and hold no NUL — an export in a Windows
 * code page, "N/mm²" written as the single byte B2 — as Windows-1252 (the WHATWG Encoding Standard's decoder, which
 * ISO-8859-1 labels also map to): numbers, separators and ASCII names read the same in every such code page.
 * Everything else (NUL bytes: UTF-16 without a mark, a binary file) as UTF-8, for the readers to refuse with its
 * line and column. Pure, for the browser and Node alike.
 * @example decodeRecord(Uint8Array.of(0x4e, 0x2f, 0x6d, 0x6d, 0xb2)) // { text: 'N/mm²', encoding: 'windows-1252' }
 */
export function decodeRecord(bytes: Uint8Array, file = 'record'): { text: string; encoding: RecordEncoding } {
  refuseWorkbook(bytes, file);
  const enc = utf16Mark(bytes);
  if (enc) return { text: new TextDecoder(enc).decode(bytes.subarray(2)), encoding: enc };
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes), encoding: 'utf-8' };
  } catch {
    if (bytes.includes(0)) return { text: new TextDecoder('utf-8').decode(bytes), encoding: 'utf-8' };
    return { text: decodeWindows1252(bytes), encoding: 'windows-1252' };
  }
}

/**
 * Windows-1252's characters for the bytes 80–9F (the WHATWG Encoding Standard's index-windows-1252; the five bytes
 * the code page leaves undefined map to the C1 controls of the same number). Every other byte is the Unicode code
 * point of its value (ISO-8859-1). Checked byte for byte against the registry's iconv-lite in
 * test/records/import.test.ts.
 */
const CP1252_80_9F = '\u20ac\u0081\u201a\u0192\u201e\u2026\u2020\u2021\u02c6\u2030\u0160\u2039\u0152\u008d\u017d\u008f'
  + '\u0090\u2018\u2019\u201c\u201d\u2022\u2013\u2014\u02dc\u2122\u0161\u203a\u0153\u009d\u017e\u0178';

/**
 * Windows-1252 bytes as text. Written here, not TextDecoder('windows-1252'): Node 20's decoder for that label is
 * ISO-8859-1 (byte 80 gives U+0080, not "€"; measured), the browser's is the code page, and the bench and the runner
 * must read a file alike; iconv-lite needs Node's Buffer in the browser. 32 table entries and a loop.
 * @example decodeWindows1252(Uint8Array.of(0x80, 0xb2)) // '€²'
 */
export function decodeWindows1252(bytes: Uint8Array): string {
  const parts: string[] = [];
  const CHUNK = 8192;
  for (let i = 0; i < bytes.length; i += CHUNK) {
    const end = Math.min(i + CHUNK, bytes.length);
    const codes = new Array<number>(end - i);
    for (let j = i; j < end; j++) {
      const b = bytes[j]!;
      codes[j - i] = b >= 0x80 && b < 0xa0 ? CP1252_80_9F.charCodeAt(b - 0x80) : b;
    }
    parts.push(String.fromCharCode(...codes));
  }
  return parts.join('');
}

/**
 * The text of a record file from its bytes ({@link decodeRecord} without the encoding).
 * @example decodeRecordBytes(Uint8Array.of(0xff, 0xfe, 0x61, 0x00)) // 'a'
 */
export function decodeRecordBytes(bytes: Uint8Array, file = 'record'): string {
  return decodeRecord(bytes, file).text;
}

/**
 * A spreadsheet workbook dropped or named instead of its text export: its signature (the first bytes), said in the
 * user's words, or null. ZIP's local-file header `PK 03 04` (PKWARE APPNOTE, from memory: .xlsx and .ods are ZIP
 * containers) and the compound-file signature `D0 CF 11 E0 A1 B1 1A E1` of the older binary .xls ([MS-CFB], from memory).
 * @example workbookKind(Uint8Array.of(0x50, 0x4b, 3, 4)) // 'a spreadsheet workbook or another ZIP archive (.xlsx, .ods)'
 */
export function workbookKind(bytes: Uint8Array): string | null {
  const starts = (sig: readonly number[]) => bytes.length >= sig.length && sig.every((b, i) => bytes[i] === b);
  if (starts([0x50, 0x4b, 0x03, 0x04])) return 'a spreadsheet workbook or another ZIP archive (.xlsx, .ods)';
  if (starts([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1])) return 'a spreadsheet workbook in the older binary format (.xls)';
  return null;
}

/** @throws PlanError at line 1 of `file` when `bytes` are a spreadsheet workbook ({@link workbookKind}), saying how to export it. */
export function refuseWorkbook(bytes: Uint8Array, file: string): void {
  const kind = workbookKind(bytes);
  if (kind) throw recordError(file, 1, 1, '', `${kind}, not a text export; expected CSV or tab-separated text: save the sheet that holds the test's columns as CSV or as tab-delimited text from the spreadsheet, and read that file`);
}

/** 'utf-16le' or 'utf-16be' when `bytes` start with that byte-order mark, else null. */
export function utf16Mark(bytes: Uint8Array): 'utf-16le' | 'utf-16be' | null {
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return 'utf-16le';
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return 'utf-16be';
  return null;
}
