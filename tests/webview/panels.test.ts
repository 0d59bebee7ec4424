// The trend view's panels: which series each draws, the units on its axes and in its legend, as
// the points give them (the page converts nothing). Points are written by hand here; what the
// core gives for a note is tested in tests/core/trends.test.ts.
import { describe, expect, it } from 'vitest';
import { emptyMessage, legendName, legendText, PANELS, panelLayouts, PH_AXIS_SPAN, phAxisRange, seriesDash, timepointTable, toggleAfterRedraw, toggleName, xAxis } from '../../client/webview/panels';
import type { TrendPoint } from '../../server/src/protocol';

function point(values: TrendPoint['values'], line = 0): TrendPoint {
  return { timepoint: line, label: `line ${line + 1}`, line, minutes: null, values, carried: [] };
}

// A kPa note's gases: PaO2 7.9 and 8.3 kPa on FiO2 28 and 30 %, P/F 28.2 and 27.7 kPa (PaO2 ÷ FiO2).
const kpaPoints = [
  point({ pao2: { value: 7.9, unit: 'kPa' }, paco2: { value: 9.1, unit: 'kPa' }, ph: { value: 7.28, unit: 'pH' }, pf_ratio: { value: 28.21, unit: 'kPa' }, fio2: { value: 28, unit: '%' } }, 2),
  point({ pao2: { value: 8.3, unit: 'kPa' }, paco2: { value: 7.9, unit: 'kPa' }, ph: { value: 7.34, unit: 'pH' }, pf_ratio: { value: 27.67, unit: 'kPa' }, fio2: { value: 30, unit: '%' } }, 6),
];

describe('trend panels', () => {
  it('label the gas axes with the unit the points are in: kPa in a kPa note', () => {
    const [oxygenation, carbonDioxide, saturation] = panelLayouts(kpaPoints);
    expect(oxygenation).toMatchObject({ title: 'Oxygenation', name: 'Oxygenation (kPa)', leftLabel: 'kPa', rightLabel: null });
    expect(oxygenation?.series.map((s) => [s.label, s.unit])).toEqual([['PaO2', 'kPa'], ['P/F', 'kPa']]);
    expect(oxygenation?.columns).toEqual([[7.9, 8.3], [28.21, 27.67]]);
    expect(carbonDioxide).toMatchObject({ name: 'Carbon dioxide and pH (kPa, pH)', leftLabel: 'kPa', rightLabel: 'pH' });
    // FiO2 comes as a percentage and is drawn as given.
    expect(saturation).toMatchObject({ leftLabel: '%', columns: [[28, 30]] });
  });

  it('label them mmHg in an mmHg note, and leave out panels with nothing to draw', () => {
    const layouts = panelLayouts([point({ pao2: { value: 71, unit: 'mmHg' }, pf_ratio: { value: 177.5, unit: 'mmHg' } }), point({ peep: { value: 8, unit: 'cmH2O' } }, 3)]);
    expect(layouts.map((l) => [l.title, l.leftLabel, l.rightLabel])).toEqual([['Oxygenation', 'mmHg', null], ['Ventilator', 'cmH2O', null]]);
    // A point without the series has a gap.
    expect(layouts[0]?.columns).toEqual([[71, null], [177.5, null]]);
  });

  it('write legend values with their unit, pH without one', () => {
    expect(legendText(7.9, 'kPa')).toBe('7.9 kPa');
    expect(legendText(28.21, 'kPa')).toBe('28.2 kPa');
    expect(legendText(212, 'mmHg')).toBe('212 mmHg');
    expect(legendText(7.3, 'pH')).toBe('7.30');
    expect(legendText(28, '%')).toBe('28 %');
    // FiO2 0.28 as a percentage in floating point.
    expect(legendText(0.28 * 100, '%')).toBe('28 %');
    expect(legendText(211.6, 'mmHg')).toBe('211.6 mmHg');
    expect(legendText(null, 'kPa')).toBe('—');
  });
});

describe('series told apart without their colours', () => {
  it('draws the series of a panel solid, dashed and dotted, the dashes growing with the line (thicker in high contrast)', () => {
    expect([0, 1, 2].map((i) => seriesDash(i, 2))).toEqual([{ segments: [], border: 'solid' }, { segments: [8, 4], border: 'dashed' }, { segments: [2, 3], border: 'dotted' }]);
    expect(seriesDash(1, 3).segments).toEqual([12, 6]);
    // No panel has more series than there are kinds of line.
    expect(Math.max(...PANELS.map((p) => p.series.length))).toBeLessThanOrEqual(3);
  });
});

describe('when there is nothing to draw', () => {
  it('says the note has no timepoint yet', () => {
    expect(emptyMessage([])).toMatch(/^This note has no timepoints yet/);
  });

  it('says what the view draws when the timepoints have none of it (vital signs only), instead of an empty page', () => {
    const message = emptyMessage([point({}), point({}, 4)]);
    expect(message).toMatch(/^No values to plot yet: the trend view draws PaO2, P\/F, PaCO2, pH, SpO2, FiO2, PEEP, ΔP and Cstat/);
    expect(emptyMessage(kpaPoints)).toBeNull();
  });
});

