/** An invented note shaped like a long intensive-care record, `timepoints` hours long (see generate.mjs). */
export function generateNote(timepoints: number, seed?: number): string;
