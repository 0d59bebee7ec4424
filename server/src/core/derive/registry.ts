/**
 * The registry of derived values: an explicit list, in dependency order for display. To add
 * one, define it in its topic module with `defineDerived` and list it here; grammar/README.md
 * documents every id (formula and source), generated from this list.
 */
import type { Timepoint } from '../analysis/model';
import type { Settings } from '../settings';
import * as acidBase from './acid-base';
import * as atmosphere from './atmosphere';
import { DeriveContext, type DerivedDefinition, type DerivedTable } from './context';
import type { HighFlowHours } from './high-flow';
import * as gas from './gas-exchange';
import { interpret } from './interpret';
import * as mech from './mechanics';
import { withheldText, type DerivedValue, type Interpretation, type MissingValue, type NotApplicable, type TimepointDerivation } from './model';
import * as transport from './oxygen-transport';
import { NONE } from '../util/lists';

export const DERIVED: readonly DerivedDefinition[] = validateDerived([
  atmosphere.barometric,
  atmosphere.pio2,
  transport.fio2Estimated,
  gas.pao2Alveolar,
  gas.aaGradientDef,
  gas.aaGradientUpperNormalDef,
  gas.aToARatio,
  gas.pfRatioDef,
  gas.pfRatioAltitude,
  gas.sfRatioDef,
  gas.roxIndexDef,
  gas.oxygenationIndexDef,
  gas.oxygenSaturationIndexDef,
  acidBase.hco3Calculated,
  acidBase.hco3Gap,
  acidBase.anionGapDef,
  acidBase.anionGapCorrected,
  acidBase.deltaRatioDef,
  acidBase.paco2Expected,
  acidBase.hco3ExpectedAcute,
  acidBase.hco3ExpectedChronic,
  acidBase.standardBaseExcessDef,
  acidBase.standardBaseExcessVenousDef,
  mech.minuteVentilation,
  mech.pbw,
  mech.vtPerKg,
  mech.drivingPressureDef,
  mech.complianceStaticDef,
  mech.complianceDynamicDef,
  mech.airwayResistanceDef,
  mech.mechanicalPower,
  mech.mechanicalPowerSurrogateDef,
  mech.ventilatoryRatioDef,
  transport.cao2,
  transport.do2,
  transport.meanArterialPressureDef,
  gas.paco2Etco2DifferenceDef,
]);

function validateDerived(list: readonly DerivedDefinition[]): readonly DerivedDefinition[] {
  const ids = new Set<string>();
  for (const d of list) {
    if (!/^[a-z][a-z0-9]*(_[a-zA-Z0-9]+)*$/.test(d.id)) throw new Error(`derived id ${d.id} is not snake_case`);
    if (ids.has(d.id)) throw new Error(`duplicate derived id ${d.id}`);
    if (!d.source.trim()) throw new Error(`derived ${d.id} has no source`);
    ids.add(d.id);
  }
  return list;
}

const byId: ReadonlyMap<string, DerivedDefinition> = new Map(DERIVED.map((d) => [d.id, d]));
const TABLE: DerivedTable = { list: DERIVED, slots: new Map(DERIVED.map((d, i) => [d.id, i])) };

/**
 * Relevance masks: one bit per slot, in two 32-bit words (slots 0–31 in `lo`, 32–63 in `hi`), so
 * the bit operations stay on small integers.
 */
interface SlotMask {
  lo: number;
  hi: number;
}

function hasSlot(mask: SlotMask, slot: number): boolean {
  return slot < 32 ? (mask.lo & (1 << slot)) !== 0 : (mask.hi & (1 << (slot - 32))) !== 0;
}

/** For each field id, the mask of the slots of the definitions it anchors (a value is reported where an anchor is stated). */
const ANCHORED: ReadonlyMap<string, SlotMask> = (() => {
  if (DERIVED.length > 64) throw new Error('relevance masks hold 64 derived values (two 32-bit words); use a wider mask');
  const out = new Map<string, SlotMask>();
  DERIVED.forEach((d, slot) => {
    for (const id of d.anchors) {
      const m = out.get(id) ?? { lo: 0, hi: 0 };
      if (slot < 32) m.lo |= 1 << slot;
      else m.hi |= 1 << (slot - 32);
      out.set(id, m);
    }
  });
  return out;
})();

export function derivedDef(id: string): DerivedDefinition | undefined {
  return byId.get(id);
}

/**
 * The values a finding withholds (those of `list` with a `withheldBy`), grouped by why
 * (`withheldText`), each named by its short name, in the order met: one line or paragraph per
 * reason where `show` and the hovers name them.
 */
export function withheldByReason(list: readonly NotApplicable[]): Map<string, string[]> {
  const groups = new Map<string, string[]>();
  for (const n of list) {
    if (n.withheldBy === null) continue;
    const why = withheldText(n);
    const name = derivedDef(n.id)?.short ?? n.label;
    const names = groups.get(why);
    if (names) names.push(name);
    else groups.set(why, [name]);
  }
  return groups;
}

/**
 * Which definitions are worth reporting at this timepoint, as a bit mask of slots: those with an
 * anchor input stated here (in force with origin `here`). Read from the few values stated here
 * rather than by asking every definition about every anchor.
 */
