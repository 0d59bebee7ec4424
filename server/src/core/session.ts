/**
 * A note that changes over time (an open editor document). `update` returns the same result
 * as `checkNote` on the new text, reusing what did not change: lines whose text is unchanged
 * keep their parsed node, and timepoints whose inputs are unchanged keep their derivation.
 */
import type { NoteResult } from './check-note';
import { checkNote } from './check-note';
import { withDefaults, type Settings } from './settings';

export class NoteSession {
  private settings: Settings;
  private last: NoteResult | null = null;
  private lastText: string | null = null;

  constructor(settings: Partial<Settings> = {}) {
    this.settings = withDefaults(settings);
  }

  setSettings(settings: Partial<Settings>): void {
    this.settings = withDefaults(settings);
    this.last = null;
    this.lastText = null;
  }

  get result(): NoteResult | null {
    return this.last;
  }

  update(text: string): NoteResult {
    if (this.last && text === this.lastText) return this.last;
    this.last = checkNote(text, this.settings);
    this.lastText = text;
    return this.last;
  }
}
