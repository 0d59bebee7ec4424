// Generates invented notes for benchmarks: realistic timepoints with self-consistent gases.
// No real data: every value is drawn from a seeded generator.
export function generateNote(timepoints, seed = 1) {
  let s = seed;
  const rand = () => (s = (s * 1103515245 + 12345) % 2147483648) / 2147483648;
  const between = (lo, hi) => lo + rand() * (hi - lo);
  const fixed = (v, d = 0) => v.toFixed(d);
  const lines = ['# generated benchmark note (invented values)', 'patient   age 61 y, sex male, height 176 cm, weight 80 kg', 'place     altitude 300 m', ''];
  for (let i = 0; i < timepoints; i++) {
    const day = 1 + Math.floor(i / 24);
    lines.push(`@ day ${day} ${String(i % 24).padStart(2, '0')}:00  round ${i + 1}`);
    if (i % 5 === 0) lines.push(`vent      mode VC, vt ${fixed(between(380, 520))} mL, rate ${fixed(between(14, 26))}, peep ${fixed(between(5, 12))}, fio2 ${fixed(between(0.3, 0.8), 2)}, flow 60 L/min`);
    lines.push(`vitals    hr ${fixed(between(60, 120))}, rr ${fixed(between(12, 30))}, spo2 ${fixed(between(88, 99))} %, temp ${fixed(between(36, 39), 1)} C`);
    const peep = 12;
    lines.push(`vent      plateau ${fixed(between(peep + 6, peep + 14))}, peak ${fixed(between(peep + 16, peep + 22))}, map ${fixed(between(10, 20))}`);
    const paco2 = Math.round(between(35, 55));
    const hco3 = Math.round(between(20, 30) * 10) / 10;
    const ph = 6.1 + Math.log10(hco3 / (0.0307 * paco2));
    lines.push(`abg       ${fixed(ph, 2)}/${paco2}/${fixed(between(60, 110))}/${hco3}`);
  }
  return `${lines.join('\n')}\n`;
}
