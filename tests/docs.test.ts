// docs/checks.md is generated from the check registry; it must match what the generator writes.
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { renderCheckDocs } from '../server/src/core/checks/docs';
import { CHECKS, docAnchor } from '../server/src/core/checks/registry';
import { FIELD_TABLE_START, HYPHENS_RULE, renderFieldTable, replaceBetween, withGeneratedTables } from '../server/src/core/fields/docs';
import { FIELDS, fieldFor, isHyphenSpelling, keysInSection } from '../server/src/core/fields/registry';
import { SECTIONS } from '../server/src/core/fields/sections';
import { HB_MMOL_PER_L, UNITS } from '../server/src/core/fields/units';
import { checkNote } from '../server/src/core/check-note';
import { formatNote } from '../server/src/core/service';
import { COLUMNS_END, COLUMNS_START, renderColumnTable } from '../server/src/core/export/docs';
import { DERIVED } from '../server/src/core/derive/registry';
import { fixtureFiles } from './helpers/expectations';
import { parseProjectConfig, projectConfigSchema } from '../server/src/core/config';
import { HINT_CATEGORIES } from '../server/src/core/service/types';
import { renderSettingsTable, SETTINGS_END, SETTINGS_START } from '../server/src/core/settings-docs';
import { HELP } from '../server/src/cli/args';
import { isObservedField, observationCategory } from '../server/src/core/export/fhir';
import { AA_UPPER_NORMAL_NO_AGE_MMHG, LOW_NORMAL_PAO2_MMHG, LOW_PIO2_MMHG, SEVERE_HYPOXAEMIA_MMHG, UPPER_NORMAL_PACO2_MMHG } from '../server/src/core/derive/interpret';
import { HCO3_NORMAL_MMOL_L, PACO2_NORMAL_MMHG, PH_NORMAL } from '../server/src/core/physiology/acid-base';
import { DEFAULT_SETTINGS } from '../server/src/core/settings';

