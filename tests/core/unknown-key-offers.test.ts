// What an unknown key is offered (PN201), as a user reads it: a key written on the wrong line is
// not misspelt, so no key of another quantity is offered for it (`hb` on a vitals line is not the
// heart rate `hr`); a word that names a ventilator quantity Pneumark has no key for (a time, an
// APRV level) is offered none rather than a key one letter away (`tinsp`, the inspiratory time,
// is not the set inspiratory pressure `pinsp`), and never a fix applied unasked. Our rules, common
// practice of safe fixes, no source.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { codeActions } from '../../server/src/core/service';
import { applyEdits } from '../../server/src/core/service/text-edits';

const pn201 = (line: string) => checkNote(`@ 08:00\n${line}`).findings.filter((f) => f.code === 'PN201');
const offered = (line: string) => pn201(line).map((f) => [f.message, f.fixes.map((x) => x.title)]);

describe('a key written on the wrong line', () => {
  it('says where it belongs, and offers no key of another quantity', () => {
    expect(offered('vitals hb 12')).toEqual([['`hb` is not a key of vitals lines (`hb` belongs on a labs or abg or vbg line).', []]]);
    expect(offered('abg hr 80')).toEqual([['`hr` is not a key of abg lines (`hr` belongs on a vitals line).', []]]);
    expect(offered('vitals vt 400')).toEqual([['`vt` is not a key of vitals lines (`vt` belongs on a vent line).', []]]);
    expect(offered('vitals pco2 40')).toEqual([['`pco2` is not a key of vitals lines (`pco2` belongs on an abg or vbg line).', []]]);
    expect(offered('vitals fio2 0.4')).toEqual([['`fio2` is not a key of vitals lines (`fio2` belongs on an oxygen or vent or abg line).', []]]);
    expect(offered('vitals ipap 14')).toEqual([['`ipap` is not a key of vitals lines (`ipap` belongs on an oxygen line).', []]]);
    // On a vent line an `ipap` is NIV, which is written on an oxygen line: the line is offered as one
    // (tests/core/support-on-vent-line.test.ts).
    expect(offered('vent ipap 14')).toEqual([['`ipap` is not a key of vent lines (`ipap` belongs on an oxygen line): NIV and CPAP are written on oxygen lines in this format. Write this line as `oxygen niv ipap 14`.', ['Write as `oxygen niv ipap 14`']]]);
  });

  it('keeps the line\'s own name of the end-expiratory pressure (`peep` on an NIV oxygen line is `epap`)', () => {
    expect(offered('oxygen niv, ipap 14, peep 5')).toEqual([['`peep` is not a key of oxygen lines (`peep` belongs on a vent line). Did you mean `epap`?', ['Change to `epap`']]]);
  });

  it('offers a vent line\'s set rate for `rr`, never applied unasked (the measured rate belongs on a vitals line)', () => {
    // `RR` is common shorthand for the set rate in a ventilator's settings (common practice, no
    // source); on a vent line the set rate is `rate`, the measured rate `rr` belongs on a vitals line.
    for (const written of ['rr', 'RR', 'resp', 'rrate']) {
      const line = `vent mode VC, vt 450, ${written} 16, peep 8`;
      expect(offered(line)).toEqual([[`\`${written}\` is not a key of vent lines (\`${written}\` belongs on a vitals line). Did you mean \`rate\`, the ventilator's set rate?`, ['Change to `rate`']]]);
      expect(pn201(line)[0]?.fixes[0]?.preferred === true).toBe(false);
      const all = codeActions(checkNote(`@ 08:00\n${line}`), { start: { line: 0, character: 0 }, end: { line: 1, character: 0 } }).find((a) => a.kind === 'source.fixAll');
      expect(all?.findingCodes ?? []).not.toContain('PN201');
    }
    // The fix gives a clean line with the set rate read.
    const text = '@ 08:00\nvent mode VC, vt 450, rr 16, peep 8';
    const [finding] = checkNote(text).findings.filter((f) => f.code === 'PN201');
    const fixed = applyEdits(text, finding!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8');
    const after = checkNote(fixed);
    expect(after.findings.filter((f) => f.code === 'PN201')).toEqual([]);
    expect(after.analysis.timeline.timepoints[0]!.values.get('vent_rate')?.stated.value).toBe(16);
    // Elsewhere a respiratory rate on the wrong line is offered nothing, as before.
    expect(offered('abg rr 16')).toEqual([['`rr` is not a key of abg lines (`rr` belongs on a vitals line).', []]]);
  });

  it('still offers a near key for a misspelt one that is no key anywhere', () => {
    expect(offered('vitals hrr 80')[0]?.[1]).toContain('Change to `hr`');
  });
});

describe('a ventilator word Pneumark has no key for', () => {
  it.each([['tinsp 1.0'], ['ti 1.0'], ['tlow 0.5'], ['thigh 4'], ['plow 0'], ['phigh 28']])('`vent mode APRV, %s` is reported with no key offered and nothing to apply unasked', (item) => {
    const line = `vent mode APRV, ${item}`;
    const [finding] = pn201(line);
    const word = item.split(' ')[0];
    expect(finding?.message).toBe(`\`${word}\` is not a key of vent lines.`);
    expect(finding?.fixes).toEqual([]);
    const result = checkNote(`@ 08:00\n${line}`);
    const all = codeActions(result, { start: { line: 0, character: 0 }, end: { line: 1, character: 0 } }).find((a) => a.kind === 'source.fixAll');
    expect(all?.findingCodes ?? []).not.toContain('PN201');
  });
});

describe('bilevel support written by its common shorthand', () => {
  // `bipap` and `bpap` are common shorthand for bilevel noninvasive ventilation (common practice,
  // no source): the device of this format is `niv`. CPAP, one letter nearer by spelling, is another
  // support, and `ipap` and `epap` are its pressures, not a device.
  it.each([['bipap'], ['BiPAP'], ['bpap']])('`oxygen %s …` is offered `niv` alone, never applied unasked', (word) => {
    const line = `oxygen ${word} ipap 14, epap 6, fio2 0.4`;
    expect(offered(line)).toEqual([[`\`${word}\` is neither a device nor a key of oxygen lines. Did you mean \`niv\`, bilevel noninvasive ventilation?`, ['Change to `niv`']]]);
    expect(pn201(line)[0]?.fixes[0]?.preferred === true).toBe(false);
    const text = `@ 08:00\n${line}`;
    const fixed = applyEdits(text, checkNote(text).findings.find((f) => f.code === 'PN201')!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\noxygen niv ipap 14, epap 6, fio2 0.4');
    expect(checkNote(fixed).findings.filter((f) => f.severity === 'error')).toEqual([]);
  });

  it('is not a device after the first word of the line', () => {
    expect(offered('oxygen niv, bipap 14')[0]?.[1]).not.toContain('Change to `niv`');
  });
});

describe('the I:E ratio, which has no key', () => {
  // `ie` is common shorthand for the ventilator's inspiratory-to-expiratory time ratio (common
  // practice, no source); the minute volume `ve`, one letter away, is another quantity.
  it('is reported with no key offered', () => {
    expect(offered('vent mode VC, vt 450, ie 1:2')).toEqual([['`ie` is not a key of vent lines.', []]]);
    expect(offered('vent mode VC, vt 450, IE 1:2')).toEqual([['`IE` is not a key of vent lines.', []]]);
  });
});

describe('`ip` and `ep` on an oxygen line', () => {
  // Commonly written for the inspiratory and expiratory pressures of NIV (common practice, no
  // source): offered the line's own keys, by the support its device gives, never applied unasked.
  it('are offered `ipap` and `epap` on an NIV line, and on one that names no device (read as NIV)', () => {
    for (const line of ['oxygen niv, ip 14, ep 6', 'oxygen bilevel ip 14 ep 6']) {
      expect(offered(line), line).toEqual([
        ['`ip` is not a key of oxygen lines. Did you mean `ipap`?', ['Change to `ipap`']],
        ['`ep` is not a key of oxygen lines. Did you mean `epap`?', ['Change to `epap`']],
      ]);
      expect(pn201(line).flatMap((f) => f.fixes.map((x) => x.preferred === true)), line).toEqual([false, false]);
    }
    expect(offered('oxygen fio2 0.4, ip 14')).toEqual([['`ip` is not a key of oxygen lines. Did you mean `ipap`?', ['Change to `ipap`']]]);
  });

  it('offer the level on a CPAP line for `ep`, nothing for `ip`, and nothing beside a device that sets no pressure', () => {
    expect(offered('oxygen cpap, ep 8')).toEqual([['`ep` is not a key of oxygen lines. Did you mean `level`?', ['Change to `level`']]]);
    expect(offered('oxygen cpap, ip 14')).toEqual([['`ip` is not a key of oxygen lines.', []]]);
    expect(offered('oxygen mask, ip 14, ep 6').map(([, fixes]) => fixes)).toEqual([[], []]);
  });
});
