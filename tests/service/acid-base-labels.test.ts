// The acid–base inlay hint of invented gases, one for every branch of the reading: the short label
// written out by hand for each, in an mmHg note and in a kPa note. The gases are invented and their
// pH, PaCO2 and HCO3 fit together (Henderson–Hasselbalch, HCO3 = 0.0307 × PaCO2 × 10^(pH − 6.1)).
// What each label names is what the reading decides, by the rules it cites:
// - expected PaCO2 in metabolic acidosis 1.5 × HCO3 + 8 ± 2 (Albert, Dell & Winters, Ann Intern Med
//   1967;66:312–322); in metabolic alkalosis 40 + 0.7 × (HCO3 − 24) ± 2 (Berend K et al., NEJM
//   2014;371:1434–1445, from memory);
// - expected HCO3 in respiratory disorders, per 10 mmHg of PaCO2 from 40: acute acidosis +1, chronic
//   +3.5 to +5, acute alkalosis −2, chronic −4 to −5, ± 2 mmol/L (Narins & Emmett, Medicine
//   1980;59:161–187; Adrogué & Madias, JASN 2010;21:920–923, from memory);
// - anion gap Na − (Cl + HCO3), upper normal 12 mmol/L (common practice, no source); corrected for
//   albumin + 2.5 × (4.0 − albumin g/dL) (Figge J et al., Crit Care Med 1998;26:1807–1810, from
//   memory); delta ratio (AG − 12) ÷ (24 − HCO3), < 0.8 a normal-gap part, > 2 an added metabolic
//   alkalosis (Rastegar A, JASN 2007;18:2429–2431, from memory);
// - "fully compensated": a normal pH with the compensating component beyond its reference interval
//   (common practice, no source).
// The label is the compact form of the reading: abbreviations of our own, "?" for a disorder the
// expected response points to, "acute on chronic?" for an HCO3 between the acute and chronic ranges.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { inlayHints } from '../../server/src/core/service';

/**
 * The acid–base hints of a note with one gas, in line order, ` | ` between lines: the reading's on
 * the gas line, the anion gap's on the labs line. Null when there is none.
 */
function acidBaseHint(gas: string, kpa = false): string | null {
  const text = `${kpa ? 'units gas kPa\n' : ''}@ 08:00\noxygen room air\n${gas}\n`;
  const result = checkNote(text);
  const hints = inlayHints(result, { start: 0, end: result.analysis.tree.lines.length - 1 }, { categories: new Set(['acid-base']) });
  return hints.length === 0 ? null : hints.map((h) => h.label).join(' | ');
}

