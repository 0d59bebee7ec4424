/**
 * The registry of derived values: an explicit list, in dependency order for display. To add
 * one, define it in its topic module with `defineDerived` and list it here; grammar/README.md
 * documents every id (formula and source), generated from this list.
 */
import type { Timepoint } from '../analysis/model';
import type { Settings } from '../settings';
import * as acidBase from './acid-base';
import * as atmosphere from './atmosphere';
import { DeriveContext, type DerivedDefinition } from './context';
import * as gas from './gas-exchange';
import { interpret } from './interpret';
import * as mech from './mechanics';
import type { DerivedValue, MissingValue, NotApplicable, TimepointDerivation } from './model';
import * as transport from './oxygen-transport';

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
  mech.minuteVentilation,
  mech.pbw,
  mech.vtPerKg,
  mech.drivingPressureDef,
  mech.complianceStaticDef,
  mech.complianceDynamicDef,
  mech.airwayResistanceDef,
  mech.mechanicalPower,
  mech.ventilatoryRatioDef,
  transport.cao2,
  transport.do2,
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

export function derivedDef(id: string): DerivedDefinition | undefined {
  return byId.get(id);
}

/** Whether a definition is worth reporting at this timepoint (an anchor input is stated here). */
function relevant(def: DerivedDefinition, tp: Timepoint): boolean {
  return def.anchors.some((id) => tp.values.get(id)?.origin.kind === 'here');
}

/**
 * Everything derived at one timepoint. A value is reported only where one of its anchor inputs
 * was stated at this timepoint (so a carried PEEP does not repeat a driving pressure at every
 * later timepoint); a missing input is named only then too.
 */
export function deriveTimepoint(tp: Timepoint, settings: Settings): TimepointDerivation {
  const ctx = new DeriveContext(tp, settings, byId);
  const derived: DerivedValue[] = [];
  const missing: MissingValue[] = [];
  const notApplicable: NotApplicable[] = [];
  for (const def of DERIVED) {
    if (!relevant(def, tp)) continue;
    const r = ctx.evaluate(def.id);
    if (!r) continue;
    if ('value' in r) derived.push(r);
    else if ('needs' in r) missing.push(r);
    else notApplicable.push(r);
  }
  return { timepoint: tp.index, derived, missing, notApplicable, interpretations: interpret(ctx, settings) };
}
