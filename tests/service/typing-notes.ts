// Invented notes, typed a keystroke at a time by tests/service/keystrokes.test.ts. Every person,
// place and time is made up.
export const TYPED_NOTES: Record<string, string> = {
  'ward review on oxygen': `patient   age 67 y, sex male, height 178 cm, weight 84 kg

@ day 1 09:40  ward review, breathless overnight
oxygen    cannula 3 L/min
vitals    hr 102, rr 26, spo2 93 %, temp 38.2 C, bp 132/78
abg       7.32/58/61/29
note      repeat gas in an hour
`,
  'gas by keys, then by slashes': `patient   age 54 y, height 162 cm, weight 70 kg

@ day 2 07:15  morning gas
oxygen    venturi, fio2 0.35
abg       ph 7.35, pco2 44, po2 72, hco3 24, be -1, lactate 1.8
@ +1h
abg       7.38/41/80/24.5
`,
  'ventilated, settings changed': `patient   age 61 y, sex female, height 160 cm, weight 77 kg

@ day 1 22:05  intubated in the unit
vent      mode VC, vt 400 mL, rate 18, peep 10, fio2 0.6, plateau 26, peak 31
abg       ph 7.28, pco2 52, po2 68, hco3 23
@ +2h  peep up
vent      peep 14, fio2 0.5
abg       7.31/49/84/24
`,
  'kPa note on NIV': `units     gas kPa
patient   age 73 y, sex female, height 155 cm, weight 51 kg

@ day 1 15:30
oxygen    niv ipap 16, epap 6, fio2 35 %
abg       7.29/8.4/9.1/30
vitals    spo2 90 %, rr 24
`,
  'child with a cold': `patient   age 6 y, height 118 cm, weight 21 kg

@ day 1 18:00  in the children's ward
vitals    hr 128, rr 32, spo2 94 %, temp 38.6 C
oxygen    mask 6 L/min
`,
  'timepoints with offsets and comments': `# overnight observations, invented
patient   age 80 y

@ day 1 23:00  settled
vitals    hr 88, rr 18, spo2 95 %   # asleep
@ +90m
vitals    hr 96, rr 22, spo2 91 %
@ +2h30m  more breathless
oxygen    cannula 2 L/min
vitals    spo2 94 %
`,
  'high altitude camp': `patient   age 35 y, height 181 cm, weight 76 kg
place     barometric 480 mmHg

@ day 3 06:10  at the upper camp
vitals    hr 110, rr 24, spo2 78 %
abg       ph 7.48, pco2 26, po2 38, hco3 19
`,
  'labs and a venous gas': `patient   age 47 y, sex male, weight 95 kg

@ day 1 11:20
vbg       ph 7.30, pco2 55
labs      na 139, k 5.2, cl 101, albumin 3.8, hb 13.4
vitals    temp 36.8 C, bp 150/92
`,
};
