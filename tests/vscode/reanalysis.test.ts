// An analysis of an unchanged note (settings or pneumark.config.json changed) makes the
// extension ask VS Code for the note's inlay hints again.
import { describe, expect, it } from 'vitest';
import { ReanalysisTracker } from '../../client/src/reanalysis';

describe('a re-analysis', () => {
  it('is an analysis of a version analysed before', () => {
    const t = new ReanalysisTracker();
    expect(t.analysed('file:///a.pneu', 1)).toBe(false);
    expect(t.analysed('file:///a.pneu', 2)).toBe(false); // an edit
    expect(t.analysed('file:///b.pneu', 2)).toBe(false); // another note
    expect(t.analysed('file:///a.pneu', 2)).toBe(true); // the same text again: a setting changed
    t.closed('file:///a.pneu');
    expect(t.analysed('file:///a.pneu', 2)).toBe(false); // opened again
  });
});
