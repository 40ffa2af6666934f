/**
 * The text of a record file from its bytes. UTF-16 with its byte-order mark — what a spreadsheet's UTF-16 text
 * export writes (tab-separated, little-endian, BOM FF FE; common practice) — is decoded as UTF-16 (LE or BE, by the
 * mark; the Unicode Standard §23.8 / RFC 2781 §3.2); everything else as UTF-8, whose own mark the readers skip.
 * Without a mark, UTF-16 is not guessed: its NUL bytes are refused by the readers with their line and column.
 * @example decodeRecordBytes(Uint8Array.of(0xff, 0xfe, 0x61, 0x00)) // 'a'
 */
export function decodeRecordBytes(bytes: Uint8Array): string {
  const enc = utf16Mark(bytes);
  if (enc) return new TextDecoder(enc).decode(bytes.subarray(2));
  return new TextDecoder('utf-8').decode(bytes);
}

/** 'utf-16le' or 'utf-16be' when `bytes` start with that byte-order mark, else null. */
export function utf16Mark(bytes: Uint8Array): 'utf-16le' | 'utf-16be' | null {
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return 'utf-16le';
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return 'utf-16be';
  return null;
}
