// The extension's contributions in package.json, against what the code does with them: every
// setting is read by the server with the same type, range, choices and default; every command is
// registered, in the palette under Pneumark:, and offered only where it can do something.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { DERIVED } from '../../server/src/core/derive/registry';
import { HINT_PICKS } from '../../server/src/core/service/hints';
import { HINT_CATEGORIES, HINTS_OFF_BY_DEFAULT } from '../../server/src/core/service/types';
import { DEFAULT_SETTINGS, settingsSchema } from '../../server/src/core/settings';
import { clientSettingsSchema, DEFAULT_CLIENT_SETTINGS, readClientSettings } from '../../server/src/server/settings';

interface Property {
  type: string;
  default: unknown;
  scope?: string;
  enum?: unknown[];
  enumDescriptions?: string[];
  minimum?: number;
  maximum?: number;
  description?: string;
  markdownDescription?: string;
}
const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as {
  contributes: {
    commands: { command: string; title: string; category: string; enablement?: string }[];
    menus: Record<string, { command: string; when?: string }[]>;
    configuration: { properties: Record<string, Property> };
  };
};
const properties = manifest.contributes.configuration.properties;
const extensionSource = ['client/src/extension.ts'].map((f) => readFileSync(f, 'utf8')).join('\n');

/** The setting's schema on the server, by its name in VS Code. */
function serverSchema(name: string): z.ZodType | 'client' | null {
  const key = name.replace(/^pneumark\./, '');
  if (key in settingsSchema.shape) return settingsSchema.shape[key as keyof typeof settingsSchema.shape].unwrap() as z.ZodType;
  if (key === 'debounceMs' || key === 'typingPauseMs' || key === 'maxNoteSizeKb') return clientSettingsSchema.shape[key].unwrap() as z.ZodType;
  if (key.startsWith('hints.') && (HINT_CATEGORIES as readonly string[]).includes(key.slice(6))) return z.boolean();
  // Read by the language client itself (vscode-languageclient reads `<id>.trace.server`).
  if (key === 'trace.server') return 'client';
  return null;
}

/** `{ "gasUnit": "kPa" }` from `pneumark.gasUnit`, `{ hints: { mechanics: false } }` from `pneumark.hints.mechanics`. */
function asSection(name: string, value: unknown): Record<string, unknown> {
  const key = name.replace(/^pneumark\./, '');
  return key.startsWith('hints.') ? { hints: { [key.slice(6)]: value } } : { [key]: value };
}

describe('the contributed settings', () => {
  it('are each read by the server or the language client', () => {
    for (const name of Object.keys(properties)) expect(serverSchema(name), name).not.toBeNull();
    // And every setting the server reads is contributed.
    for (const key of [...Object.keys(settingsSchema.shape), 'debounceMs', 'typingPauseMs', 'maxNoteSizeKb', ...HINT_CATEGORIES.map((c) => `hints.${c}`)]) expect(properties[`pneumark.${key}`], key).toBeDefined();
  });

  it('have the server\'s defaults, choices and ranges', () => {
    for (const [name, p] of Object.entries(properties)) {
      const schema = serverSchema(name);
      if (schema === 'client' || schema === null) continue;
      const key = name.replace(/^pneumark\./, '');
      const serverDefault = key.startsWith('hints.') ? key !== 'hints.transport'
        : key in DEFAULT_SETTINGS ? DEFAULT_SETTINGS[key as keyof typeof DEFAULT_SETTINGS]
          : DEFAULT_CLIENT_SETTINGS[key as 'debounceMs' | 'typingPauseMs' | 'maxNoteSizeKb'];
      expect(p.default, name).toEqual(serverDefault);
      expect(schema.safeParse(p.default).success, name).toBe(true);
      for (const choice of p.enum ?? []) expect(schema.safeParse(choice).success, `${name}: ${String(choice)}`).toBe(true);
      if (p.minimum !== undefined) {
        expect(schema.safeParse(p.minimum).success, name).toBe(true);
        expect(schema.safeParse(p.minimum - 0.01).success, name).toBe(false);
      }
      if (p.maximum !== undefined) {
        expect(schema.safeParse(p.maximum).success, name).toBe(true);
        expect(schema.safeParse(p.maximum + 0.01).success, name).toBe(false);
      }
      // The value as VS Code sends it (a nested section) is taken by the server without a problem.
      expect(readClientSettings(asSection(name, p.default)).problem, name).toBeNull();
    }
  });

  it('each say what they do in words, with a description for every choice', () => {
    for (const [name, p] of Object.entries(properties)) {
      const text = p.markdownDescription ?? p.description ?? '';
      expect(text.length, name).toBeGreaterThan(30);
      expect(p.description !== undefined && p.markdownDescription !== undefined, `${name} has two descriptions`).toBe(false);
      if (p.enum) expect(p.enumDescriptions?.length, name).toBe(p.enum.length);
      expect(p.scope, name).toMatch(/^(resource|window)$/);
    }
    // Each hint category names every value its hints show (by the derived value's label), and
    // whether it is off by default.
    for (const c of HINT_CATEGORIES) {
      const text = (properties[`pneumark.hints.${c}`]?.description ?? '').toLowerCase();
      const unnamed = HINT_PICKS[c].map((p) => DERIVED.find((d) => d.id === p.id)!.label).filter((label) => !text.includes(label.toLowerCase()));
      expect(unnamed, c).toEqual([]);
      expect(text.includes('off by default'), c).toBe(HINTS_OFF_BY_DEFAULT.has(c));
    }
    // A number with a range says it, as the settings editor shows no range until a value is out of it.
    for (const [name, p] of Object.entries(properties)) {
      if (p.minimum === undefined || p.maximum === undefined) continue;
      expect(p.markdownDescription ?? p.description, name).toContain(`${p.minimum} to ${p.maximum}`);
    }
    // The size limit says how a note is measured, and that a note over it is not formatted either.
    expect(properties['pneumark.maxNoteSizeKb']?.description).toMatch(/1 KB = 1024 bytes of UTF-8 text/);
    expect(properties['pneumark.maxNoteSizeKb']?.description).toMatch(/neither checked nor formatted/);
    // Thresholds are in mmHg whatever the note's unit: they say so, with the kPa value.
    expect(properties['pneumark.hypoxaemiaBelowMmhg']?.markdownDescription).toMatch(/in mmHg, also for notes written in kPa \(60 mmHg is 8\.0 kPa\)/);
  });
});

