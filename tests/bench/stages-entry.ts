// The core's stages, bundled by stages.mjs (the library API runs them together).
export { parseNote } from '../../server/src/core/syntax/parser';
export { buildTimeline } from '../../server/src/core/analysis/timeline';
export { deriverFor } from '../../server/src/core/analysis/analyse';
export { runChecks } from '../../server/src/core/check-note';
export { withDefaults } from '../../server/src/core/settings';
