/**
 * Analysis settings: the conventions a user may switch. Defaults are the conventions pinned
 * in grammar/README.md. The LSP server and the CLI validate user input with `settingsSchema`
 * before it reaches the core.
 */
import { z } from 'zod';

export const settingsSchema = z.object({
  /** Unit of gas pressures written without one, unless the note's `units` line says otherwise. */
  gasUnit: z.enum(['mmHg', 'kPa']).default('mmHg'),
  /** Respiratory quotient for the alveolar gas equation. */
  respiratoryQuotient: z.number().min(0.6).max(1.2).default(0.8),
  /** Alveolar gas equation form. */
  alveolarEquation: z.enum(['simplified', 'full']).default('simplified'),
  /** Barometric model used when only altitude is given. */
  barometricModel: z.enum(['west', 'standard']).default('west'),
  /**
   * Water vapour pressure in the inspired PO2: `fixed` is 47 mmHg (humidified at 37 °C) always;
   * `body-temperature` is the saturated vapour pressure at the temperature stated at that
   * timepoint, else 47 mmHg.
   */
  waterVapour: z.enum(['fixed', 'body-temperature']).default('fixed'),
  /** Age-based upper normal of the A–a gradient. */
  aaGradientRule: z.enum(['age-over-4-plus-4', 'age-plus-10-over-4', 'mellemgaard']).default('age-over-4-plus-4'),
  /** PaO2 below this (mmHg) reads as hypoxaemia. */
  hypoxaemiaBelowMmhg: z.number().min(20).max(100).default(60),
  /** PaCO2 above this (mmHg) reads as hypercapnia. */
  hypercapniaAboveMmhg: z.number().min(40).max(70).default(50),
  /** PaCO2 below this (mmHg) reads as hypocapnia. */
  hypocapniaBelowMmhg: z.number().min(15).max(40).default(35),
  /**
   * Hours a ventilator or oxygen setting (FiO2, oxygen device and flow, PEEP, EPAP, CPAP, mean airway pressure) may be
   * carried into a gas's derived values before PN326 reports it: 12 h, a shift (common practice, no source).
   */
  carriedSettingHours: z.number().min(1).max(168).default(12),
  /**
   * The SpO2 target applied to a note that writes none (`oxygen target 88-92`): `none` (the default:
   * no target unless the note writes one), or one of the ranges in use (BTS 2017: 94–98 % for most
   * acutely ill adults, 88–92 % at risk of hypercapnic respiratory failure; TSANZ 2015: 92–96 %; all three read in
   * December 2026, session 31: see the `spo2_target` field's bounds source).
   */
  spo2Target: z.enum(['none', '88-92', '92-96', '94-98']).default('none'),
  /** Hüfner constant for oxygen content (mL O2 per g Hb). */
  hufnerConstant: z.union([z.literal(1.34), z.literal(1.36), z.literal(1.39)]).default(1.34),
  /**
   * Privacy checks (PN501–PN507): warn where free text looks like a person's identifiers (names,
   * dates, phone, record numbers, e-mail, postal codes). `false` switches them all off.
   */
  privacyChecks: z.boolean().default(true),
  /** Checks switched off by code or alias. */
  disabledChecks: z.array(z.string().max(64)).max(200).default([]),
});

export type Settings = z.infer<typeof settingsSchema>;

export const DEFAULT_SETTINGS: Settings = settingsSchema.parse({});

/** Merges partial, already validated settings over the defaults. */
export function withDefaults(partial: Partial<Settings> = {}): Settings {
  return { ...DEFAULT_SETTINGS, ...partial };
}
