/**
 * How readings write gas pressures, in mmHg or kPa, with the decimals that keep each number on its
 * side of the thresholds it is read against: shared by the arterial readings (interpret.ts) and
 * the venous gas reading (venous.ts).
 */
import { sideOf } from '../physiology/numeric';
import { MMHG_PER_KPA } from '../physiology/units';
import { decimalsAgainst, formatAgainst, formatNumber, formatShort } from '../util/format';
import { KPA_DECIMALS, kpaFromMmhg } from '../present';

/**
 * How a reading writes gas pressures: in mmHg, or where the note's gas unit is kPa, in kPa first
 * with mmHg in brackets (`PaO2 7.9 kPa (59 mmHg)`), as hints and hovers do. Thresholds and ranges
 * are then in kPa. Every number takes the decimals that keep it on its side of the thresholds
 * it is read against (mmHg arguments; NaN: none).
 */
export class GasWords {
  constructor(readonly kpa: boolean) {}

  /** A pressure: `59 mmHg`, or `7.9 kPa (59 mmHg)`. */
  value(mmHg: number, t1 = NaN, t2 = NaN, t3 = NaN, kpaDecimals = KPA_DECIMALS): string {
    const inMmhg = `${formatAgainst(mmHg, 0, t1, t2, t3)} mmHg`;
    if (!this.kpa) return inMmhg;
    return `${formatAgainst(kpaFromMmhg(mmHg), kpaDecimals, kpaFromMmhg(t1), kpaFromMmhg(t2), kpaFromMmhg(t3))} kPa (${inMmhg})`;
  }

  /**
   * A measured pressure with the resolution it was written with (`writtenResolutionMmhg`): a
   * threshold it is on is not pushed apart from it by more decimals (6.7 kPa on 50 mmHg shows
   * as `6.7 kPa (50 mmHg)`, not `(50.3 mmHg)`).
   */
  measured(mmHg: number, resolution: number, t1 = NaN, t2 = NaN, t3 = NaN): string {
    return this.value(mmHg, offThreshold(mmHg, t1, resolution), offThreshold(mmHg, t2, resolution), offThreshold(mmHg, t3, resolution), kpaDecimalsOf(resolution));
  }

  /**
   * A threshold a value is on (`sideOf` gives 0): `60 mmHg`, or in kPa with the decimals the value
   * was written with, at least one (`8.0 kPa`, not the `7.999 kPa` that 60 mmHg is).
   */
  on(mmHg: number, resolution: number): string {
    if (!this.kpa) return `${formatShort(mmHg)} mmHg`;
    return `${formatNumber(kpaFromMmhg(mmHg), kpaDecimalsOf(resolution))} kPa`;
  }

  /** A threshold read against `value`: `60 mmHg`, or `8.0 kPa`. */
  threshold(mmHg: number, value = NaN): string {
    if (!this.kpa) return `${formatShort(mmHg)} mmHg`;
    return `${formatAgainst(kpaFromMmhg(mmHg), KPA_DECIMALS, kpaFromMmhg(value))} kPa`;
  }

  /** A limit read against `value`, with the decimals of the values it limits: `13 mmHg`, or `2.9 kPa`. */
  limit(mmHg: number, value = NaN): string {
    return this.kpa ? `${formatAgainst(kpaFromMmhg(mmHg), KPA_DECIMALS, kpaFromMmhg(value))} kPa` : `${formatAgainst(mmHg, 0, value)} mmHg`;
  }

  /**
   * A range with its unit, ends shown against a measured `observed`: `28.5–32.5 mmHg`, or
   * `3.8–4.3 kPa`. Each end takes the decimals that keep the value on its side, but an end the value
   * is on at the resolution it was written with (`sideOf` gives 0) is shown as the value is written,
   * not pushed apart from it (2.4 kPa on an end of 2.37 kPa: `1.8–2.4 kPa`, not `1.84–2.37 kPa`,
   * which would leave a value read as within the range outside it).
   */
  range(low: number, high: number, observed: number, resolution = 0): string {
    const d = this.rangeDecimals(low, high, observed, resolution);
    if (!this.kpa) return `${formatNumber(low, d)}–${formatNumber(high, d)} mmHg`;
    return `${formatNumber(kpaFromMmhg(low), d)}–${formatNumber(kpaFromMmhg(high), d)} kPa`;
  }

  /** The decimals of `range`'s ends (in the unit shown): see `range`. The derived expected PaCO2 shows its ends with them too. */
  rangeDecimals(low: number, high: number, observed: number, resolution: number): number {
    const kpa = this.kpa;
    // On an end at the resolution of a value written in kPa. A value written in mmHg (resolution 0)
    // is on an end only where it equals it on paper, and keeps it as a threshold: the end then
    // takes the decimals that show it equal (18.1 within 14.1–18.1 mmHg, not 14–18).
    const onLow = resolution > 0 && sideOf(observed, low, resolution) === 0;
    const onHigh = resolution > 0 && sideOf(observed, high, resolution) === 0;
    // In kPa, an end the value is on takes the decimals the value was written with.
    const base = !kpa ? 0 : onLow || onHigh ? kpaDecimalsOf(resolution) : KPA_DECIMALS;
    const at = (t: number) => (kpa ? kpaFromMmhg(t) : t);
    return Math.max(decimalsAgainst(at(low), base, onLow ? NaN : at(observed)), decimalsAgainst(at(high), base, onHigh ? NaN : at(observed)));
  }
}

/** A threshold a measured value is read against, or NaN (none) when the value is on it at its resolution. */
export function offThreshold(mmHg: number, t: number, resolution: number): number {
  return sideOf(mmHg, t, resolution) === 0 ? NaN : t;
}

/** The two ways readings write gas pressures, shared by every gas. */
export const GAS_MMHG = new GasWords(false);
export const GAS_KPA = new GasWords(true);

/** The kPa decimals a value was written with, from its resolution (`writtenResolutionMmhg`); at least one. */
export function kpaDecimalsOf(resolutionMmhg: number): number {
  if (!(resolutionMmhg > 0)) return KPA_DECIMALS;
  return Math.max(KPA_DECIMALS, Math.round(-Math.log10((2 * resolutionMmhg) / MMHG_PER_KPA)));
}