/** [gas, what the hint says] in an mmHg note. */
const MMHG: readonly (readonly [string, string | null])[] = [
  // Metabolic acidosis: expected PaCO2 1.5 × 12 + 8 ± 2 = 24–28 mmHg.
  ['abg 7.28/26/95/12', 'consistent with met. acidosis'],
  // AG 140 − (100 + 12) = 28, delta ratio (28 − 12) ÷ (24 − 12) = 1.33: a high gap.
  ['abg 7.28/26/95/12\nlabs na 140, cl 100', 'consistent with met. acidosis, high AG | AG 28'],
  // AG 140 − (116 + 12) = 12: a normal gap.
  ['abg 7.28/26/95/12\nlabs na 140, cl 116', 'consistent with met. acidosis, normal AG | AG 12'],
  // AG 18, delta ratio 6 ÷ 12 = 0.5: high and normal gap parts.
  ['abg 7.28/26/95/12\nlabs na 140, cl 110', 'consistent with met. acidosis, mixed AG | AG 18'],
  // AG 140 − (112 + 10) = 18, corrected for albumin 2.0 g/dL: 23; delta ratio 11 ÷ 14 = 0.79.
  ['abg 7.25/23/96/9.8\nlabs na 140, cl 112, hco3 10, albumin 2.0', 'consistent with met. acidosis, mixed AG | AG 23 (corr.)'],
  // PaCO2 40 above the expected 24–28: an added respiratory acidosis, suspected.
  ['abg 7.09/40/90/12', 'consistent with met. acidosis + resp. acidosis?'],
  ['abg 7.09/40/90/12\nlabs na 140, cl 100', 'consistent with met. acidosis, high AG + resp. acidosis? | AG 28'],
  // Expected 1.5 × 8 + 8 ± 2 = 18–22; PaCO2 15 below it.
  ['abg 7.34/15/110/8', 'consistent with met. acidosis + resp. alkalosis?'],
  // AG 140 − (95 + 20) = 25, delta ratio 13 ÷ 4 = 3.25, above 2: an added metabolic alkalosis.
  ['abg 7.33/38/95/20\nlabs na 140, cl 95, hco3 20', 'consistent with met. acidosis, high AG + met. alkalosis | AG 25'],

  // Metabolic alkalosis: expected PaCO2 40 + 0.7 × 10 ± 2 = 45–49 mmHg.
  ['abg 7.47/47/90/34', 'consistent with met. alkalosis'],
  // pH 7.43 normal, PaCO2 46 above 45 within the expected 42.2–46.2: fully compensated.
  ['abg 7.43/46/90/30', 'consistent with met. alkalosis, compensated'],
  // Expected 40 + 0.7 × 16 ± 2 = 49.2–53.2; PaCO2 56 above it.
  ['abg 7.47/56/80/40', 'consistent with met. alkalosis + resp. acidosis?'],
  // Expected 43.6–47.6; PaCO2 38 below it.
  ['abg 7.54/38/90/32', 'consistent with met. alkalosis + resp. alkalosis?'],
  // AG 145 − (95 + 34) = 16, within 4 of 12 beside a primary metabolic alkalosis: the alkalaemia's own
  // rise (Madias, Ayus & Adrogué 1979, from memory; the margin common practice, no source), no acidosis added.
  ['abg 7.47/47/90/34\nlabs na 145, cl 95', 'consistent with met. alkalosis | AG 16'],
  // AG 146 − (95 + 34) = 17, beyond that margin, HCO3 not below 24: an added metabolic acidosis.
  ['abg 7.47/47/90/34\nlabs na 146, cl 95', 'consistent with met. alkalosis + met. acidosis | AG 17'],

  // Respiratory acidosis, PaCO2 60: acute HCO3 24–28, chronic 29–36 mmol/L.
  ['abg 7.25/60/70/26', 'consistent with resp. acidosis, acute'],
  ['abg 7.35/60/70/33', 'consistent with resp. acidosis, chronic, compensated'],
  // PaCO2 70: acute 25–29, chronic 32.5–41 mmol/L.
  ['abg 7.30/70/60/34', 'consistent with resp. acidosis, chronic'],
  ['abg 7.27/70/60/31.5', 'consistent with resp. acidosis, acute on chronic?'],
  // PaCO2 62: chronic 24 + 3.5 × 2.2 − 2 = 29.7 on its low end, so within it.
  ['abg 7.29/62/58/29.7', 'consistent with resp. acidosis, chronic'],
  // PaCO2 46: acute 23–27, chronic 24–29 overlap; HCO3 26.2 in both, above 26 with a normal pH.
  ['abg 7.37/46/90/26.2', 'consistent with resp. acidosis, compensated'],
  // HCO3 23 below both ranges: an added metabolic acidosis, suspected.
  ['abg 7.20/60/70/23', 'consistent with resp. acidosis + met. acidosis?'],
  // PaCO2 80: acute 26–30, chronic 36–46; HCO3 48 above both.
  ['abg 7.39/80/60/48', 'consistent with resp. acidosis + met. alkalosis?'],
  // AG 140 − (95 + 26) = 19, high: an added metabolic acidosis, which lowers the HCO3 too, so its
  // timing is not read from the HCO3 (Narins & Emmett 1980 read the HCO3 as the response alone).
  ['abg 7.25/60/70/26\nlabs na 140, cl 95', 'consistent with resp. acidosis + met. acidosis | AG 19'],

  // Respiratory alkalosis, PaCO2 25: acute 19–23, chronic 14.5–20 mmol/L.
  ['abg 7.56/25/95/22', 'consistent with resp. alkalosis, acute'],
  ['abg 7.42/25/95/16', 'consistent with resp. alkalosis, chronic, compensated'],
  // PaCO2 20: acute 18–22, chronic 12–18.
  ['abg 7.49/20/100/15', 'consistent with resp. alkalosis, chronic'],
  // PaCO2 28: acute 19.6–23.6, chronic 16–21.2 overlap; HCO3 21 in both.
  ['abg 7.49/28/45/21', 'consistent with resp. alkalosis'],
  // PaCO2 15: acute 17–21, chronic 9.5–16; HCO3 16.5 between them.
  ['abg 7.65/15/110/16.5', 'consistent with resp. alkalosis, acute on chronic?'],
  // HCO3 9.2 below both ranges.
  ['abg 7.40/15/110/9.2', 'consistent with resp. alkalosis + met. acidosis?'],
  // PaCO2 30: acute 20–24, chronic 17–22; HCO3 26 above both.
  ['abg 7.55/30/95/26', 'consistent with resp. alkalosis + met. alkalosis?'],

  // Mixed: PaCO2 60 above 45 and HCO3 18 below 22.
  ['abg 7.10/60/90/18', 'consistent with mixed acidosis'],
  // AG 140 − (95 + 18) = 27, delta ratio 15 ÷ 6 = 2.5.
  ['abg 7.10/60/90/18\nlabs na 140, cl 95', 'consistent with mixed acidosis, high AG | AG 27'],
  ['abg 7.10/60/90/18\nlabs na 140, cl 110', 'consistent with mixed acidosis, normal AG | AG 12'],
  // AG 16, delta ratio 4 ÷ 6 = 0.67.
  ['abg 7.10/60/90/18\nlabs na 140, cl 106', 'consistent with mixed acidosis, mixed AG | AG 16'],
  // PaCO2 30 below 35 and HCO3 30 above 26.
  ['abg 7.61/30/90/30', 'consistent with mixed alkalosis'],
  ['abg 7.61/30/90/30\nlabs na 145, cl 100', 'consistent with mixed alkalosis + met. acidosis | AG 15'],

  // Normal: no reading to show, only the gap where there is one.
  ['abg 7.40/40/95/24', null],
  // AG 138 − (100 + 24.4) = 13.6, corrected 18.6 (shown 19), HCO3 not below 24: both added.
  ['abg 7.36/44/90/24.4\nlabs na 138, cl 100, albumin 2.0', 'normal pH; consistent with met. acidosis + met. alkalosis | AG 19 (corr.)'],
  // The laboratory bicarbonate 24 the gap takes has not fallen: AG 140 − (100 + 24) = 16.
  ['abg 7.38/38/90/22.1\nlabs na 140, cl 100, hco3 24', 'normal pH; consistent with met. acidosis + met. alkalosis | AG 16'],
  // AG 140 − (104 + 22.1) = 13.9, delta ratio 1.9 ÷ 1.9 = 1: an added metabolic acidosis only.
  ['abg 7.38/38/90/22.1\nlabs na 140, cl 104', 'normal pH; consistent with met. acidosis | AG 14'],
  // pH 7.34 below 7.35 with PaCO2 45 and HCO3 23.5 not beyond their limits: the PaCO2's shift
  // towards acid outweighs the HCO3's.
  ['abg 7.34/45/90/23.5', 'consistent with resp. acidosis, acute'],
  // pH, PaCO2 and HCO3 do not fit together (PN402): nothing is read.
  ['abg 7.30/40/90/35', null],
];

