// A derived value's formula with the numbers put in ("With the numbers" in hovers, `substituted` in
// check --format json) must give the value it shows: a reader who redoes the arithmetic with the
// numbers shown gets the result shown, to its decimals. Inputs rounded to their own decimals did
// not (`50.0 + 0.91 × (180 − 152.4) = 75.0 kg`, which is 75.1).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { allDerivations } from '../../server/src/core/analysis/analyse';
import { checkNote } from '../../server/src/core/check-note';
import { substitutedText } from '../../server/src/core/service/derived-hover';
import { samples } from '../export/helpers';
import { derived } from './helpers';
import { unsignedOnPaper } from '../helpers/on-paper';

/**
 * The left side of `a op b = result unit` evaluated as JavaScript (× ÷ − ^ as * / - **), and the
 * result as shown; null when the formula is not plain arithmetic (words, `±`, `|`). Test code only.
 */
function redo(substituted: string): { readonly left: number; readonly right: string; readonly decimals: number } | null {
  const at = substituted.lastIndexOf(' = ');
  if (at < 0) return null;
  let left = substituted.slice(0, at);
  // In a kPa note the value is `28.2 kPa (212 mmHg)` after the left side: the first number is the one computed.
  const rightMatch = /^-?\d+(?:\.\d+)?/.exec(substituted.slice(at + 3));
  if (!rightMatch) return null;
  const right = rightMatch[0];
  // `… = 151 mmHg = 20.1 kPa`: the left side ends at the first ` = `.
  const first = substituted.indexOf(' = ');
  if (first !== at) {
    left = substituted.slice(0, first);
    const m = /^-?\d+(?:\.\d+)?/.exec(substituted.slice(first + 3));
    if (!m) return null;
    return evaluate(left, m[0]);
  }
  return evaluate(left, right);
}

function evaluate(left: string, right: string): { readonly left: number; readonly right: string; readonly decimals: number } | null {
  const js = left.replace(/×/g, '*').replace(/÷/g, '/').replace(/−/g, '-').replace(/\^/g, '**');
  if (!/^[-+*/().\d\s]+$/.test(js)) return null;
  // Parenthesised so that `-x ** y` parses; the text was checked to hold only arithmetic.
  const value = Function(`"use strict"; return (${js.replace(/(\d+(?:\.\d+)?)\s*\*\*/g, '($1)**')});`)() as number;
  const decimals = right.includes('.') ? right.length - right.indexOf('.') - 1 : 0;
  return { left: value, right, decimals };
}

/**
 * A value set rather than computed, which its notes say (a PaO2 within rounding of the alveolar PO2,
 * or above the simplified equation's alveolar PO2 but not the full one's: A–a shown as 0, a/A as 1).
 */
const SET_NOT_COMPUTED = /(within rounding of the alveolar PO2|not above that of the full alveolar gas equation, which reads higher on a high FiO2): (gradient|ratio) shown as/;

/**
 * `value` to `d` decimals as on paper: first to 9 decimals past the last (so 19.949999999999996,
 * binary for 19.95, is 19.95), then halves away from zero. Decimal text, not arithmetic.
 */
function onPaper(value: number, d: number): string {
  const text = unsignedOnPaper(value, d);
  return value < 0 && /[1-9]/.test(text) ? `-${text}` : text;
}

function expectReproduces(substituted: string, notes: readonly string[] = []): void {
  if (notes.some((n) => SET_NOT_COMPUTED.test(n))) return;
  const r = redo(substituted);
  if (r === null) return;
  expect(onPaper(r.left, r.decimals), substituted).toBe(r.right);
}

const FT_NOTE = [
  'patient age 50, sex male, height 5.9 ft',
  'units gas kPa',
  '@ day 1 08:00',
  'vent mode VC, vt 450, rate 18, peep 8, fio2 0.4, plateau 24, peak 30',
  'vitals hr 80, rr 18, spo2 93 %',
  'abg ph 7.35, pco2 6.1, po2 10.3, hco3 24',
  '',
].join('\n');

