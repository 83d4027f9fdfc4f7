// What the scope tells the homeowner about each device, in everyday words: how it gets its power,
// what happens to it in a power cut and what the cable work looks like where it is. The rules'
// own reasons (classes, volts, loop resistance) stay beside these as the technical detail. Pure.
import type { CableAccess } from "./model/device";
import type { DeviceEvaluation, OutageDevice, PlugSpec } from "./rules";
import { formatLength, formatMinutes, formatNumber, type UnitSystem } from "./units";

/** Where a PoE device's port is, as the plan placed it. */
export interface PortSource {
  readonly name: string;
  readonly kind: "poe_switch" | "injector";
}

export interface PlainWordsInput {
  readonly evaluation: DeviceEvaluation;
  /** How the cable can reach the device, as the walk recorded it. */
  readonly cableAccess: CableAccess;
  /** It is in the network closet itself, beside the switches. */
  readonly inCloset: boolean;
  /** The switch or injector the plan put it on; null when it has no port (yet). */
  readonly port: PortSource | null;
  /** What the outage check says of it; absent when the plan has no battery backup at all. */
  readonly outage: OutageDevice | undefined;
  readonly units: UnitSystem;
}

function distance(d: DeviceEvaluation, units: UnitSystem): string | null {
  const m = d.outlet?.distanceM;
  return m === null || m === undefined ? null : formatLength(m, units);
}

/** "its 12 V round plug", "its USB-C socket": what a splitter's output goes into. */
function plugWords(plug: PlugSpec, volts: number): string {
  switch (plug.kind) {
    case "barrel": return `its ${formatNumber(volts)} V round power plug`;
    case "usb_c": return "its USB-C socket";
    case "micro_usb": return "its micro-USB socket";
    case "terminal": return `its ${formatNumber(volts)} V screw terminals`;
  }
}

/** How the device gets its power, in one or two sentences. */
function powerWords(p: PlainWordsInput): string[] {
  const d = p.evaluation;
  const away = distance(d, p.units);
  switch (d.recommendation) {
    case "poe":
      if (p.port === null) {
        return ["It is meant to get power and data over one network cable, but no PoE port is free for it yet (see the note below)."];
      }
      return [p.port.kind === "injector"
        ? `Power and data reach it over one network cable, from its own PoE injector "${p.port.name}", so it needs no outlet or adapter of its own.`
        : `Power and data reach it over one network cable from "${p.port.name}", so it needs no outlet or adapter of its own.`];
    case "poe_splitter": {
      const s = d.splitter!;
      const from = p.port === null ? "" : ` from "${p.port.name}"`;
      return [
        `A network cable${from} brings power and data to a small PoE splitter beside it, which feeds ${plugWords(s.plug, s.outputVolts)}.`,
        "Its own adapter is no longer needed.",
      ];
    }
    case "existing_outlet":
      switch (d.outlet?.via) {
        case "own_passive_injector":
          return [
            "It keeps its own power injector, plugged into an outlet in the network closet.",
            "That injector puts power on the cable all the time: never connect it, or the device's cable, to any other equipment.",
          ];
        case "transformer":
          return ["It keeps the transformer and the low-voltage wires already at it."];
        case "poe_injector":
          return [`A PoE injector plugged into the outlet ${away === null ? "nearby" : `${away} away`} powers it over a short network cable.`];
        case "plug":
          return [`It plugs into the outlet ${away === null ? "nearby" : `${away} away`}, as it does now.`];
        default:
          return [`It stays on its own adapter, in the outlet ${away === null ? "nearby" : `${away} away`}, as it does now.`];
      }
    case "new_outlet":
      if (d.outlet?.via === "transformer") {
        return ["A licensed electrician fits a new transformer for it: there are no low-voltage wires at it now."];
      }
      return [away === null
        ? "A licensed electrician puts in a new outlet beside it: no outlet was found near it."
        : `A licensed electrician puts in a new outlet beside it: the nearest outlet now is ${away} away.`];
    case "cannot_power":
      return ["As it was recorded, it cannot be powered: your installer settles how with you before any work starts (see the note below)."];
  }
}

/** What happens to it in a power cut. */
function outageWords(p: PlainWordsInput): string {
  const o = p.outage;
  const mustStayUp = p.evaluation.mustStayUp;
  if (o === undefined || !o.staysUp) {
    return mustStayUp
      ? "It should keep working in a power cut, but as planned it goes off (see the note below)."
      : "In a power cut it goes off until the power comes back.";
  }
  const time = o.minutes === null ? "" : ` for about ${formatMinutes(o.minutes)}`;
  return mustStayUp
    ? `In a power cut it keeps working on the battery backup${time}.`
    : `It also keeps working in a power cut, on the battery backup${time}.`;
}

const CABLE_WORK: Readonly<Record<CableAccess, string>> = {
  open_attic: "Its network cable comes down from the attic above.",
  drop_ceiling: "Its network cable runs above the drop ceiling.",
  unfinished_basement: "Its network cable comes up from the basement below.",
  finished_no_access: "The walls and ceilings here are finished, with no way above or below: expect a surface cable cover, or some patching and painting.",
  exterior: "Its network cable runs along the outside of the house, in cable made for outdoors.",
};

/**
 * The scope's plain words for one device: how it is powered, what a power cut does to it, and,
 * when a cable is to be run to it, how the cable gets there (or, for a new outlet in finished
 * walls, what that work leaves behind).
 */
export function plainWords(p: PlainWordsInput): string[] {
  const words = [...powerWords(p), outageWords(p)];
  const needsCable = p.evaluation.cable !== null || p.evaluation.recommendation === "poe" || p.evaluation.recommendation === "poe_splitter";
  if (needsCable) words.push(p.inCloset ? "It sits in the network closet, so its cable is a short one there." : CABLE_WORK[p.cableAccess]);
  else if (p.evaluation.recommendation === "new_outlet" && p.cableAccess === "finished_no_access") words.push(CABLE_WORK.finished_no_access);
  return words;
}