/** [gas, what the hint says] in a kPa note (1 kPa = 7.50062 mmHg; kPa written with one decimal). */
const KPA: readonly (readonly [string, string | null])[] = [
  ['abg 7.25/8.0/9.3/26', 'consistent with resp. acidosis, acute'],
  ['abg 7.30/9.3/8.0/34', 'consistent with resp. acidosis, chronic'],
  ['abg 7.35/8.0/9.3/33', 'consistent with resp. acidosis, chronic, compensated'],
  ['abg 7.27/9.3/8.0/31.5', 'consistent with resp. acidosis, acute on chronic?'],
  ['abg 7.28/9.1/7.9/31.5', 'consistent with resp. acidosis, acute on chronic?'],
  ['abg 7.28/3.5/12.7/12\nlabs na 140, cl 100', 'consistent with met. acidosis, high AG | AG 28'],
  ['abg 7.09/5.3/12/12', 'consistent with met. acidosis + resp. acidosis?'],
  ['abg 7.07/4.7/12.7/10', 'consistent with met. acidosis + resp. acidosis?'],
  ['abg 7.47/6.3/12/34', 'consistent with met. alkalosis'],
  ['abg 7.56/3.3/12.7/22', 'consistent with resp. alkalosis, acute'],
  ['abg 7.10/8.0/12/18\nlabs na 140, cl 106', 'consistent with mixed acidosis, mixed AG | AG 16'],
  ['abg 7.61/4.0/12/30', 'consistent with mixed alkalosis'],
  ['abg 7.36/5.9/12/24.4\nlabs na 138, cl 100, albumin 2.0', 'normal pH; consistent with met. acidosis + met. alkalosis | AG 19 (corr.)'],
  // 6.0 kPa is on the 45 mmHg limit as written, so not above it.
  ['abg 7.34/6.0/12/23.5', 'consistent with resp. acidosis, acute'],
  ['abg 7.35/5.3/10.7/24', null],
  ['abg 7.40/5.3/12/15', null],
];

describe('the acid–base inlay hint names what the reading decides', () => {
  it.each(MMHG)('mmHg: %s', (gas, label) => {
    expect(acidBaseHint(gas)).toBe(label);
  });

  it.each(KPA)('kPa: %s', (gas, label) => {
    expect(acidBaseHint(gas, true)).toBe(label);
  });
});
