// On oxygen by a device whose FiO2 is not stated, a PaO2 at or above the hypoxaemia threshold
// (60 mmHg, common practice) says nothing of how much oxygen holds it there: a PaO2 of 70 mmHg on a
// reservoir mask at 15 L/min, which can give an FiO2 well above 0.6 (common practice, no source),
// would be a P/F near or below 100 mmHg, no "mildly reduced oxygenation". The reading names the
// device, as the hypoxaemia reading does, grades nothing, and says what to add. Invented gases.
import { describe, expect, it } from 'vitest';
import { readings } from './helpers';

const note = (oxygen: string, po2: number) => `patient age 58 y\n@ day 1 10:00\n${oxygen}\nabg ph 7.40, pco2 40, po2 ${po2}\n`;

describe('the oxygenation reading on oxygen of an FiO2 not stated', () => {
  it('PaO2 70 on a reservoir mask: not graded as mildly reduced, and fio2 asked for', () => {
    expect(readings(note('oxygen reservoir 15 L/min', 70)).oxygenation).toBe(
      'PaO2 70 mmHg with oxygen by reservoir, FiO2 not stated: consistent with a PaO2 above the hypoxaemia threshold of 60 mmHg on oxygen, which may still hide impaired gas exchange: add fio2 (on the reservoir line) to grade it.',
    );
  });

  it('PaO2 95 on a cannula: adequate arterial oxygenation, said to be on oxygen', () => {
    expect(readings(note('oxygen cannula 2 L/min', 95)).oxygenation).toBe(
      "PaO2 95 mmHg with oxygen by cannula, FiO2 not stated: consistent with adequate arterial oxygenation on oxygen: add fio2 (a cannula's FiO2 is only an estimate) to tell how well the lungs oxygenate.",
    );
  });

  it('on air, and with an FiO2, the readings are as before', () => {
    expect(readings(note('oxygen room air', 70)).oxygenation).toBe('PaO2 70 mmHg: consistent with mildly reduced oxygenation, above the hypoxaemia threshold of 60 mmHg.');
    expect(readings(note('oxygen venturi, fio2 0.28', 95)).oxygenation).toBe('PaO2 95 mmHg on FiO2 0.28: consistent with adequate arterial oxygenation.');
  });
});