describe('the contributed commands', () => {
  const commands = manifest.contributes.commands;

  it('are each registered by the extension and listed under Pneumark:', () => {
    for (const c of commands) {
      expect(c.category, c.command).toBe('Pneumark');
      expect(extensionSource, c.command).toContain(`registerCommand('${c.command}'`);
    }
    for (const [, id] of extensionSource.matchAll(/registerCommand\('([^']+)'/g)) expect(commands.map((c) => c.command)).toContain(id);
  });

  it('that change a note are offered only in a Pneumark note that can be changed', () => {
    const palette = new Map(manifest.contributes.menus['commandPalette']?.map((m) => [m.command, m.when]));
    for (const id of ['pneumark.convertNoteUnits', 'pneumark.insertTimepoint']) {
      expect(commands.find((c) => c.command === id)?.enablement, id).toBe('editorLangId == pneumark && !editorReadonly');
      expect(palette.get(id), id).toBe('editorLangId == pneumark && !editorReadonly');
    }
  });
});

describe('activation', () => {
  it('activates for a note and for a trend view restored after a reload, whose serializer activation registers', () => {
    // A window reloaded with only the trend view open opens no note, so the language alone never
    // woke the extension up: VS Code had no serializer to hand the view to and it stayed blank
    // (tests/e2e, 'comes back alone with its note's trends after a reload with the note closed').
    // VS Code (1.100) derives no activation event from a serializer, which has no contribution
    // point: the view asks for `onWebviewPanel:<viewType>` when it is restored, and only an
    // extension that lists it is woken up.
    const { activationEvents } = JSON.parse(readFileSync('package.json', 'utf8')) as { activationEvents: string[] };
    const viewType = /export const TREND_VIEW_TYPE = '([^']+)'/.exec(readFileSync('client/src/trend-view.ts', 'utf8'))?.[1];
    expect(viewType).toBe('pneumark.trends');
    expect(activationEvents).toEqual(['onLanguage:pneumark', `onWebviewPanel:${viewType}`]);
    expect(extensionSource).toContain('registerWebviewPanelSerializer(TREND_VIEW_TYPE');
  });
});

describe('pneumark.disabledChecks in the settings editor', () => {
  it('offers exactly the registry\'s codes and aliases, each described, so a misspelt check is flagged where it is typed', async () => {
    const { CHECKS } = await import('../../server/src/core/checks/registry');
    const items = (properties['pneumark.disabledChecks'] as Property & { items: { enum: string[]; enumDescriptions: string[] } }).items;
    // When a check is added, list its code and alias here in package.json (in registry order), with descriptions.
    expect(items.enum).toEqual(CHECKS.flatMap((c) => [c.code, c.alias]));
    expect(items.enumDescriptions).toEqual(CHECKS.flatMap((c) => [c.title, `${c.code}: ${c.title}`]));
  });
});
