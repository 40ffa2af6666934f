/**
 * Target names in words for every report format and notebook: the one table lives beside the
 * targets in the core (`core/route/targetLabels.ts`, so the window note uses it too) and is read
 * from here by the writers and, through `src/cells`, by the notebooks.
 */
export { TARGET_LABELS, targetLabel, WARNING_LABELS } from '../core/route/targetLabels.js';