describe('the legend\'s toggles', () => {
  it('are named by what pressing them does, with the label written under the chart in the name, one name per series', () => {
    const labels = PANELS.flatMap((p) => p.series.map((s) => s.label));
    const names = labels.map(toggleName);
    expect(toggleName('PaO2')).toBe('Show the PaO2 line');
    names.forEach((name, i) => expect(name).toContain(labels[i]));
    expect(new Set(names).size).toBe(names.length);
    expect(legendName('Oxygenation')).toBe('Lines shown in the Oxygenation chart');
  });

  it('keep the focus on the same series after a redraw, else on the first of its panel, else on the first drawn', () => {
    const layouts = panelLayouts(kpaPoints);
    expect(toggleAfterRedraw('pf_ratio', 'Oxygenation', layouts)).toBe('pf_ratio');
    // PaO2 gone from the note: P/F, the first series of the Oxygenation panel now.
    const noPao2 = panelLayouts(kpaPoints.map((p) => ({ ...p, values: { ...p.values, pao2: undefined } })));
    expect(toggleAfterRedraw('pao2', 'Oxygenation', noPao2)).toBe('pf_ratio');
    // The whole Ventilator panel gone: the first series drawn.
    expect(toggleAfterRedraw('peep', 'Ventilator', layouts)).toBe('pao2');
    expect(toggleAfterRedraw('peep', 'Ventilator', [])).toBeNull();
  });
});

describe('the table of values by timepoint', () => {
  it('has a row per timepoint with its line, and a column per plotted series with its unit', () => {
    const table = timepointTable(kpaPoints);
    expect(table.headings).toEqual(['PaO2 (kPa)', 'P/F (kPa)', 'PaCO2 (kPa)', 'pH', 'FiO2 (%)']);
    expect(table.rows).toEqual([
      { label: 'line 3', line: 2, cells: ['7.9', '28.2', '9.1', '7.28', '28'] },
      { label: 'line 7', line: 6, cells: ['8.3', '27.7', '7.9', '7.34', '30'] },
    ]);
  });

  it('marks a value that used a carried input, and a missing one with a dash', () => {
    const carried: TrendPoint = { ...point({ fio2: { value: 40, unit: '%' } }, 5), carried: ['fio2'] };
    const table = timepointTable([point({ pao2: { value: 80, unit: 'mmHg' } }, 1), carried]);
    expect(table.rows.map((r) => r.cells)).toEqual([['80', '—'], ['—', '40*']]);
  });
});

describe('the x axis', () => {
  const at = (minutes: (number | null)[]) => minutes.map((m, i): TrendPoint => ({ ...point({}, i), minutes: m }));

  it('is hours since day 1 00:00 when every timepoint has a time and the times never go back; two may share one', () => {
    expect(xAxis(at([480, 540, 540, 1500]))).toEqual({ xs: [8, 9, 9, 25], hours: true });
  });

  it('is the timepoint number when a time goes back (the chart needs its x values in order) or one is missing', () => {
    expect(xAxis(at([600, 540, 660]))).toEqual({ xs: [1, 2, 3], hours: false });
    expect(xAxis(at([600, null, 660]))).toEqual({ xs: [1, 2, 3], hours: false });
    expect(xAxis([])).toEqual({ xs: [], hours: false });
  });
});

describe('labels from the note', () => {
  it('are shown with characters that reorder or hide text escaped', () => {
    const table = timepointTable([{ ...point({ pao2: { value: 80, unit: 'mmHg' } }), label: 'a\u202Eexe.pdf \u2066x\u200by <b>' }]);
    expect(table.rows[0]?.label).toBe('a\\u{202E}exe.pdf \\u{2066}x\\u{200B}y <b>');
  });
});

describe('the pH axis', () => {
  it('is 0.2 of pH wide around one gas, or gases of nearly one pH, not 0 to 14', () => {
    expect(phAxisRange(7.3, 7.3)).toEqual([7.2, 7.4]);
    expect(phAxisRange(7.28, 7.34)).toEqual([7.21, 7.41]);
    expect(phAxisRange(6.95, 6.95)).toEqual([6.85, 7.05]);
    for (const [lo, hi] of [[7.3, 7.3], [7.28, 7.34], [7.01, 7.19]] as const) {
      const [a, b] = phAxisRange(lo, hi)!;
      expect(b - a).toBeCloseTo(PH_AXIS_SPAN, 10);
      expect(a).toBeLessThanOrEqual(lo);
      expect(b).toBeGreaterThanOrEqual(hi);
    }
  });

  it('is left to the chart where the values spread wider, or where there are none', () => {
    expect(phAxisRange(7.1, 7.45)).toBeNull();
    expect(phAxisRange(null, null)).toBeNull();
  });
});