describe('check documentation', () => {
  it('is up to date with the registry (run `npm run docs` after changing a check)', () => {
    expect(readFileSync('docs/checks.md', 'utf8')).toBe(renderCheckDocs());
  });

  it('lists the checks in code order, so docs/checks.md and the settings list read PN101 to PN900 in turn', () => {
    // A check added to a range goes after the last of its range, not at the end of the list.
    const codes = CHECKS.map((c) => c.code);
    expect(codes).toEqual([...codes].sort());
    const headings = [...readFileSync('docs/checks.md', 'utf8').matchAll(/^#+ .*?(PN\d{3})/gm)].map((m) => m[1]);
    expect(headings).toEqual(codes);
  });

  it('grammar/README.md carries the current tables of blanks, of keys and units, and of derived values', () => {
    const doc = readFileSync('grammar/README.md', 'utf8');
    expect(doc).toContain(FIELD_TABLE_START);
    expect(doc).toContain('<!-- blanks:start');
    expect(doc).toContain('<!-- derived:start');
    expect(withGeneratedTables(doc)).toBe(doc);
  });

  it('grammar/README.md lists every spelling a note may write: units and the words of word fields', () => {
    const table = renderFieldTable().toLowerCase();
    for (const u of UNITS) for (const spelling of [u.id, ...u.aliases]) {
      if (u.id === '%sat') continue; // written as `%`, listed with the fraction's percentage
      if (u.id === HB_MMOL_PER_L && spelling === u.id) continue; // internal: haemoglobin's mmol/L is written `mmol/L`, listed
      expect(table, spelling).toContain(`\`${spelling.toLowerCase()}\``);
    }
    // A name joined by hyphens (`nasal-cannula`) is said by the rule, once, beside its field's words.
    for (const f of FIELDS) for (const word of Object.keys(f.words ?? {})) {
      if (isHyphenSpelling(word)) expect(table, word).toContain(HYPHENS_RULE.toLowerCase());
      else expect(table, word).toMatch(new RegExp(`(?:[:,]|\\(or) ${word}[,) |]`));
    }
  });

  it('the example note of grammar/README.md reads without a syntax, key or unit finding, and is in the formatter\'s layout', () => {
    const doc = readFileSync('grammar/README.md', 'utf8');
    const example = /```pneu\n([\s\S]*?)```/.exec(doc)?.[1];
    expect(example).toBeDefined();
    const findings = checkNote(example!).findings;
    expect(findings.filter((f) => f.code < 'PN300' || f.severity === 'error').map((f) => `${f.code} ${f.message}`)).toEqual([]);
    expect(formatNote(example!)).toBe(example);
  });

  it('README.md carries the current list of export columns', () => {
    const doc = readFileSync('README.md', 'utf8');
    expect(doc).toContain(COLUMNS_START);
    expect(replaceBetween(doc, COLUMNS_START, COLUMNS_END, renderColumnTable())).toBe(doc);
  });

  it('has a section per check at its anchor', () => {
    const text = renderCheckDocs();
    for (const c of CHECKS) expect(text).toContain(`<a id="${docAnchor(c)}"></a>`);
  });
});

describe('the table of derived values in grammar/README.md', () => {
  it('gives every formula a value is worked out with under the default settings (its Formula column)', () => {
    const documented = new Map(DERIVED.map((d) => [d.id, [d.formula, ...(d.otherFormulas ?? [])].join(' or ').replace(/[{}]/g, '')]));
    const notes = [
      ...fixtureFiles('tests/fixtures', 'samples').map((f) => f.text),
      '@ 08:00\noxygen room air\nabg 7.50/47/90/36', // metabolic alkalosis: its own expected PaCO2
      '@ 08:00\noxygen room air\nabg 7.21/24/95/9.5', // metabolic acidosis: Winters' formula
      '@ 08:00\noxygen mask 8 L/min\nvitals spo2 94', // a simple mask's estimated FiO2
      '@ 08:00\noxygen cannula 2 L/min\nvitals spo2 94',
      'place altitude 3000 m\n@ 08:00\noxygen room air\nabg 7.45/32/60/22', // PB from the altitude
      'place barometric 700 mmHg\n@ 08:00\noxygen room air\nabg 7.45/32/60/22', // PB as stated
      '@ 08:00\noxygen room air\nabg 7.40/40/90/24', // sea level assumed
    ];
    const undocumented = new Set<string>();
    for (const note of notes) {
      const { analysis } = checkNote(note);
      for (let i = 0; i < analysis.timeline.timepoints.length; i++) {
        for (const d of analysis.derivation(i).derived) if (!documented.get(d.id)!.includes(d.formula)) undocumented.add(`${d.id}: ${d.formula}`);
      }
    }
    expect([...undocumented]).toEqual([]);
  });
});

describe('the readings in grammar/README.md', () => {
  const doc = readFileSync('grammar/README.md', 'utf8');
  const bullet = (/- \*\*Readings\*\*([\s\S]*?)\n\n/.exec(doc)?.[1] ?? '').replace(/\s+/g, ' ');

  it('explain each wording of an oxygenation and a ventilation reading, with the numbers it is read against', () => {
    const gases = ['7.40/40/95/24.4', '7.40/40/70/24.4', '7.40/40/50/24.4', '7.40/40/35/24.4', '7.36/48/90/26.5', '7.25/68/70/29', '7.47/30/90/21.4'];
    const notes = [
      ...fixtureFiles('tests/fixtures', 'samples').map((f) => f.text),
      ...gases.map((gas) => `@ 08:00\noxygen room air\nabg ${gas}`),
      '@ 08:00\nvent mode VC, peep 8, fio2 0.6\nabg 7.38/42/90/24.3',
    ];
    const phrases = new Set<string>();
    for (const note of notes) {
      const { analysis } = checkNote(note);
      for (let i = 0; i < analysis.timeline.timepoints.length; i++) {
        for (const r of analysis.derivation(i).interpretations) {
          if (r.topic !== 'oxygenation' && r.topic !== 'ventilation') continue;
          const phrase = /consistent with (?:an? )?([^(,:.]+?)(?= \(|,|:|\.)/.exec(r.text)?.[1];
          if (phrase) phrases.add(phrase);
        }
      }
    }
    expect(phrases.size).toBeGreaterThanOrEqual(9);
    expect([...phrases].filter((p) => !bullet.includes(p))).toEqual([]);
    const limits = [SEVERE_HYPOXAEMIA_MMHG, LOW_NORMAL_PAO2_MMHG, UPPER_NORMAL_PACO2_MMHG, LOW_PIO2_MMHG, AA_UPPER_NORMAL_NO_AGE_MMHG, DEFAULT_SETTINGS.hypoxaemiaBelowMmhg, DEFAULT_SETTINGS.hypercapniaAboveMmhg, DEFAULT_SETTINGS.hypocapniaBelowMmhg];
    expect(limits.filter((n) => !bullet.includes(`${n} mmHg`))).toEqual([]);
    expect(bullet).toContain(`pH ${PH_NORMAL.low.toFixed(2)}–${PH_NORMAL.high.toFixed(2)}, PaCO2 ${PACO2_NORMAL_MMHG.low}–${PACO2_NORMAL_MMHG.high} mmHg, HCO3 ${HCO3_NORMAL_MMOL_L.low}–${HCO3_NORMAL_MMOL_L.high} mmol/L`);
  });
});

describe('the unit conversions the documents quote', () => {
  it('agree with 1 kPa = 7.50062 mmHg to the decimals shown (`27 mmHg = 3.6 kPa`, `84.0 kPa = 630 mmHg`)', () => {
    const decimals = (n: string) => n.split('.')[1]?.length ?? 0;
    const wrong: string[] = [];
    let seen = 0;
    for (const file of ['README.md', 'grammar/README.md', 'docs/checks.md']) {
      for (const m of readFileSync(file, 'utf8').matchAll(/(\d+(?:\.\d+)?) (mmHg|kPa) (?:=|is) (\d+(?:\.\d+)?) (mmHg|kPa)/g)) {
        const [text, from, fromUnit, to, toUnit] = m as unknown as [string, string, string, string, string];
        if (fromUnit === toUnit) continue;
        seen++;
        const converted = fromUnit === 'mmHg' ? Number(from) / 7.50062 : Number(from) * 7.50062;
        if (converted.toFixed(decimals(to)) !== to) wrong.push(`${file}: ${text} (${converted.toFixed(3)})`);
      }
    }
    expect(seen).toBeGreaterThan(3);
    expect(wrong).toEqual([]);
  });
});

describe('the command line in README.md', () => {
  it('names every command and every option its help lists', () => {
    const doc = readFileSync('README.md', 'utf8');
    const commands = Object.keys(HELP).filter((k) => k !== 'main');
    expect(commands.filter((c) => !doc.includes(`\`pneumark ${c}`))).toEqual([]);
    const options = [...new Set(Object.values(HELP).flatMap((text) => [...text.matchAll(/(?<![\w-])--[a-z][a-z-]*/g)].map((m) => m[0])))];
    expect(options.length).toBeGreaterThan(10);
    expect(options.filter((o) => !doc.includes(`\`${o}`))).toEqual([]);
  });
});

describe('the help of show', () => {
  it('names every kind of line show writes under a timepoint', async () => {
    const { renderShow } = await import('../server/src/cli/render-show');
    const { paint } = await import('../server/src/cli/colour');
    const notes = [
      ...fixtureFiles('tests/fixtures', 'samples').map((f) => f.text),
      // A child (n/a: no A–a normal, no PBW), a set rate of 0 (withheld), a carried setting.
      'patient age 8 y, sex male, height 120 cm\n@ 08:00\nvent mode VC, vt 200, rate 0, peep 5, fio2 0.4\n@ 09:00\nabg 7.40/40/80/24',
    ];
    const sectionWords = new Set(SECTIONS.flatMap((s) => [s.id, ...s.aliases]));
    const kinds = new Set<string>();
    for (const note of notes) {
      const shown = renderShow('note.pneu', checkNote(note), paint(false));
      const body = shown.slice(0, shown.indexOf('\nlegend\n'));
      for (const m of body.matchAll(/^ {2}(\S+) +\S/gm)) if (!sectionWords.has(m[1]!)) kinds.add(m[1]!);
    }
    expect([...kinds].sort()).toEqual(expect.arrayContaining(['carried', 'derived', 'missing', 'n/a', 'reading', 'withheld']));
    expect([...kinds].filter((k) => !new RegExp(`^ {2}${k.replace(/[/]/g, '\\/')} {2,}\\S`, 'm').test(HELP.show!))).toEqual([]);
  });
});

describe('the FHIR export in README.md', () => {
  const doc = readFileSync('README.md', 'utf8').replace(/\s+/g, ' ');
  const listAfter = (lead: string): string => (new RegExp(`${lead} \\(([^)]*)\\)`).exec(doc)?.[1] ?? '').toLowerCase();

  it('names every field exported without a LOINC code, and every one in the therapy category', () => {
    const observed = FIELDS.filter(isObservedField);
    const uncoded = listAfter('as are fields with no LOINC code in the registry');
    expect(uncoded.length).toBeGreaterThan(10);
    const noCode = observed.filter((f) => !f.loinc && !f.loincBySection && !f.loincByKey).map((f) => f.label);
    expect(noCode.filter((label) => !uncoded.includes(label.toLowerCase()))).toEqual([]);
    const therapy = listAfter('the settings');
    expect(therapy.length).toBeGreaterThan(10);
    const settings = observed.filter((f) => observationCategory(f) === 'therapy').map((f) => f.label);
    expect(settings.filter((label) => !therapy.includes(label.toLowerCase()))).toEqual([]);
  });
});

describe('the steps of DEVELOPERS.md', () => {
  const doc = readFileSync('DEVELOPERS.md', 'utf8');
  const section = (title: string): string => new RegExp(`## ${title}\\n([\\s\\S]*?)\\n## `).exec(doc)?.[1]?.replace(/\s+/g, ' ') ?? '';

  it('name every folder and module at the top of the core in the layout', () => {
    const layout = /```\nserver\/src\/core\/([\s\S]*?)\nserver\/src\/node\//.exec(doc)?.[1] ?? '';
    const entries = readdirSync('server/src/core', { withFileTypes: true }).map((e) => (e.isDirectory() ? `${e.name}/` : e.name));
    expect(entries.length).toBeGreaterThan(10);
    expect(entries.filter((e) => e !== 'index.ts' && !new RegExp(`(^|[\\s(\`])${e.replace(/\./g, '\\.')}`, 'm').test(layout))).toEqual([]);
  });

  it('for adding a check or a field name every place it is listed in, as the tests that compare them ask', () => {
    const steps = section('Adding a check');
    for (const place of ['`CHECKS` in `checks/registry.ts`', '`pneumark.disabledChecks` in package.json', '`enumDescriptions`', 'tests/vscode/manifest.test.ts', '`npm run docs`', 'tests/cli/golden.test.ts']) expect(steps, place).toContain(place);
    const field = section('Adding a field');
    for (const place of ['`FIELDS` in `server/src/core/fields/registry.ts`', '`ADDED_LATER`', 'tests/export/columns.test.ts', 'FHIR paragraph', '`npm run docs`']) expect(field, place).toContain(place);
    const manifest = readFileSync('tests/vscode/manifest.test.ts', 'utf8');
    expect(manifest).toContain("expect(items.enum).toEqual(CHECKS.flatMap((c) => [c.code, c.alias]));");
    expect(manifest).toContain('expect(items.enumDescriptions).toEqual(CHECKS.flatMap((c) => [c.title, `${c.code}: ${c.title}`]));');
  });
});

describe('the commands of the extension in README.md', () => {
  it('names each command package.json contributes by its title, the ones with a button in the title bar of a note, and the editor settings it sets', () => {
    const doc = readFileSync('README.md', 'utf8');
    const bullet = (/- commands under \*\*Pneumark:\*\*([\s\S]*?)\n- /.exec(doc)?.[1] ?? '').replace(/\s+/g, ' ');
    const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as { contributes: { commands: { command: string; title: string; category: string }[]; menus: Record<string, { command: string }[]> } };
    const { commands, menus } = manifest.contributes;
    expect(commands.length).toBeGreaterThan(4);
    expect(commands.filter((c) => c.category !== 'Pneumark' || !bullet.includes(`*${c.title}*`)).map((c) => c.title)).toEqual([]);
    const defaults = (JSON.parse(readFileSync('package.json', 'utf8')) as { contributes: { configurationDefaults: Record<string, Record<string, unknown>> } }).contributes.configurationDefaults;
    expect(Object.entries(defaults).flatMap(([scope, values]) => Object.entries(values).map(([k, v]) => `"${scope}": { "${k}": ${JSON.stringify(v)} }`)).filter((d) => !doc.replace(/\s+/g, ' ').includes(d))).toEqual([]);
    const inTitleBar = (menus['editor/title'] ?? []).map((m) => commands.find((c) => c.command === m.command)!.title);
    expect(inTitleBar.length).toBeGreaterThan(0);
    expect(inTitleBar.filter((title) => !new RegExp(`\\*${title.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\* \\([^)]*title bar`).test(bullet))).toEqual([]);
  });
});

describe('the settings in README.md', () => {
  const doc = readFileSync('README.md', 'utf8');
  const section = /### `pneumark\.config\.json`\n([\s\S]*?)\n## /.exec(doc)?.[1] ?? '';

  it('carry the current table of settings (run `npm run docs` after changing a setting)', () => {
    expect(section).toContain(SETTINGS_START);
    expect(replaceBetween(doc, SETTINGS_START, SETTINGS_END, renderSettingsTable())).toBe(doc);
  });

  it('name every key pneumark.config.json takes, each hint category, and every setting the extension contributes', () => {
    const keys = [...Object.keys(projectConfigSchema.shape).filter((k) => k !== 'hints'), ...HINT_CATEGORIES.map((c) => `hints.${c}`)];
    expect(keys.filter((k) => !section.includes(`\`${k}\``))).toEqual([]);
    const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as { contributes: { configuration: { properties: Record<string, unknown> } } };
    expect(Object.keys(manifest.contributes.configuration.properties).filter((name) => !section.includes(`\`${name}\``))).toEqual([]);
  });

  it('give the editor-only settings their default, range and choices', () => {
    const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as { contributes: { configuration: { properties: Record<string, { default: unknown; minimum?: number; maximum?: number; enum?: string[] }> } } };
    const p = manifest.contributes.configuration.properties;
    const text = section.replace(/\s+/g, ' ');
    const debounce = p['pneumark.debounceMs']!;
    expect(text).toContain(`\`pneumark.debounceMs\`, the milliseconds to wait after the last keystroke before a note is checked again (${String(debounce.default)} by default, ${String(debounce.minimum)} to ${String(debounce.maximum)})`);
    const pause = p['pneumark.typingPauseMs']!;
    expect(text).toContain(`\`pneumark.typingPauseMs\`, the milliseconds typing must pause before a new problem at the place being typed is shown (${String(pause.default)} by default, ${String(pause.minimum)} to ${String(pause.maximum)};`);
    const size = p['pneumark.maxNoteSizeKb']!;
    expect(text).toContain(`\`pneumark.maxNoteSizeKb\`, the size in KB above which a note is not checked (${String(size.default)} by default, ${String(size.minimum)} to ${String(size.maximum)};`);
    expect(doc.replace(/\s+/g, ' ')).toContain(`notes over \`pneumark.maxNoteSizeKb\` (counted in UTF-8 bytes; ${String(size.default)} by default, ${String(size.minimum)} to ${String(size.maximum)})`);
    expect(text).toContain(`\`pneumark.trace.server\` (${p['pneumark.trace.server']!.enum!.map((v, i, all) => `${i === all.length - 1 ? 'or ' : ''}\`${v}\``).join(', ').replace(', or', ' or')})`);
  });

  it('show an example pneumark.config.json that is valid', () => {
    const example = /```json\n([\s\S]*?)```/.exec(section)?.[1];
    expect(example).toBeDefined();
    expect(parseProjectConfig(example!).problems).toEqual([]);
  });
});

describe('what the documents show a note write gives what they say', () => {
  it('the documented example of every check raises that check (PN900, an internal error, has none to show)', () => {
    const silent = CHECKS.filter((c) => c.code !== 'PN900' && !checkNote(c.doc.example).findings.some((f) => f.code === c.code)).map((c) => `${c.code}: ${c.doc.example}`);
    expect(silent).toEqual([]);
  });

  it('the documented example of a check raises no other error or warning, so a reader learns the one check it shows', () => {
    // PN326's example once had a plateau of 24 cmH2O with PEEP 5, so it warned of a driving
    // pressure of 19 cmH2O (PN405) beside the old setting it was written to show. Readings
    // (information) may go with an example; errors and warnings of other checks are a distraction.
    const noisy = CHECKS.filter((c) => c.code !== 'PN900').flatMap((c) => {
      const others = checkNote(c.doc.example).findings.filter((f) => f.code !== c.code && f.severity !== 'information' && f.severity !== 'hint');
      return others.length === 0 ? [] : [`${c.code}: also ${[...new Set(others.map((f) => f.code))].join(' ')}`];
    });
    expect(noisy).toEqual([]);
  });

  it("the note lines a check's fix quotes (`oxygen niv epap 6, fio2 0.5`) give no finding of the format, units or plausibility", () => {
    const sectionWords = new Set(SECTIONS.flatMap((s) => [s.id, ...s.aliases]));
    const lines = CHECKS.flatMap((c) => [...c.doc.fix.matchAll(/`([^`\n]+)`/g)].map((m) => ({ code: c.code, line: m[1]! })))
      .filter(({ line }) => /\s/.test(line) && (/^@ (?:day \d|\d|\+)/.test(line) || sectionWords.has(line.split(/\s/)[0]!.toLowerCase())));
    expect(lines.length).toBeGreaterThan(10);
    const noisy = lines.map(({ code, line }) => ({ code, line, found: checkNote(line.startsWith('@') ? line : `@ 08:00\n${line}`).findings.filter((f) => f.code < 'PN400').map((f) => f.code) }))
      .filter((x) => x.found.length > 0).map((x) => `${x.code}: ${x.line} gives ${x.found.join(' ')}`);
    expect(noisy).toEqual([]);
  });

  it('grammar/README.md lists the prefixes of every snippet in grammar/snippets.json, and no other', () => {
    const doc = readFileSync('grammar/README.md', 'utf8');
    const bullet = /- Snippets \(prefixes\): ([\s\S]*?)\.\n/.exec(doc)?.[1] ?? '';
    const listed = bullet.split(/,\s*/).map((group) => [...group.matchAll(/`([^`]+)`/g)].map((m) => m[1]!));
    const snippets = JSON.parse(readFileSync('grammar/snippets.json', 'utf8')) as Record<string, { prefix: string | string[] }>;
    const prefixes = Object.values(snippets).map((s) => [s.prefix].flat());
    expect(listed).toEqual(prefixes);
  });

  it('the EBNF of grammar/README.md names the sections, the words of a note line and the devices the registries know', () => {
    const doc = readFileSync('grammar/README.md', 'utf8');
    const ebnf = /```ebnf\n([\s\S]*?)```/.exec(doc)?.[1] ?? '';
    const quoted = (rule: string): string[] => {
      const body = new RegExp(`^${rule}\\s+=([\\s\\S]*?);`, 'm').exec(ebnf)?.[1] ?? '';
      return [...body.replace(/\(\*[\s\S]*?\*\)/g, '').matchAll(/"([^"]+)"/g)].map((m) => m[1]!);
    };
    const note = SECTIONS.find((s) => s.kind === 'prose')!;
    expect(quoted('note-word')).toEqual([note.id, ...note.aliases]);
    expect(quoted('section')).toEqual(SECTIONS.filter((s) => s.kind !== 'prose').map((s) => s.id));
    const devices = Object.keys(FIELDS.find((f) => f.id === 'device')!.words ?? {});
    const listed = quoted('device');
    expect(listed.length).toBeGreaterThan(5);
    expect(listed.filter((d) => !devices.includes(d))).toEqual([]);
    const spellings = UNITS.flatMap((u) => [u.id, ...u.aliases]);
    const units = quoted('unit');
    expect(units.length).toBeGreaterThan(5);
    expect(units.filter((u) => !spellings.includes(u))).toEqual([]);
  });
});

/**
 * The note lines grammar/README.md quotes in its prose, with the findings (codes below PN400: the
 * readings are not what these examples are about) the text says they give. A line quoted as a key
 * and its value runs on the first section that has the key, or on the line given. Every quoted
 * line must be here, so a new example is checked too.
 */
const SPEC_LINES: Readonly<Record<string, readonly string[] | { readonly on: string; readonly codes: readonly string[] }>> = {
  'vitals hr 80, rr 18.': ['PN105'],
  // A tidal volume per kg of PBW: not read without a height and sex; read (423 mL) with them; impossible per kg.
  'vt 6 mL/kg': ['PN325'],
  'VT 423 mL (6 mL/kg)': { on: '@ 08:00\npatient age 60, sex male, height 175 cm\nvent vt 6 mL/kg', codes: [] },
  'vt 450 mL/kg': ['PN325'],
  '@ 08:00.': ['PN105'],
  '@ day 2.': ['PN105'],
  '@ +2h.': ['PN105'],
  '@ 08:00 arrived.': [],
  '@ 08:00, arrival': [],
  // The canonical layout's own examples, as the formatter writes them.
  'vitals    hr 80, rr 18': [],
  '@ day 1 07:40  arrival': [],
  'abg 7.28/56/71/26, be -2': [],
  'vent mode HFOV, rate 5 Hz, mpaw 25, amplitude 60, fio2 0.6': [],
  'oxygen niv ipap 18, epap 6': [],
  'oxygen cpap 8': [],
  // The SpO2 target: a range joined by a hyphen or an en dash; a slash or a reversed range is not read.
  'target 88-92': [],
  'oxygen cannula 2 L/min, target 88-92': [],
  'target 88/92': ['PN102'],
  'target 92-88': ['PN301'],
  'target 88-92 %': [],
  'target 92': ['PN102'],
  // Blanks around the dash read the same; a sign after it does not; a decimal end is read and reported (PN302).
  'target 88 - 92': [],
  'target 88 – 92 %': [],
  'target 88 -92': [],
  'target 88 - -92': ['PN102', 'PN105', 'PN105'],
  'target 88.5-92': ['PN302'],
  'oxygen target 88-92': [],
  'oxygen target 94-98': [],
  'oxygen venturi 8': [],
  'oxygen mask, epap 6': ['PN318'],
  'oxygen epap 6, level 8': ['PN318'],
  '@ +2h30': [],
  '@ +2h 30m': ['PN104'],
  '@ day 2 0800': ['PN104'],
  // The 12-hour clock: reported where the 24-hour clock reads another time, read where it reads the same.
  '@ 9:00 pm': ['PN104'],
  '@ 10:15pm': ['PN104'],
  '@ 12:30 am': ['PN104'],
  '@ 8:00 am': [],
  '@ 12:15 pm': [],
  'vent peak 15, ve 8': [],
  'vent vt 480, peak 16': [],
  'vent vt 480, flow 40': [],
  'vent vt 450, rate 14': [],
  'mode SIMV PC': { on: 'vent mode SIMV PC, peep 5', codes: ['PN201'] },
  // Set or measured, by mode: a tidal volume under PS is of its timepoint only (no finding says so).
  'vent mode PS, ps 10, peep 8, vt 380': [],
  'vent vt 450': [],
  'vent mode PS, ps 10': [],
  'hr 80': [],
  'hr 118 rr 26': [],
  'hr 118, rr 26': [],
  'hr 80 / 90': ['PN105', 'PN105'],
  // A number with a unit and no key: one finding, the key offered where one key of the section alone takes the unit.
  'oxygen 4 L/min': ['PN105'],
  'vent 450 mL': ['PN105'],
  'flow 4 L/min': [],
  'vent 5 cmH2O': ['PN105', 'PN201'],
  // On a vitals line L/min is the cardiac output's alone, but more likely an oxygen flow: the oxygen line offered first.
  'vitals 4 L/min': ['PN105'],
  'oxygen flow 4 L/min': [],
  'hr 88 120': ['PN105'],
  'mode VC.': ['PN105'],
  'hr 80. rr 18': ['PN202'],
  'hr 80,, rr 18': ['PN105'],
  'bp 120/80 (93)': [],
  // A snippet's placeholder left unfilled: one PN102 over the key, the placeholder and its unit.
  'vt <VT> mL': ['PN102'],
  'bp 120/80 mmHg (93)': [],
  'bp 120/80 (93 mmHg)': [],
  'bp 120/80, map 93': [],
  'bp 120/80(93)': [],
  'bp 120/80mmHg(93)': [],
  'bp 120/80 mm Hg(93)': [],
  'map 12 kPa': ['PN203'],
  'bp 120/80 (93': ['PN105'],
  'bp 120/80 (93)x': ['PN105'],
  'hr 80 (93)': ['PN105'],
  'bp 120/80, (93)': ['PN105'],
  'hr 80(93)': ['PN202'],
  'bp 120': ['PN102'],
  'bp 120/80/60': ['PN102'],
  'hr 80/90': ['PN102'],
  'height 5 ft 10 in': ['PN105'],
  // A bare height or weight: an adult's size where no age says otherwise, a child's under 18 years.
  'height 70': ['PN204'],
  'patient age 8 mo, height 70, weight 8': [],
  'height 0.72': { on: 'patient age 8 mo\n@ 08:00\npatient height 0.72', codes: ['PN204'] },
  // An infant's length from a floor that rises with age (46 cm at 8 months): a bare number offered inches only where they make it one.
  'height 25': { on: 'patient age 8 mo\n@ 08:00\npatient height 25', codes: ['PN204'] },
  'height 10': { on: 'patient age 8 mo\n@ 08:00\npatient height 10', codes: ['PN301'] },
  // An age in years, months, weeks or days.
  'age 64 y': [],
  'age 8 mo': [],
  'age 6 weeks': [],
  'age 3 d': [],
  'altitude 1,650 m': ['PN103'],
  'vt 1,000': ['PN103'],
  'ph 7,352': ['PN103'],
  'hr 1,000': ['PN103', 'PN302'],
  'mode HFOV': [],
  'rate 5': { on: 'vent mode HFOV, rate 5', codes: ['PN302'] },
  'rate 14 Hz': { on: 'vent mode VC, rate 14 Hz', codes: ['PN302'] },
  'mode PS': [],
  'mode CPAP': [],
  'pinsp 18': [],
  'gas mmHg': [],
  'gas kPa': [],
  'vt 450 L': ['PN301'],
  'vt 5 L': ['PN301'],
  'pco2 40 ph 7.4': [],
  'fio2 28': { on: 'vent fio2 28', codes: [] },
  'fio2 28 %': { on: 'oxygen venturi fio2 28 %', codes: [] },
  'oxygen venturi 28, fio2 0.28': [],
  'fio2 0.28': { on: 'oxygen venturi 28, fio2 0.28', codes: [] },
  'fio2 0.3': { on: 'oxygen venturi 28, fio2 0.3', codes: [] },
  'oxygen venturi 28, fio2 0.35': ['PN206'],
  'oxygen hfnc 60 %': ['PN323'],
  'oxygen hfnc 40 L/min 60 %': ['PN323'],
  'oxygen hfnc, 40 L/min': ['PN105'],
  'oxygen mask, 8 L/min': ['PN105'],
  'oxygen hfnc 40 L/min, 60 %': ['PN105'],
  // Two lines of one timepoint: the quoted line checked with the line the text puts beside it.
  'oxygen venturi 28': { on: 'oxygen venturi 28\noxygen fio2 0.28', codes: [] },
  'oxygen fio2 0.28': { on: 'oxygen fio2 0.28\noxygen venturi 28', codes: [] },
  'oxygen fio2 0.35': { on: 'oxygen venturi 28\noxygen fio2 0.35', codes: ['PN206'] },
  'vent mode VC, vt 450, rate 14, peep 5, fio2 0.35': { on: 'oxygen venturi 28\nvent mode VC, vt 450, rate 14, peep 5, fio2 0.35', codes: ['PN311', 'PN321'] },
  'oxygen venturi 8 L/min 28 %': [],
  'oxygen venturi 28 % 8 L/min': [],
  'oxygen venturi 8 L/min 28': ['PN105'],
  'oxygen venturi 28 8 L/min': ['PN321'],
  'oxygen venturi 0.28 8 L/min': [],
  'oxygen venturi 28 8': ['PN105', 'PN321'],
  'mode NIV': [],
  'mode bilevel': [],
  'vent mode NIV, ipap 16, epap 5, fio2 0.4': ['PN201', 'PN201'],
  'oxygen niv ipap 16, epap 5, fio2 0.4': [],
  'vent cpap 8': ['PN201'],
  'vent epap 6': ['PN201'],
  'vent peep 6': [],
  'vent mode CPAP': [],
  'vent mode CPAP, peep 8': [],
  'oxygen mask 10 L/min 40 %': ['PN105'],
  'oxygen cannula 2 L/min 28%': ['PN105'],
  'fio2 40 %': { on: 'oxygen mask 10 L/min fio2 40 %', codes: [] },
  'fio2 60 %': { on: 'oxygen hfnc fio2 60 %', codes: [] },
  'oxygen nasal 28 %': ['PN203'],
  'spo2 0.94': ['PN302'],
  'po2 9.1': ['PN204'],
  // A later oxygen line without a device: it updates the therapy in force (or replaces it), with no finding.
  'oxygen hfnc 50 L/min, fio2 0.6': [],
  'oxygen fio2 0.4': { on: '@ 08:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 10:00\noxygen fio2 0.4', codes: [] },
  'oxygen niv ipap 14, epap 6': [],
  'oxygen ipap 16': { on: '@ 08:00\noxygen niv ipap 14, epap 6\n@ 10:00\noxygen ipap 16', codes: [] },
  'oxygen fio2 0.3': { on: '@ 08:00\noxygen cannula 2\n@ 10:00\noxygen fio2 0.3', codes: [] },
  'oxygen ipap 14, epap 6': { on: '@ 08:00\noxygen cannula 2\n@ 10:00\noxygen ipap 14, epap 6', codes: [] },
  'oxygen canula, flow 3': ['PN201'],
  // The same at one timepoint: a second line without a device updates the first (a setting on both is PN206).
  'oxygen hfnc 50 L/min': [],
  'oxygen fio2 0.6': { on: '@ 08:00\noxygen hfnc 50 L/min\noxygen fio2 0.6', codes: [] },
  'oxygen ipap 16, epap 8': { on: '@ 08:00\noxygen ipap 14, epap 6\n@ 10:00\noxygen ipap 16, epap 8\noxygen fio2 0.4', codes: [] },
  'oxygen cannula 2': [],
  'oxygen flow 3': { on: '@ 08:00\noxygen cannula 2\noxygen flow 3', codes: ['PN206'] },
  // Under NIV a vent line of the support's readings: the measured volume is asked for there only.
  'vent peak 16': { on: '@ 08:00\noxygen niv ipap 14, epap 6, fio2 0.4\nvent peak 16', codes: [] },
  // The device in force named again at its timepoint continues that therapy: nothing is stated twice.
  'oxygen niv fio2 0.4': { on: '@ 08:00\noxygen niv ipap 14, epap 6\noxygen niv fio2 0.4', codes: [] },
  // Vent lines of one timepoint: the later updates the settings.
  'vent mode PC, pinsp 20, peep 8': [],
  'vent fio2 0.5': { on: '@ 08:00\nvent mode PC, pinsp 20, peep 8\nvent fio2 0.5', codes: [] },
  // NIV or CPAP by its pressures alone, updated as the device named would be.
  'oxygen level 8': [],
  'oxygen level 10': { on: '@ 08:00\noxygen level 8\n@ 10:00\noxygen level 10', codes: [] },
};
/** Quoted shapes rather than lines: placeholders, or a section word named in a sentence. */
const SPEC_TEMPLATES = new Set(['@ day N HH:MM', '@ HH:MM', '@ day N', 'units gas']);

describe('set or measured, by mode, in grammar/README.md', () => {
  it('a tidal volume measured under PS is not carried: what rests on it at a later timepoint asks for the one measured there', () => {
    const doc = readFileSync('grammar/README.md', 'utf8').replace(/\s+/g, ' ');
    expect(doc).toContain('after `vent mode PS, ps 10, peep 8, vt 380` at 09:00, a gas at 10:00 has no tidal volume, and what rests on one and is worked out there (the ventilatory ratio of the gas; minute ventilation and static compliance where a rate or a plateau is written there too, and under PC the dynamic compliance where a peak is) asks for `the measured vt at this timepoint`');
    const asking = (later: string): string[] => {
      const { analysis } = checkNote(`patient age 50, sex male, height 175 cm\n@ 09:00\nvent mode PS, ps 10, peep 8, vt 380\n@ 10:00\n${later}`);
      return analysis.derivation(1).missing.filter((m) => m.needs.includes('the measured vt at this timepoint')).map((m) => m.id);
    };
    expect(asking('abg 7.40/40/90/24')).toEqual(['ventilatory_ratio']);
    // Not the dynamic compliance: under PS it is not worked out (the patient's own effort moves the volume).
    expect(asking('vitals rr 20\nvent plateau 22, peak 25\nabg 7.40/40/90/24')).toEqual(['minute_ventilation', 'compliance_static', 'ventilatory_ratio']);
  });
});

describe('the note lines quoted in grammar/README.md', () => {
  const doc = readFileSync('grammar/README.md', 'utf8');
  const sectionWords = new Set(SECTIONS.flatMap((s) => [s.id, ...s.aliases]));
  const keys = new Set(FIELDS.flatMap((f) => f.aliases));
  const quoted = [...new Set([...doc.matchAll(/`([^`\n]+)`/g)].map((m) => m[1]!))].filter((span) => {
    if (!/\s/.test(span) && !span.startsWith('@ ')) return false;
    // The first word whole: keys hold digits (`fio2 28`, `po2 9.1`).
    const first = span.split(/[\s(]/)[0]!.toLowerCase();
    return span.startsWith('@ ') || sectionWords.has(first) || keys.has(first);
  });
  const lineOf = (example: string): string => {
    const entry = SPEC_LINES[example];
    if (entry && 'on' in entry) return entry.on;
    const first = example.split(/[\s(]/)[0]!.toLowerCase();
    if (example.startsWith('@') || sectionWords.has(first)) return example;
    const section = SECTIONS.find((s) => s.kind !== 'prose' && keysInSection(s.id).includes(first));
    return `${section?.id ?? '?'} ${example}`;
  };
  const codesOf = (line: string): string[] => checkNote(line.startsWith('@') ? line : `@ 08:00\n${line}`).findings.filter((f) => f.code < 'PN400').map((f) => f.code).sort();

  it('are each listed here with what the text says they give (add a new one to SPEC_LINES)', () => {
    expect(quoted.length).toBeGreaterThan(40);
    expect(quoted.filter((q) => !(q in SPEC_LINES) && !SPEC_TEMPLATES.has(q))).toEqual([]);
    expect(Object.keys(SPEC_LINES).filter((k) => !quoted.includes(k)), 'an example no longer in the spec').toEqual([]);
  });

  it('give the findings the text says', () => {
    const wrong = Object.entries(SPEC_LINES).flatMap(([example, entry]) => {
      const want = [...('codes' in entry ? entry.codes : entry)].sort();
      const got = codesOf(lineOf(example));
      return JSON.stringify(got) === JSON.stringify(want) ? [] : [`${lineOf(example)}: ${got.join(' ') || 'nothing'}, not ${want.join(' ') || 'nothing'}`];
    });
    expect(wrong).toEqual([]);
  });

  it('read as the lines the text says they read as', () => {
    const read = (line: string) => {
      const t = checkNote(`@ 08:00\n${line}`).analysis.timeline.timepoints[0]!;
      return ['bp', 'map', 'hr', 'rr'].map((key) => fieldFor('vitals', key)!.id).map((id) => {
        const s = t.values.get(id)?.stated;
        return s ? `${id} ${String(s.value ?? s.parts?.join('/'))} ${String(s.usable)}` : `${id} none`;
      });
    };
    const mean = read('vitals bp 120/80, map 93');
    expect(mean.slice(0, 2)).toEqual(['bp 120/80 true', expect.stringMatching(/ 93 true$/)]);
    for (const written of ['bp 120/80 (93)', 'bp 120/80 mmHg (93)', 'bp 120/80 (93 mmHg)', 'bp 120/80(93)', 'bp 120/80mmHg(93)', 'bp 120/80 mm Hg(93)', 'bp 120/80 ( 93 )']) {
      expect(read(`vitals ${written}`), written).toEqual(mean);
    }
    expect(read('vitals hr 118 rr 26')).toEqual(read('vitals hr 118, rr 26'));
    expect(read('vitals hr 80, rr 18.')).toEqual(read('vitals hr 80, rr 18'));
    // `fio2 28` is 0.28; in `pco2 40 ph 7.4`, `ph` is the next key.
    const stated = (line: string, id: string) => checkNote(`@ 08:00\n${line}`).analysis.timeline.timepoints[0]!.values.get(id)?.stated?.value;
    expect(stated('vent fio2 28', 'fio2')).toBe(0.28);
    expect([stated('abg pco2 40 ph 7.4', 'paco2'), stated('abg pco2 40 ph 7.4', 'ph')]).toEqual([40, 7.4]);
  });
});

/**
 * What the README shows of an output, read from the reviewed goldens of the sample notes
 * (tests/golden, which tests/cli/golden.test.ts compares with what the command line writes), so an
 * excerpt cannot drift from the output it quotes.
 */
describe('the outputs README.md shows', () => {
  const doc = readFileSync('README.md', 'utf8');
  const ANY = Symbol('abridged');
  /** The JSON of a `jsonc` example, its comments dropped and what it abridges (`...`, `[ ... ]`, `{ ... }`) made a wildcard. */
  const parseExample = (text: string): unknown => JSON.parse(
    text.replace(/\s\/\/.*$/gm, '').replace(/\[ \.\.\. \]|\{ \.\.\. \}|"\.\.\."/g, '"<abridged>"').replace(/,\s*\.\.\.,/g, ','),
    (_key, value: unknown) => (value === '<abridged>' ? ANY : value),
  );
  const decimals = (n: number): number => String(n).split('.')[1]?.length ?? 0;
  /** Where `shown` differs from `actual`: every member shown is there, in the output's order, with the value shown (a number as rounded); a list shows some of its entries. */
  const differences = (shown: unknown, actual: unknown, at: string): string[] => {
    if (shown === ANY) return [];
    if (typeof shown === 'number') return typeof actual === 'number' && Number(actual.toFixed(decimals(shown))) === shown ? [] : [`${at}: ${String(actual)}, not ${shown}`];
    if (Array.isArray(shown)) {
      if (!Array.isArray(actual)) return [`${at}: not a list`];
      return shown.flatMap((entry, i) => {
        if (actual.some((a) => differences(entry, a, at).length === 0)) return [];
        // Told against the entry of the same first member (its code, index, field or id) where there is one.
        const [key, value] = entry !== null && typeof entry === 'object' ? Object.entries(entry)[0] ?? [] : [];
        const like: unknown = actual.find((a: Record<string, unknown>) => key !== undefined && a?.[key] === value);
        return like === undefined ? [`${at}[${i}]: no entry like it`] : differences(entry, like, `${at}[${i}]`);
      });
    }
    if (shown !== null && typeof shown === 'object') {
      if (actual === null || typeof actual !== 'object' || Array.isArray(actual)) return [`${at}: not an object`];
      const order = Object.keys(actual);
      const keys = Object.keys(shown);
      const missing = keys.filter((k) => !order.includes(k)).map((k) => `${at}.${k}: not in the output`);
      const present = keys.filter((k) => order.includes(k));
      const sorted = [...present].sort((a, b) => order.indexOf(a) - order.indexOf(b));
      const misordered = present.join() === sorted.join() ? [] : [`${at}: members in the order ${sorted.join(', ')}, not ${present.join(', ')}`];
      return [...missing, ...misordered, ...present.flatMap((k) => differences((shown as Record<string, unknown>)[k], (actual as Record<string, unknown>)[k], `${at}.${k}`))];
    }
    return shown === actual ? [] : [`${at}: ${JSON.stringify(actual)}, not ${JSON.stringify(shown)}`];
  };

  it('the JSON examples, version 1, findings alone and version 2, are what `check --format json` writes for samples/broken-note.pneu', () => {
    const examples = [...doc.matchAll(/```jsonc\n([\s\S]*?)```/g)].map((m) => parseExample(m[1]!) as { pneumark: number; detail?: string });
    expect(examples.map((e) => `${e.pneumark}${e.detail === undefined ? '' : ` ${e.detail}`}`)).toEqual(['1', '1 findings', '2']);
    const golden = (e: { pneumark: number; detail?: string }): unknown => JSON.parse(readFileSync(`tests/golden/broken-note.check${e.detail === 'findings' ? '-findings' : e.pneumark === 1 ? '' : '-v2'}.json`, 'utf8'));
    expect(examples.flatMap((e) => differences(e, golden(e), `version ${e.pneumark}${e.detail === undefined ? '' : `, ${e.detail}`}`))).toEqual([]);
  });

  it("the demo note's legend quoted is part of what `npm start` shows", () => {
    const excerpt = /Part of the demo\s+note's legend:\n\n\s*```text\n([\s\S]*?)```/.exec(doc)?.[1] ?? '';
    const lines = excerpt.split('\n').map((l) => l.trim()).filter(Boolean);
    expect(lines[0]).toBe('legend');
    expect(lines.length).toBeGreaterThan(3);
    const shown = readFileSync('tests/golden/summit-hut-evacuation.show.txt', 'utf8').split('\n').map((l) => l.trim());
    expect(readFileSync('package.json', 'utf8')).toContain('node dist/cli.js show samples/summit-hut-evacuation.pneu');
    expect(lines.filter((l) => !shown.includes(l))).toEqual([]);
  });
});
