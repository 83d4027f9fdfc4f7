import { POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import { MAX_PD_POWER_W, POE_TYPES } from '../standards/poe-types';
import { formatLength, formatNumber, formatPercent, formatWatts, type UnitSystem } from '../units';
import { deliveredReason } from './cable-run';
import { DeferredList } from './deferred-text';
import type { CableRunEvaluation, PoePlan, SplitterPlan } from './result-types';

/**
 * The plain-language reasons of a device result, written when they are first read.
 * The device rules (recommend-device) decide; this module only puts the decision into words,
 * from facts copied out of the device and the site settings, and the figures the rules worked out.
 */

/** Which branch of the decision policy the device took. */
export type ReasonPath =
  | 'poe_too_much' // native PoE, needs more than PoE delivers
  | 'poe_failed' // native PoE, the run cannot carry it
  | 'poe' // native PoE
  | 'passive' // passive PoE, own injector at the closet
  | 'mains_near' // AC plug or AC terminals, outlet or wires at the device
  | 'mains_new' // AC plug or AC terminals, needs a new outlet
  | 'adapter_near' // adapter device near an outlet, indoors, not critical
  | 'splitter' // adapter device on PoE + splitter
  | 'adapter_outlet' // adapter device keeps its outlet (PoE did not fit or was not needed)
  | 'adapter_new'; // adapter device needs a new outlet

/** Why a splitter cannot power an adapter device: fixed words, or a figure to put into words. */
export type NoPoe =
  | { readonly kind: 'words'; readonly words: string }
  | { readonly kind: 'no_usb_supply' } // the device's need is above every USB level
  | { readonly kind: 'splitter_draw'; readonly inputW: number }; // the splitter would draw too much

const NATIVE_POE_REASON = 'It takes power over its network cable (PoE), so it needs no outlet or adapter.';
const NATIVE_POE_STAYS_UP = 'It must keep working in a power cut: it will, as long as its switch is on the battery backup.';
const NATIVE_POE_CLOSER = 'A small PoE switch closer to it, or a shorter or thicker copper cable, would make it work.';
/** A run longer than a channel: thicker cable does not help, only a shorter channel does. */
const NATIVE_POE_TOO_LONG = 'A small PoE switch closer to it, or a shorter route, would make it work: no cable may be longer than a network channel, however thick.';
const SPLITTER_STAYS_UP = 'It must keep working in a power cut, so it takes power over its network cable from the battery-backed switch rather than from an outlet.';
const SPLITTER_OUTDOOR = 'It is outdoors: low-voltage power over its network cable avoids relying on an outdoor mains outlet.';
const PASSIVE_STAYS_UP = 'To keep it up in a power cut, plug its injector into an outlet on the battery backup.';
const MAINS_STAYS_UP = 'It runs on mains power, so it stays up in a power cut only if its supply is on a battery backup.';
const NEW_OUTLET_STAYS_UP = 'It must keep working in a power cut: put the new outlet on a circuit fed by a battery backup, or it will go down.';

function portText(c: PoeClass): string {
  const t = POE_CLASSES[c].minType;
  return `${POE_TYPES[t].standardName}${t >= 3 ? ` Type ${t}` : ''}`;
}
const CLASS_PORT_REASON: readonly string[] = POE_CLASSES.map((c) =>
  `It is Class ${c.poeClass}: the switch port must be ${portText(c.poeClass)} and sets aside ${formatWatts(c.psePowerW)} for it.`);

function capitalize(s: string): string {
  return s.length === 0 ? s : s[0].toUpperCase() + s.slice(1);
}

function outletDistanceText(distanceM: number | undefined, u: UnitSystem): string {
  return distanceM === undefined ? 'no outlet is known nearby' : `the nearest outlet is ${formatLength(distanceM, u)} away`;
}

function newOutletReason(why: string): string {
  return `It needs a new outlet: ${why}. Installing an outlet is mains work for a licensed electrician.`;
}

/**
 * What the words of one device's reasons need, copied out of the device and the settings when
 * the result is built (so later edits to the input cannot change the words of a result).
 */
export interface DeviceFacts {
  readonly units: UnitSystem;
  /** The device's own need (W), unrounded. */
  readonly needW: number;
  readonly mustStayUp: boolean;
  readonly outdoor: boolean;
  readonly outletDistanceM: number | undefined;
  /** The outlet is within the near-outlet distance. */
  readonly near: boolean;
  /** The voltage of its input (passive PoE, terminals), else 0. */
  readonly inputVolts: number;
  /** It takes AC on screw terminals (a doorbell transformer). */
  readonly transformer: boolean;
}

export class DeviceReasons extends DeferredList<string> {
  constructor(
    private readonly path: ReasonPath,
    private readonly facts: DeviceFacts,
    /** The run checked for PoE whose reason comes first ("Over 55 m of Cat 6 …"), or null. */
    private readonly poeCable: CableRunEvaluation | null,
    /** The port class (native PoE). */
    private readonly poeClass: PoeClass | null,
    /** The port plan and the splitter (splitter path). */
    private readonly plan: PoePlan | null,
    private readonly splitter: SplitterPlan | null,
    /** Why PoE does not work (poe_failed, adapter_outlet, adapter_new). */
    private readonly noPoe: NoPoe | null,
  ) {
    super();
  }

  protected write(into: string[]): void {
    const f = this.facts;
    const u = f.units;
    const mustStayUp = f.mustStayUp;
    const distanceM = f.outletDistanceM;
    if (this.poeCable !== null) {
      const r = deliveredReason(this.poeCable, u);
      if (r !== null) into.push(r);
    }
    switch (this.path) {
      case 'poe_too_much':
        into.push(`It needs ${formatWatts(f.needW)}, more than PoE can deliver to a device (${formatWatts(MAX_PD_POWER_W)}, 802.3bt Type 4), and it takes power only over its network cable.`);
        return;
      case 'poe_failed':
        into.push(`It takes power only over its network cable, but ${this.whyNoPoe()}.`, this.poeCable !== null && !this.poeCable.withinChannel ? NATIVE_POE_TOO_LONG : NATIVE_POE_CLOSER);
        return;
      case 'poe':
        into.push(NATIVE_POE_REASON, CLASS_PORT_REASON[this.poeClass!]);
        if (mustStayUp) into.push(NATIVE_POE_STAYS_UP);
        return;
      case 'passive': {
        const v = formatNumber(f.inputVolts);
        into.push(`It uses passive PoE at ${v} V: the voltage is always on its cable, with no safety check. A standard PoE switch cannot power it, and its injector must never be connected to other gear.`);
        into.push(`Power it from its own documented ${v} V injector (or an adapter its maker documents), plugged into an outlet at the closet.`);
        if (mustStayUp) into.push(PASSIVE_STAYS_UP);
        return;
      }
      case 'mains_near':
        if (mustStayUp) into.push(MAINS_STAYS_UP);
        into.push(f.transformer
          ? `It takes ${formatNumber(f.inputVolts)} V AC from the low-voltage wires already at it: keep that transformer (it should give at least 16 V and 30 VA).`
          : `It plugs into mains power, and ${outletDistanceText(distanceM, u)}.`);
        return;
      case 'mains_new':
        if (mustStayUp) into.push(MAINS_STAYS_UP);
        into.push(newOutletReason(f.transformer
          ? `it takes ${formatNumber(f.inputVolts)} V AC from a doorbell transformer, which a PoE splitter cannot provide, and there is no transformer wiring at it`
          : `it plugs into mains power and ${outletDistanceText(distanceM, u)}`));
        return;
      case 'adapter_near':
        into.push(`${capitalize(outletDistanceText(distanceM, u))}, so it can keep using its own adapter.`);
        return;
      case 'splitter': {
        const s = this.splitter!;
        const plan = this.plan!;
        if (mustStayUp) into.push(SPLITTER_STAYS_UP);
        else if (f.outdoor && f.near) into.push(SPLITTER_OUTDOOR);
        else into.push(`${capitalize(outletDistanceText(distanceM, u))}, so power over its network cable saves new mains wiring.`);
        // The figure it needs, and the stock rating the plan buys when that is higher (the label shows the rating).
        const rating = s.ratingAmps > s.minAmps ? ` (a ${formatNumber(s.ratingAmps)} A splitter)` : '';
        into.push(`A PoE splitter next to it turns the cable's power into ${formatNumber(s.outputVolts)} V at ${formatNumber(s.minAmps)} A or more${rating} to match its input (${s.plug.label}${s.usbLevel ? `; the ${s.usbLevel} power level` : ''}).`);
        into.push(`The splitter wastes about ${formatPercent(1 - s.efficiency)} in conversion, so it draws ${formatWatts(s.inputW)}: the switch port must be Class ${plan.poeClass} (${plan.standard}${plan.poeType >= 3 ? ` Type ${plan.poeType}` : ''}) and sets aside ${formatWatts(plan.reservedW)}.`);
        return;
      }
      case 'adapter_outlet':
        if (mustStayUp) {
          into.push(`It must keep working in a power cut, but it cannot run on PoE here (${this.whyNoPoe()}): it stays up only if its outlet is on a battery backup.`);
        }
        into.push(`${capitalize(outletDistanceText(distanceM, u))}, so it can keep using its own adapter.`);
        return;
      case 'adapter_new':
        if (mustStayUp) into.push(NEW_OUTLET_STAYS_UP);
        into.push(newOutletReason(`${outletDistanceText(distanceM, u)} and it cannot run on PoE here (${this.whyNoPoe() || 'no PoE path'})`));
        return;
    }
  }

  private whyNoPoe(): string {
    const n = this.noPoe;
    if (n === null) return '';
    switch (n.kind) {
      case 'words':
        return n.words;
      case 'no_usb_supply':
        return `it needs ${formatWatts(this.facts.needW)}, more than any USB supply gives`;
      case 'splitter_draw':
        return `a splitter would draw ${formatWatts(n.inputW)}, more than PoE can deliver (${formatWatts(MAX_PD_POWER_W)})`;
    }
  }
}
