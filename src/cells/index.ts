// The notebook kit: what @observablehq/runtime v6 leaves out (observers, inputs, error cells),
// plus keeping the user's work (autosave, undo, plan import/export) and safe text. See notebooks/README.md.
export { Notebook, expose } from './notebook.js';
export type { CellSpec } from './notebook.js';
export { cellObserver, defaultRender } from './observer.js';
export type { CellObserver, Render } from './observer.js';
export { errorBox, errorLines } from './errors.js';
export { slider, choice, stepSlider, valueStream } from './inputs.js';
export { widthStream } from './width.js';
export type { ValueElement, SliderOptions, ChoiceOptions } from './inputs.js';
export { autosave, restore, forget, UndoHistory } from './store.js';
export type { Stored } from './store.js';
export { planText, planFileName, importPlan, downloadText, readFileText, readRecordFileText, readRecordFileDecoded, fileDrop, MAX_FILE_BYTES, MAX_RECORD_BYTES } from './planio.js';
export { h, append, escapeHtml, byId } from './dom.js';
export { fixed, DIGITS, quantity, cautionsPanel, formatNumber, formatTargetValue, formatLaw, formatLawParam, flowCurveText, targetUnit, targetLabel, TARGET_LABELS } from './format.js';
