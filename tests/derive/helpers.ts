/** Small helpers that make derived-value tests read like the notes they check. */
import { allDerivations } from '../../server/src/core/analysis/analyse';
import { checkNote } from '../../server/src/core/check-note';
import type { DerivedValue, Interpretation, TimepointDerivation } from '../../server/src/core/derive/model';
import type { Settings } from '../../server/src/core/settings';

export function derivation(text: string, settings: Partial<Settings> = {}, timepoint = -1): TimepointDerivation {
  const list = allDerivations(checkNote(text, settings).analysis);
  const d = list.at(timepoint);
  if (!d) throw new Error('no timepoint in the note');
  return d;
}

export function derived(text: string, id: string, settings: Partial<Settings> = {}, timepoint = -1): DerivedValue {
  const d = derivation(text, settings, timepoint).derived.find((x) => x.id === id);
  if (!d) throw new Error(`${id} was not derived; missing: ${JSON.stringify(derivation(text, settings, timepoint).missing)}`);
  return d;
}

export function readings(text: string, settings: Partial<Settings> = {}, timepoint = -1): Record<Interpretation['topic'], string> {
  const out: Partial<Record<Interpretation['topic'], string>> = {};
  for (const i of derivation(text, settings, timepoint).interpretations) out[i.topic] = (out[i.topic] ? `${out[i.topic]} | ` : '') + i.text;
  return out as Record<Interpretation['topic'], string>;
}
