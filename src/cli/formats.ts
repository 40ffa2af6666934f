/** Report formats of `run`. A module of its own so the command line reads them without loading the writers (render.ts). */
export const FORMATS = ['table', 'json', 'csv', 'md', 'html', 'junit'] as const;
export type Format = (typeof FORMATS)[number];

/** File extension of each format when written with `--out`. */
export const EXTENSION: Record<Format, string> = { table: 'txt', json: 'json', csv: 'csv', md: 'md', html: 'html', junit: 'junit.xml' };
