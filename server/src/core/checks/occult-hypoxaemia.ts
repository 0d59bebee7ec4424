/**
 * A pulse oximeter reading well above the arterial saturation measured at the same timepoint:
 * SaO2 below 88 % while SpO2 is 92 % or more, what studies of oximeter bias call occult (hidden)
 * hypoxaemia. The saturation measured in the blood is the one to act on.
 */
import { formatShort } from '../util/format';
import { toRange } from '../syntax/tree';
import { defineCheck } from './check';

/** SaO2 (%) below which an arterial saturation is hypoxaemic in the definition of occult hypoxaemia. Source: read in the abstract of Valbuena, Sjoding and coauthors, BMJ 2022, and in the legend of figure 1 of the 2020 letter (its PubMed page). */
export const OCCULT_SAO2_BELOW_PERCENT = 88;
/** SpO2 (%) from which the oximeter reads as acceptable in that definition. Source: read in the abstract of Valbuena, Sjoding and coauthors, BMJ 2022 (the 2020 letter's 92–96 % from memory). */
export const OCCULT_SPO2_FROM_PERCENT = 92;

export const occultHypoxaemiaCheck = defineCheck({
  code: 'PN406',
  alias: 'spo2-above-sao2',
  title: 'SpO2 well above the SaO2 (occult hypoxaemia)',
  severity: 'warning',
  tags: ['physiology', 'interpretation'],
  doc: {
    fires: 'At one timepoint an arterial gas gives an SaO2 below 88 % while the pulse oximeter reads 92 % or more: consistent with occult (hidden) hypoxaemia, where the oximeter reads higher than the blood. Both saturations must be stated at that timepoint.',
    example: '@ 08:00\nvitals spo2 94\nabg ph 7.40, pco2 40, po2 52, sao2 86',
    fix: 'Check the transcription of both values. If they stand, the SaO2 is the saturation measured in the blood: oxygen targets set by the oximeter may be too low for this patient.',
  },
  source: 'Sjoding MW, Dickson RP, Iwashyna TJ, Gay SE, Valley TS. Racial bias in pulse oximetry measurement. N Engl J Med 2020;383(25):2477–2478, doi 10.1056/NEJMc2029240 (its citation, and the legend of its figure 1, which shades an arterial saturation below 88 %, read on its page at PubMed 33326721; the last two authors and its SpO2 of 92–96 % from memory): occult hypoxaemia, an SaO2 below 88 % with an SpO2 of 92–96 %. The thresholds Pneumark uses, an SaO2 below 88 % despite an SpO2 of 92 % or more, read in the abstract of Valbuena VSM, Seelye S, Sjoding MW and coauthors, Racial bias and reproducibility in pulse oximetry among medical and surgical inpatients in general care in the Veterans Health Administration 2013–19, BMJ 2022;378:e069775 (PubMed 35793817).',
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    // Asked without building the values: most timepoints state no SaO2.
    if (values.originOf('sao2') !== 'here' || values.originOf('spo2') !== 'here') return;
    const sao2 = values.numberOf('sao2');
    const spo2 = values.numberOf('spo2');
    if (sao2 === null || spo2 === null || !(sao2 < OCCULT_SAO2_BELOW_PERCENT) || !(spo2 >= OCCULT_SPO2_FROM_PERCENT)) return;
    const stated = values.get('sao2')!.stated;
    const oximeter = values.get('spo2')!.stated;
    ctx.report({
      range: toRange(stated.line, stated.item.span),
      message: `SaO2 ${formatShort(sao2)} % with SpO2 ${formatShort(spo2)} % at this timepoint: consistent with occult hypoxaemia (an arterial saturation below ${OCCULT_SAO2_BELOW_PERCENT} % while the oximeter reads ${OCCULT_SPO2_FROM_PERCENT} % or more). The oximeter reads high here; the SaO2 is the one measured in the blood.`,
      related: [{ range: toRange(oximeter.line, oximeter.item.span), message: 'the SpO2 of this timepoint' }],
    });
  },
});
