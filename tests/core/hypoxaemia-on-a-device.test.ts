// A hypoxaemic gas taken on oxygen says so. With the FiO2 stated the reading already said
// "despite FiO2 0.28"; with only the device (a cannula or a mask at a flow, whose FiO2 is an
// estimate Pneumark does not use), it said nothing of the oxygen, and read as a gas on air: the
// same words as for PaO2 54 mmHg breathing air, where the two are not alike (hypoxaemia despite
// oxygen is the graver). The hypercapnic reading of such a gas already names the device ("with
// oxygen by cannula, FiO2 not stated"); the hypoxaemia reading now does as well.
// Hypoxaemia PaO2 < 60 mmHg: common practice, no source (REFERENCES.md, the default setting).
import { describe, expect, it } from 'vitest';
import { readings } from '../derive/helpers';

const note = (oxygen: string, gas: string) => `patient age 70 y\n@ 08:00\noxygen ${oxygen}\nabg ${gas}`;

describe('the hypoxaemia reading names the oxygen device when no FiO2 is stated (hypoxaemia PaO2 < 60 mmHg: common practice, no source)', () => {
  it('on a nasal cannula at 3 L/min', () => {
    expect(readings(note('cannula 3 L/min', '7.45/33/54/22.6')).oxygenation).toBe('PaO2 54 mmHg: consistent with moderate hypoxaemia (below 60 mmHg) despite oxygen by cannula, FiO2 not stated.');
  });

  it('on a simple mask, severe (PaO2 38 < 40 mmHg, common practice, no source)', () => {
    expect(readings(note('mask 8 L/min', '7.46/29/38/20.3')).oxygenation).toBe('PaO2 38 mmHg: consistent with severe hypoxaemia (below 60 mmHg, and below 40 mmHg) despite oxygen by mask, FiO2 not stated.');
  });

  it('on air, and with the FiO2 stated, as before', () => {
    expect(readings(note('room air', '7.45/33/54/22.6')).oxygenation).toBe('PaO2 54 mmHg: consistent with moderate hypoxaemia (below 60 mmHg).');
    expect(readings(note('cannula 2 L/min, fio2 0.28', '7.45/33/54/22.6')).oxygenation).toBe('PaO2 54 mmHg: consistent with moderate hypoxaemia (below 60 mmHg) despite FiO2 0.28.');
  });
});