function relevantSlots(tp: Timepoint, ctx: DeriveContext): SlotMask {
  const mask: SlotMask = { lo: 0, hi: 0 };
  for (const s of tp.stated) {
    const slots = ANCHORED.get(s.fieldId);
    if (slots === undefined || ((mask.lo & slots.lo) === slots.lo && (mask.hi & slots.hi) === slots.hi)) continue;
    if (ctx.statedHere(s.fieldId)) {
      mask.lo |= slots.lo;
      mask.hi |= slots.hi;
    }
  }
  return mask;
}

/** Whether one of the definition's anchor inputs is stated here (its bit in `relevantSlots`). */
function anchoredHere(def: DerivedDefinition, ctx: DeriveContext): boolean {
  for (const id of def.anchors) if (ctx.statedHere(id)) return true;
  return false;
}

/**
 * One derived value at a timepoint, when it is reported there (an anchor input is stated here)
 * and can be computed; the rest of the timepoint is not derived.
 */
export function derivedAt(tp: Timepoint, settings: Settings, id: string): DerivedValue | null {
  return new TimepointValues(tp, settings).value(id);
}

/**
 * Everything derived at one timepoint. A value is reported only where one of its anchor inputs
 * was stated at this timepoint (so a carried PEEP does not repeat a driving pressure at every
 * later timepoint); a missing input is named only then too.
 *
 * Computed on first read, part by part: a check that needs one value (`derivedValueOf`) or the
 * readings does not pay for the rest of the timepoint's values.
 */
class TimepointValues implements TimepointDerivation {
  private readonly ctx: DeriveContext;
  private relevant: SlotMask | null = null;
  private lists: { derived: DerivedValue[]; missing: MissingValue[]; notApplicable: NotApplicable[] } | null = null;
  private readings: readonly Interpretation[] | null = null;

  constructor(private readonly tp: Timepoint, private readonly settings: Settings, highFlowHours?: () => HighFlowHours | null) {
    this.ctx = new DeriveContext(tp, settings, TABLE, highFlowHours);
  }

  get timepoint(): number {
    return this.tp.index;
  }

  private mask(): SlotMask {
    return (this.relevant ??= relevantSlots(this.tp, this.ctx));
  }

  private all(): { derived: DerivedValue[]; missing: MissingValue[]; notApplicable: NotApplicable[] } {
    if (this.lists) return this.lists;
    const lists = { derived: [] as DerivedValue[], missing: [] as MissingValue[], notApplicable: [] as NotApplicable[] };
    const relevant = this.mask();
    for (let slot = 0; slot < DERIVED.length; slot++) {
      if (!hasSlot(relevant, slot)) continue;
      const r = this.ctx.evaluateSlot(slot);
      if (!r) continue;
      if ('value' in r) lists.derived.push(r);
      else if ('needs' in r) lists.missing.push(r);
      else lists.notApplicable.push(r);
    }
    this.lists = lists;
    return lists;
  }

  get derived(): readonly DerivedValue[] { return this.all().derived; }
  get missing(): readonly MissingValue[] { return this.all().missing; }
  get notApplicable(): readonly NotApplicable[] { return this.all().notApplicable; }

  get interpretations(): readonly Interpretation[] {
    return (this.readings ??= interpret(this.ctx, this.settings));
  }

  /** The value `id` when it is reported here (the same as finding it in `derived`). */
  value(id: string): DerivedValue | null {
    const slot = TABLE.slots.get(id);
    if (slot === undefined) return null;
    // Before the whole mask is made, only this definition's anchors are asked (a check that
    // reads one value does not pay for the relevance of every other): the same answer, as a slot's
    // bit is set exactly when one of its anchors is stated here.
    if (this.relevant !== null ? !hasSlot(this.relevant, slot) : !anchoredHere(TABLE.list[slot]!, this.ctx)) return null;
    const r = this.ctx.evaluateSlot(slot);
    return r && 'value' in r ? r : null;
  }

  /** The value `id` as the values here compute it, reported here or not (the VE inside a ventilatory ratio where no input of VE is stated). */
  computed(id: string): DerivedValue | null {
    return this.ctx.derivedValue(id);
  }
}

/** A derivation of the given values only (none by default): nothing missing, no readings. */
export function derivationOf(timepoint: number, derived: readonly DerivedValue[] = NONE): TimepointDerivation {
  return { timepoint, derived, missing: NONE, notApplicable: NONE, interpretations: NONE };
}

/** `highFlowHours`: the hours of high flow at `tp`, asked only where a value reads them (the timeline knows them: `HighFlowRuns`, worked out once per analysis). */
export function deriveTimepoint(tp: Timepoint, settings: Settings, highFlowHours?: () => HighFlowHours | null): TimepointDerivation {
  return new TimepointValues(tp, settings, highFlowHours);
}

/**
 * A derived value as computed at a timepoint, also where it is not reported there but is an input of
 * one that is (`computed`); a derivation of given values only has those.
 */
export function computedValueOf(derivation: TimepointDerivation, id: string): DerivedValue | null {
  if (derivation instanceof TimepointValues) return derivation.computed(id);
  return derivation.derived.find((d) => d.id === id) ?? null;
}

/** A derived value reported at a timepoint, without deriving the rest when the derivation allows it. */
export function derivedValueOf(derivation: TimepointDerivation, id: string): DerivedValue | null {
  if (derivation instanceof TimepointValues) return derivation.value(id);
  return derivation.derived.find((d) => d.id === id) ?? null;
}