describe('the formula with its numbers gives the value shown', () => {
  it('predicted body weight of a height written in feet', () => {
    // ARDS Network, NEJM 2000;342:1301–1308: 50 + 0.91 × (179.832 − 152.4) = 74.96 kg (male).
    const pbw = derived(FT_NOTE, 'predicted_body_weight');
    expect(pbw.substituted).toMatch(/= 75\.0 kg$/);
    expectReproduces(pbw.substituted);
  });

  it('calculated HCO3 of a PaCO2 written in kPa', () => {
    // Henderson–Hasselbalch (0.0307 mmol/L per mmHg): 0.0307 × 45.75 × 10^1.25 = 24.98 mmol/L.
    const hco3 = derived(FT_NOTE, 'hco3_calculated');
    expect(hco3.substituted).toMatch(/= 25\.0 mmol\/L$/);
    expectReproduces(hco3.substituted);
  });

  it('every derived value of the sample notes, in JSON and in hovers', () => {
    let checkedFormulas = 0;
    for (const s of samples()) {
      const analysis = s.result.analysis;
      allDerivations(analysis).forEach((d, i) => {
        const tp = analysis.timeline.timepoints[i]!;
        for (const v of d.derived) {
          if (redo(v.substituted)) checkedFormulas++;
          expectReproduces(v.substituted, v.notes);
          expectReproduces(substitutedText(v, tp), v.notes);
        }
      });
    }
    expect(checkedFormulas).toBeGreaterThan(50);
  });

  it('every derived value of generated notes (property)', () => {
    const decimal = (min: number, max: number, decimals: number) => fc.integer({ min: Math.round(min * 10 ** decimals), max: Math.round(max * 10 ** decimals) }).map((n) => (n / 10 ** decimals).toFixed(decimals));
    fc.assert(fc.property(
      fc.boolean(), decimal(4.5, 6.8, 2), decimal(120, 200, 1), decimal(7.1, 7.6, 2), decimal(3, 12, 1), decimal(5, 20, 2), decimal(15, 40, 1), decimal(0.25, 0.9, 2), fc.integer({ min: 5, max: 14 }), decimal(18, 35, 0), decimal(300, 550, 0), decimal(60, 99, 0), decimal(1, 2000, 0), decimal(8, 14, 1),
      (kpa, ft, cm, ph, pco2, po2, hco3, fio2, peep, plateau, vt, spo2, altitude, hb) => {
        const note = [
          `patient age 60, sex female, height ${kpa ? `${ft} ft` : `${cm} cm`}`,
          `place altitude ${altitude} m`,
          kpa ? 'units gas kPa' : 'units gas mmHg',
          '@ day 1 08:00',
          `vent mode VC, vt ${vt}, rate 20, peep ${peep}, fio2 ${fio2}, plateau ${plateau}, peak ${Number(plateau) + 5}, map 14`,
          `vitals hr 90, rr 20, spo2 ${spo2} %`,
          `abg ph ${ph}, pco2 ${kpa ? pco2 : (Number(pco2) * 7.5).toFixed(0)}, po2 ${kpa ? po2 : (Number(po2) * 7.5).toFixed(0)}, hco3 ${hco3}, sao2 ${spo2} %, hb ${hb}`,
          'labs na 140, cl 102, albumin 3.1',
          '',
        ].join('\n');
        const analysis = checkNote(note).analysis;
        allDerivations(analysis).forEach((d, i) => {
          const tp = analysis.timeline.timepoints[i]!;
          for (const v of d.derived) {
            expectReproduces(v.substituted, v.notes);
            expectReproduces(substitutedText(v, tp), v.notes);
          }
        });
      },
    ), {
      numRuns: 150,
      // A PaO2 of 97 mmHg above the simplified alveolar PO2 (92) but not above the full one (97): the
      // gradient is set to 0, not computed, and its note says so (seed 1279598415).
      examples: [[false, '4.50', '120.0', '7.10', '8.6', '12.87', '15.0', '0.31', 5, '18', '300', '60', '1980', '8.0']],
    });
  });
});
