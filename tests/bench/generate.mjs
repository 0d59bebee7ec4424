// Generates invented notes for benchmarks: realistic timepoints, no real data.
export function generateNote(timepoints, seed = 1) {
  let s = seed;
  const rand = () => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
  const pick = (lo, hi, d = 0) => (lo + rand() * (hi - lo)).toFixed(d);
  const lines = ['# generated benchmark note (invented values)', 'patient   age 61 y, sex male, height 176 cm, weight 80 kg', 'place     altitude 300 m', ''];
  for (let i = 0; i < timepoints; i++) {
    const day = 1 + Math.floor(i / 24);
    const hour = String(i % 24).padStart(2, '0');
    lines.push(`@ day ${day} ${hour}:00  round ${i + 1}`);
    if (i % 5 === 0) lines.push(`vent      mode VC, vt ${pick(380, 520)} mL, rate ${pick(14, 26)}, peep ${pick(5, 14)}, fio2 ${pick(0.3, 0.8, 2)}, flow 60 L/min`);
    lines.push(`vitals    hr ${pick(60, 120)}, rr ${pick(12, 30)}, spo2 ${pick(88, 99)} %, temp ${pick(36, 39, 1)} C`);
    lines.push(`vent      plateau ${pick(18, 28)}, peak ${pick(29, 36)}, map ${pick(10, 20)}`);
    lines.push(`abg       ${pick(7.3, 7.45, 2)}/${pick(35, 50)}/${pick(60, 110)}/${pick(22, 27, 1)}`);
  }
  return lines.join('\n') + '\n';
}
