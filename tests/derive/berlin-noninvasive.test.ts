// The Berlin definition (ARDS Definition Task Force, Ranieri VM et al., "Acute respiratory distress
// syndrome: the Berlin Definition", JAMA 2012;307:2526–2533; its table as reproduced in the Merck
// Manual Professional, "Berlin Definition of ARDS", and in Trials 2017;18:536, Table 1) names the
// 200–300 mmHg band "with PEEP or CPAP ≥ 5 cmH2O", which may be given noninvasively, and the
// 100–200 and ≤ 100 mmHg bands "with PEEP ≥ 5 cmH2O" only: PEEP on invasive ventilation. EPAP on
// NIV and CPAP on an oxygen line are noninvasive; they were read as meeting the condition of every
// band (P/F 108 mmHg on a CPAP mask was called the 100–200 mmHg band, "moderate").
import { describe, expect, it } from 'vitest';
import { readings } from './helpers';

const band = (text: string) => readings(text)['oxygenation-band'];

describe('Berlin bands on noninvasive support', () => {
  it('names the 200–300 mmHg band with CPAP on an oxygen line or EPAP on NIV', () => {
    // 130 ÷ 0.5 = 260 and 125 ÷ 0.5 = 250.
    expect(band('@ 08:00\noxygen cpap 8, fio2 0.5\nabg 7.38/42/130/24')).toBe('P/F 260 mmHg with CPAP 8 cmH2O: consistent with the 200–300 mmHg oxygenation band of the Berlin definition (the band called mild there) — an oxygenation band, not a diagnosis.');
    expect(band('@ 08:00\noxygen niv ipap 14, epap 6, fio2 0.5\nabg 7.38/42/125/24')).toMatch(/^P\/F 250 mmHg with EPAP 6 cmH2O: consistent with the 200–300 mmHg oxygenation band/);
  });

  it('names no lower band there, and says that the definition names none on noninvasive support', () => {
    // 65 ÷ 0.6 = 108.3 and 45 ÷ 0.5 = 90.
    expect(band('@ 08:00\noxygen cpap 10, fio2 0.6\nabg 7.38/42/65/24')).toBe('P/F 108 mmHg with CPAP 10 cmH2O: below the 200–300 mmHg oxygenation band, the one band the Berlin definition names on noninvasive support (its 100–200 and ≤ 100 mmHg bands need PEEP on invasive ventilation) — an oxygenation band, not a diagnosis.');
    expect(band('@ 08:00\noxygen niv ipap 16, epap 8, fio2 0.5\nabg 7.38/42/45/24')).toMatch(/^P\/F 90 mmHg with EPAP 8 cmH2O: below the 200–300 mmHg oxygenation band, the one band/);
  });

  it('keeps every band for PEEP on a vent line, CPAP mode there included', () => {
    expect(band('@ 08:00\nvent mode CPAP, peep 10, fio2 0.6\nabg 7.38/42/65/24')).toMatch(/^P\/F 108 mmHg with PEEP 10 cmH2O: consistent with the 100–200 mmHg oxygenation band/);
    expect(band('@ 08:00\nvent mode VC, vt 400, rate 18, peep 10, fio2 1.0\nabg 7.38/42/65/24')).toMatch(/^P\/F 65 mmHg with PEEP 10 cmH2O: consistent with the ≤ 100 mmHg oxygenation band/);
  });
});
