// A number shown beside a threshold is never rounded onto the wrong side of it: "PaO2 60 mmHg …
// below 60" for a PaO2 of 59.6 would contradict itself at the bedside. Thresholds: hypoxaemia
// PaO2 < 60 and hypercapnia PaCO2 > 50 mmHg (common practice, no source); plateau 30 cmH2O (ARDS
// Network, NEJM 2000;342:1301–1308 — the paper not read; the network's protocol card, plateau goal
// 30 cmH2O or less, read in its reproduction at thorax.us); driving pressure 15 cmH2O (common practice, after
// Amato MBP et al., NEJM 2015;372:747–755 — from memory); Winters' formula 1.5 × HCO3 + 8 ± 2
// (Albert, Dell & Winters, Ann Intern Med 1967;66:312–322 — from memory).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { decimalsAgainst, formatAgainst } from '../../server/src/core/util/format';
import { readings } from './helpers';

describe('formatAgainst', () => {
  it('adds decimals only where fewer would cross a threshold', () => {
    expect(formatAgainst(59.6, 0, 60)).toBe('59.6');
    expect(formatAgainst(58.6, 0, 60)).toBe('59');
    expect(formatAgainst(50.25, 0, 50)).toBe('50.3');
    expect(formatAgainst(60, 0, 60)).toBe('60');
    expect(formatAgainst(59.96, 0, 60)).toBe('59.96');
    expect(decimalsAgainst(32.5, 0, 33)).toBe(1);
    expect(decimalsAgainst(40.2, 0, 45, 50, 35)).toBe(0);
    expect(decimalsAgainst(40.2, 0, 40, 45, 50, 35)).toBe(1);
    expect(decimalsAgainst(34.6, 0, 50, 45, 35)).toBe(1);
  });

  it('keeps a value that is on a threshold on paper on it (114 / 0.57 = 200)', () => {
    expect(formatAgainst(114 / 0.57, 0, 200)).toBe('200');
  });
});

describe('readings and checks', () => {
  it('shows a PaO2 of 59.6 and a PaCO2 of 50.25 as such beside their thresholds', () => {
    const r = readings('@ 08:00\noxygen room air\nabg ph 7.34, pco2 50.25, po2 59.6, hco3 26.6');
    expect(r.oxygenation).toMatch(/^PaO2 59\.6 mmHg: consistent with moderate hypoxaemia \(below 60 mmHg\)/);
    expect(r.ventilation).toMatch(/^PaCO2 50\.3 mmHg: consistent with hypercapnia \(above 50 mmHg\)/);
  });

  it('shows the ends of an expected range with the decimals that keep the observed value outside it', () => {
    // HCO3 15 → PaCO2 expected 1.5 × 15 + 8 ± 2 = 28.5–32.5; an observed 33 is above it.
    const r = readings('@ 08:00\noxygen room air\nabg ph 7.27, pco2 33, po2 95, hco3 15');
    expect(r['acid-base']).toMatch(/PaCO2 33 mmHg is above the expected 28\.5–32\.5 mmHg: consistent with an added respiratory acidosis\.$/);
  });

  it('shows the bounds of an unusual value in another unit with the decimals that keep the value outside them', () => {
    // Height soft bounds 120–220 cm (the registry's own, common practice): 47.24–86.61 in.
    const messages = checkNote('patient height 47.1 in\n@ 08:00').findings.map((f) => f.message);
    expect(messages).toContain('Height 47.1 in is unusual (usually 47.2 in to 86.6 in): check the unit and the transcription.');
  });

  it('shows bounds in kPa with the decimals of kPa, and in a coarser unit without rounding them away', () => {
    // PaCO2 bounds 5–400 mmHg hard, 15–150 mmHg usual: 0.7–53.3 kPa and 2.0–20.0 kPa, never `1 kPa to 53 kPa`.
    const messages = (text: string) => checkNote(text).findings.map((f) => f.message);
    expect(messages('@ 08:00\nabg pco2 56 kPa')).toContain('PaCO2 56 kPa is impossible (expected 0.7 kPa to 53.3 kPa); it is not used in calculations. In mmHg it would be ordinary.');
    expect(messages('@ 08:00\nabg pco2 1.5 kPa')).toContain('PaCO2 1.5 kPa is unusual (usually 2.0 kPa to 20.0 kPa): check the unit and the transcription.');
    // Tidal volume 50–1200 mL with no body size in the note, inspiratory flow 10–120 L/min.
    expect(messages('@ 08:00\nvent vt 1.5 L')).toContain('Tidal volume 1.5 L is unusual (usually 0.05 L to 1.2 L): check the unit and the transcription.');
    expect(messages('@ 08:00\nvent flow 0.1 L/s')).toContain('Inspiratory flow 0.1 L/s is unusual (usually 0.17 L/s to 2 L/s): check the unit and the transcription.');
  });

  it('shows a plateau of 30.4 and a driving pressure of 15.4 as such beside 30 and 15', () => {
    const messages = checkNote('@ 08:00\nvent peep 15, plateau 30.4, fio2 0.5').findings.map((f) => f.message);
    expect(messages).toContain('Plateau pressure 30.4 cmH2O is above 30 cmH2O.');
    expect(messages).toContain('Driving pressure is 15.4 cmH2O (plateau − PEEP), above 15 cmH2O.');
  });
});
