// Generates invented notes for benchmarks, shaped like a long intensive-care record: a timepoint
// every hour with observations, ventilator readings every other hour, a blood gas every third
// hour, settings changed now and then, labs and remarks from time to time. About five lines per
// timepoint. No real data: every value comes from a seeded generator; gases are self-consistent, and
// the measured rate is never below the set one.
const REMARKS = ['turned and settled', 'suctioned: small white secretions', 'family visited', 'sedation unchanged', 'chest clear on the right, crackles left base', 'tolerating feeds'];

export function generateNote(timepoints, seed = 1) {
  let s = seed;
  const rand = () => (s = (s * 1103515245 + 12345) % 2147483648) / 2147483648;
  const between = (lo, hi) => lo + rand() * (hi - lo);
  const fixed = (v, d = 0) => v.toFixed(d);
  const lines = ['# generated benchmark note (invented values)', 'patient   age 61 y, sex male, height 176 cm, weight 80 kg', 'place     altitude 300 m', ''];
  let peep = 8;
  let rate = 0;
  for (let i = 0; i < timepoints; i++) {
    const day = 1 + Math.floor(i / 24);
    lines.push(`@ day ${day} ${String(i % 24).padStart(2, '0')}:00  hour ${i + 1}`);
    if (i % 12 === 0) {
      peep = Math.round(between(6, 12));
      const vt = between(380, 480);
      rate = Math.round(between(14, 22));
      lines.push(`vent      mode VC, vt ${fixed(vt)} mL, rate ${rate}, peep ${peep}, fio2 ${fixed(between(0.3, 0.6), 2)}, flow 60 L/min`);
    }
    lines.push(`vitals    hr ${fixed(between(60, 110))}, rr ${fixed(Math.max(rate, between(14, 24)))}, spo2 ${fixed(between(92, 99))} %, temp ${fixed(between(36.2, 38.2), 1)} C, bp ${fixed(between(100, 140))}/${fixed(between(55, 85))}`);
    if (i % 2 === 0) lines.push(`vent      plateau ${fixed(between(peep + 8, peep + 14))}, peak ${fixed(between(peep + 16, peep + 21))}, map ${fixed(between(10, 16))}`);
    if (i % 3 === 0) {
      const paco2 = Math.round(between(36, 46));
      const hco3 = Math.round(between(22, 27) * 10) / 10;
      const ph = 6.1 + Math.log10(hco3 / (0.0307 * paco2));
      lines.push(`abg       ${fixed(ph, 2)}/${paco2}/${fixed(between(80, 120))}/${hco3}, lactate ${fixed(between(0.8, 2.2), 1)}`);
    }
    if (i % 24 === 6) lines.push(`labs      na ${fixed(between(135, 145))}, k ${fixed(between(3.6, 4.8), 1)}, cl ${fixed(between(98, 108))}, hco3 ${fixed(between(22, 27))}, albumin ${fixed(between(2.8, 3.8), 1)}, hb ${fixed(between(9, 13), 1)}`);
    lines.push(`note      ${REMARKS[i % REMARKS.length]}`);
    lines.push('');
  }
  // One flat string, as the command line reads a note from its file: `${lines.join('\n')}\n` made a
  // string of two parts (a ConsString), which V8 joins in place when first read and then reads
  // through one more step, so the bench would time a note no reader of files is given.
  lines.push('');
  return lines.join('\n');
}
