/**
 * Who is read as an adult. Kept in physiology/ so that the timeline (analysis/) and the derived
 * values (derive/) take the same age from one place.
 */

/**
 * The age (years) from which rules made in adults are applied: the ARDS Network's predicted body
 * weight (its trial enrolled adults of 18 years or more: ARDS Network 2000, its key exclusion
 * criterion "younger than 18 years of age" read in the trial's summary at pathway.md/studies, the
 * paper not read here; that its
 * equation holds for adults only, read in the abstract of a BMC Pulm Med 2017 paper on predicted
 * body weight from pre-term to adult, doi 10.1186/s12890-017-0427-1) and the
 * age rules for the upper normal A–a gradient (made in adults). A younger patient gets neither.
 */
export const ADULT_FROM_YEARS = 18;
