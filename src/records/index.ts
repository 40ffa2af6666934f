// Tensile-record import, pure part (browser-safe: no node:* imports). Node's streaming reader is in ./node.ts.
export { parseRecordText, checkText } from './parse.js';
export { decodeRecord, decodeRecordBytes, ENCODING_NOTE, refuseWorkbook, utf16Mark, workbookKind, type RecordEncoding } from './decode.js';
export { RecordBuilder, MAX_LINE_RUNS, MAX_ROWS, MAX_STRAIN, sampleLine, strainUnitHint, travelOptions, readingWarnings } from './builder.js';
export type { RecordOptions, TensileRecord } from './builder.js';
export { detectLayout, splitLine, DELIMITERS } from './layout.js';
export type { Layout, Delimiter } from './layout.js';
export { describeColumn, roleScore, ROLES } from './columns.js';
export type { Role, ColumnInfo } from './columns.js';
export { STRESS_UNITS, FORCE_UNITS, LENGTH_UNITS, STRAIN_UNITS, unitFactor } from './units.js';
export { layoutOf, spaceAligned, spacesToTabs } from './aligned.js';
