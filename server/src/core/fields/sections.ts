/**
 * The sections a line may start with. A section decides which keys the line may hold,
 * and whether what it states carries forward to later timepoints.
 */

export type SectionId =
  | 'patient'
  | 'place'
  | 'units'
  | 'vitals'
  | 'oxygen'
  | 'abg'
  | 'vbg'
  | 'labs'
  | 'vent'
  | 'note';

/**
 * header: describes the person or the note (carries forward);
 * setting: a treatment setting (carries forward until restated);
 * measure: an observation at this timepoint only;
 * prose: free text.
 */
export type SectionKind = 'header' | 'setting' | 'measure' | 'prose';

export interface SectionDef {
  readonly id: SectionId;
  readonly aliases: readonly string[];
  readonly kind: SectionKind;
  readonly description: string;
}

export const SECTIONS: readonly SectionDef[] = [
  { id: 'patient', aliases: ['pt'], kind: 'header', description: 'Who the note is about: age, sex, height, weight (no names or identifiers).' },
  { id: 'place', aliases: ['site'], kind: 'header', description: 'Altitude or barometric pressure; may be restated at a later timepoint when the patient moves.' },
  { id: 'units', aliases: [], kind: 'header', description: 'Default unit for gas pressures written without one (`gas mmHg` or `gas kPa`).' },
  { id: 'vitals', aliases: ['obs', 'vital'], kind: 'measure', description: 'Bedside observations at this timepoint.' },
  { id: 'oxygen', aliases: ['o2'], kind: 'setting', description: 'Oxygen therapy: the device first, then its flow and settings. Replaces the previous oxygen line and ends ventilation; a later line that names no device and writes only settings of the device in force (or of NIV or CPAP written by its pressures), at a later timepoint or at the same one, updates that therapy instead.' },
  { id: 'abg', aliases: ['art', 'arterial'], kind: 'measure', description: 'Arterial blood gas; shorthand pH/PaCO2/PaO2/HCO3 allowed.' },
  { id: 'vbg', aliases: ['venous'], kind: 'measure', description: 'Venous blood gas; shorthand pH/PvCO2/PvO2/HCO3 allowed.' },
  { id: 'labs', aliases: ['lab', 'chem'], kind: 'measure', description: 'Laboratory values at this timepoint.' },
  { id: 'vent', aliases: ['ventilator', 'mv'], kind: 'setting', description: 'Ventilator settings, which carry forward until restated, and values measured on the ventilator (plateau, peak, mean airway pressure, minute volume, EtCO2; the tidal volume and the flow under a mode that does not set them), which belong to their timepoint.' },
  { id: 'note', aliases: ['text', 'comment'], kind: 'prose', description: 'Free prose to the end of the line.' },
];

const byName = new Map<string, SectionDef>();
for (const s of SECTIONS) for (const name of [s.id, ...s.aliases]) byName.set(name, s);

export function sectionByName(name: string): SectionDef | undefined {
  return byName.get(name.toLowerCase());
}

export function sectionById(id: SectionId): SectionDef {
  const found = byName.get(id);
  if (!found) throw new Error(`unknown section ${id}`); // unreachable: ids come from the table
  return found;
}

export const SECTION_NAMES: readonly string[] = [...byName.keys()];
