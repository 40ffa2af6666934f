/** Name and version of the tool, written into every report. Keep in step with package.json. */
export const VERSION = '0.1.0';
export const TOOL = `strainledger ${VERSION}`;
