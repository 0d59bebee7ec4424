/** Reported by the runner when a check throws: the note is still analysed by the others. */
import { defineCheck } from './check';

export const internalError = defineCheck({
  code: 'PN900',
  alias: 'internal-error',
  title: 'A check failed',
  severity: 'warning',
  tags: ['internal'],
  doc: {
    fires: 'One of Pneumark\'s checks failed on this note. The other checks still ran; findings of the failed check are missing.',
    example: '(any note that meets a defect in a check)',
    fix: 'Please report it with the note (or a de-identified excerpt that reproduces it).',
  },
  source: 'none: a defect of Pneumark',
  run() {
    // Reported by the runner when another check throws; nothing to look for on its own.
  },
});
