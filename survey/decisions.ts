// Designer decisions: how a designer overrides the rules for one device, and how the evaluation
// follows. Pure, shared by the desk (its form errors) and the server (validation and the plan).
//
// How a decision changes the evaluation:
// - The device keeps what was captured (its need, input, run, must-stay-up). Its result is
//   worked out again for the method the designer chose, with the same rule pieces the
//   recommendation uses: `attemptPoe` (port class, cable loss, the run's PoE checks) for the
//   PoE methods, `sizeSplitter` for a splitter, the data-only cable checks for outlets.
// - So the device counts as what was decided everywhere after it: a PoE method gives it a PoE
//   port plan (it takes a port, its class is reserved and its draw counted against the switch
//   budget and the battery); an outlet method gives it no port (it leaves the switch, and it
//   stays up in a power cut only when pinned to a battery-backed outlet); a new outlet is
//   listed for the electrician in the materials.
// - Pins (`sourceId`, `port`) are written into the device itself, so the port assignment
//   places it there and budgets, shedding and runtime all reflect it.
// - A decision that no longer fits what was captured (the surveyor changed the input, say) is
//   not applied: the rules' advice stands, with a warning saying why.
import * as v from "valibot";
import { IdSchema, integerInRange, positiveNumber } from "./model/common";
import { PoeClassSchema, type Device } from "./model/device";
import type { SiteSettings } from "./model/site";
import { attemptPoe } from "./rules/recommend-device";
import { evaluateCableRun, type CableRunResult } from "./rules/cable-run";
import { recommendationLabel } from "./rules/labels";
import type { DeviceEvaluation, OutletPlan, PlanWarning, PlugSpec, PoePlan, SplitterPlan } from "./rules/result-types";
import { barrelPlug, MICRO_USB_PLUG, minimumAmps, sizeSplitter, splitterRatingAmps, TERMINAL_PLUG, USB_C_PLUG } from "./rules/splitter";
import { CAUTIONS, type Caution } from "./standards/cautions";
import { classForPdPower, POE_CLASSES, type PoeClass } from "./standards/poe-classes";
import { MAX_PD_POWER_W, POE_TYPES } from "./standards/poe-types";
import { usbLevelFor, USB_POWER_LEVELS } from "./standards/usb-power";
import { formatLength, formatNumber, formatWatts } from "./units";
import type { FieldErrors } from "./validation";

export const POWER_METHODS = ["poe", "poe_splitter", "existing_outlet", "new_outlet"] as const;
export type PowerMethod = (typeof POWER_METHODS)[number];

export const POWER_METHOD_WORDS: Readonly<Record<PowerMethod, string>> = {
  poe: "PoE",
  poe_splitter: "PoE + splitter",
  existing_outlet: "existing outlet",
  new_outlet: "new outlet (electrician)",
};

const REASON_REQUIRED = "Give a reason for the decision: it is kept in the device's history and shown on the report.";

/** A required reason: missing, empty or blank all get the same plain message. */
export const ReasonSchema = v.pipe(
  v.optional(v.string("The reason must be text."), ""),
  v.trim(),
  v.nonEmpty(REASON_REQUIRED),
  v.maxLength(1000, "Keep the reason under 1,000 characters."),
);

export const SplitterChoiceSchema = v.object({
  volts: positiveNumber("Splitter output voltage", "V", 60),
  amps: positiveNumber("Splitter rating", "A", 10),
  /** The plug the splitter ends in; the device's own plug when left out. */
  plug: v.optional(v.pipe(v.string("The plug must be text."), v.trim(), v.maxLength(80, "Keep the plug under 80 characters."))),
});
export type SplitterChoice = v.InferOutput<typeof SplitterChoiceSchema>;

/** What the designer decides for a device. */
export const DecisionCoreEntries = {
  method: v.picklist(POWER_METHODS, "Choose how it is powered: poe, poe_splitter, existing_outlet or new_outlet."),
  /** The PoE class reserved for its port (PoE methods only). */
  poeClass: v.optional(PoeClassSchema),
  /** Pinned to this power source (a switch or injector for PoE, an outlet otherwise). */
  sourceId: v.optional(IdSchema),
  /** Pinned to this port of the source (1-based). */
  port: v.optional(integerInRange("Port", 1, 512)),
  splitter: v.optional(SplitterChoiceSchema),
};

export const DecisionInputSchema = v.object({
  ...DecisionCoreEntries,
  reason: ReasonSchema,
  /** Place it even over the budget or the planning ceiling (the reason says why). */
  force: v.optional(v.boolean('"force" must be true or false'), false),
});
export type DecisionInput = v.InferOutput<typeof DecisionInputSchema>;

export const ClearDecisionSchema = v.object({ reason: ReasonSchema });

export interface DecisionCore {
  readonly method: PowerMethod;
  readonly poeClass?: PoeClass;
  readonly sourceId?: string;
  readonly port?: number;
  readonly splitter?: SplitterChoice;
  readonly reason: string;
}

export type DecisionOutcome =
  | {
      readonly ok: true;
      readonly evaluation: DeviceEvaluation;
      /** Why PoE does not work over the run, when a PoE method was chosen anyway. */
      readonly poeProblem: string | null;
    }
  | { readonly ok: false; readonly errors: FieldErrors };

const DEVICE_LEVEL_WARNINGS = new Set(["typical_figure", "need_above_standard", "adapter_volts_mismatch", "usb_above_levels"]);
const PLUG_WARNINGS = new Set(["barrel_lookalike", "polarity_unknown", "barrel_voltage_key"]);

function inputWords(device: Device): string {
  switch (device.input.type) {
    case "poe":
      return "takes PoE over its network cable";
    case "passive_poe":
      return `uses passive PoE at ${formatNumber(device.input.volts)} V`;
    case "dc_barrel":
      return `takes ${formatNumber(device.input.volts)} V DC through a barrel plug`;
    case "micro_usb":
      return "takes power through micro-USB";
    case "usb_c":
      return "takes power through USB-C";
    case "terminal_block":
      return `takes ${formatNumber(device.input.volts)} V ${device.input.current === "ac" ? "AC" : "DC"} on screw terminals`;
    case "ac_plug":
      return "plugs into mains power";
  }
}

function splitterInput(device: Device): boolean {
  const i = device.input;
  return i.type === "dc_barrel" || i.type === "micro_usb" || i.type === "usb_c" || (i.type === "terminal_block" && i.current !== "ac");
}

function devicePlug(device: Device): PlugSpec {
  const i = device.input;
  if (i.type === "dc_barrel") return barrelPlug(i.outerMm, i.innerMm, i.polarity);
  if (i.type === "micro_usb") return MICRO_USB_PLUG;
  if (i.type === "usb_c") return USB_C_PLUG;
  return TERMINAL_PLUG;
}

/** Output voltages a splitter may give this device: its own input voltage, or the USB levels of its connector. */
export function allowedSplitterVolts(device: Device): number[] {
  const i = device.input;
  if (i.type === "dc_barrel" || i.type === "terminal_block") return [i.volts];
  if (i.type === "micro_usb") return [5];
  if (i.type === "usb_c") return [...new Set(USB_POWER_LEVELS.filter((l) => l.connectors.includes("usb_c")).map((l) => l.volts))];
  return [];
}

/** The splitter the desk form starts from: the rules' own, else one sized for the device. */
export function defaultSplitter(device: Device, base: DeviceEvaluation): SplitterChoice | null {
  if (!splitterInput(device)) return null;
  if (base.splitter) return { volts: base.splitter.outputVolts, amps: base.splitter.ratingAmps, plug: base.splitter.plug.label };
  const i = device.input;
  const volts = i.type === "usb_c" ? (usbLevelFor("usb_c", base.needW)?.volts ?? 20) : allowedSplitterVolts(device)[0];
  return { volts, amps: splitterRatingAmps(minimumAmps(base.needW, volts)), plug: devicePlug(device).label };
}

/** The class a standard injector at the device must serve: the device's own, or the least covering its need. */
export function localInjectorClass(device: Device, base: DeviceEvaluation): PoeClass {
  const i = device.input;
  return base.poe?.poeClass ?? (i.type === "poe" ? i.class : undefined) ?? classForPdPower(Math.min(base.needW, MAX_PD_POWER_W))!;
}

export function injectorClassWords(poeClass: PoeClass): string {
  const type = POE_CLASSES[poeClass].minType;
  return `Class ${poeClass}, ${POE_TYPES[type].standardName}${type >= 3 ? ` Type ${type}` : ""} or better`;
}

function outletVia(device: Device): OutletPlan["via"] {
  const i = device.input;
  if (i.type === "poe") return "poe_injector"; // it takes power only over its cable: a standard injector at the outlet
  if (i.type === "passive_poe") return "own_passive_injector";
  if (i.type === "ac_plug") return "plug";
  if (i.type === "terminal_block" && i.current === "ac") return "transformer";
  return "adapter";
}

interface Builder {
  reasons: string[];
  cautions: Caution[];
  warnings: PlanWarning[];
}

function addCaution(b: Builder, c: Caution) {
  if (!b.cautions.includes(c)) b.cautions.push(c);
}

function mergeCable(b: Builder, cable: CableRunResult | null, withReasons: boolean) {
  if (!cable) return;
  if (withReasons) b.reasons.push(...cable.reasons);
  b.warnings.push(...cable.warnings);
  for (const c of cable.cautions) addCaution(b, c);
}

function dataCable(device: Device, needW: number, settings: SiteSettings): CableRunResult | null {
  if (!device.run) return null;
  return evaluateCableRun(device.run, {
    deviceId: device.id,
    temperatureC: settings.cableTemperatureC,
    cordAllowanceM: settings.cordAllowanceM,
    units: settings.units,
    passive: device.input.type === "passive_poe" ? { volts: device.input.volts, loadW: needW } : null,
    outdoor: device.outdoor || device.cableAccess === "exterior",
  });
}

/**
 * Works out a device's result for the designer's decision. Refuses (with the field to fix) what
 * cannot power the device safely: PoE into a device that does not take it, a splitter at the
 * wrong voltage or too small, a class below the device's need.
 */
export function applyDecision(device: Device, base: DeviceEvaluation, d: DecisionCore, settings: SiteSettings): DecisionOutcome {
  const errors: FieldErrors = {};
  const bad = (field: string, message: string) => (errors[field] ??= []).push(message);
  const needW = base.needW;
  const u = settings.units;
  const b: Builder = { reasons: [`Designer decision: ${d.reason}`], cautions: [], warnings: [] };
  let poe: PoePlan | null = null;
  let splitter: SplitterPlan | null = null;
  let outlet: OutletPlan | null = null;
  let cable: CableRunResult | null = null;
  let poeProblem: string | null = null;
  const input = device.input;

  if (d.method !== "poe" && d.method !== "poe_splitter" && d.poeClass !== undefined) bad("poeClass", "Only a PoE decision takes a PoE class.");
  if (d.method !== "poe_splitter" && d.splitter !== undefined) bad("splitter", "Only a PoE + splitter decision takes a splitter.");
  if (d.port !== undefined && d.sourceId === undefined) bad("port", "Choose the switch or injector of that port too.");

  if (d.method === "poe") {
    if (input.type !== "poe") {
      bad("method", input.type === "passive_poe"
        ? `It uses passive PoE at ${formatNumber(input.volts)} V: a standard PoE port cannot power it (and its own injector must never feed other gear). Choose an existing or new outlet for its own injector.`
        : `It ${inputWords(device)}, not PoE: choose PoE + splitter or an outlet.`);
    } else if (needW > MAX_PD_POWER_W + 1e-9) {
      bad("method", `It needs ${formatWatts(needW)}, more than PoE can deliver to a device (${formatWatts(MAX_PD_POWER_W)}).`);
    } else {
      const poeClass: PoeClass = d.poeClass ?? base.poe?.poeClass ?? input.class ?? classForPdPower(needW)!;
      const cls = POE_CLASSES[poeClass];
      if (cls.pdMaxW + 1e-9 < needW) {
        bad("poeClass", `Class ${poeClass} guarantees only ${formatWatts(cls.pdMaxW)} at the device, but it needs ${formatWatts(needW)}: choose Class ${classForPdPower(needW)} or higher, or correct its power figure.`);
      } else {
        const attempt = attemptPoe(device, poeClass, needW, settings);
        poe = attempt.plan;
        cable = attempt.cable;
        mergeCable(b, cable, true);
        poeProblem = attempt.works ? null : attempt.whyNot;
        b.reasons.push(`It takes power over its network cable: a Class ${poeClass} port (${POE_TYPES[cls.minType].standardName}${cls.minType >= 3 ? ` Type ${cls.minType}` : ""}) sets aside ${formatWatts(cls.psePowerW)} for it.`);
      }
    }
  } else if (d.method === "poe_splitter") {
    if (!splitterInput(device)) {
      bad("method", input.type === "poe"
        ? "It takes PoE itself: choose PoE, a splitter is not needed."
        : input.type === "passive_poe"
          ? `It uses passive PoE at ${formatNumber(input.volts)} V: never connect it to a standard PoE port or splitter. Choose an outlet for its own injector.`
          : `It ${inputWords(device)}: a PoE splitter gives low-voltage DC and cannot power it.`);
    } else {
      const start = defaultSplitter(device, base)!;
      const volts = d.splitter?.volts ?? start.volts;
      const allowed = allowedSplitterVolts(device);
      if (!allowed.some((a) => Math.abs(a - volts) <= 0.05)) {
        bad("splitter.volts", input.type === "usb_c"
          ? `USB-C supplies ${allowed.join(", ")} V; ${formatNumber(volts)} V is not one of them.`
          : `It takes ${allowed.map((a) => formatNumber(a)).join(" or ")} V: the splitter must put out exactly that (a higher voltage can destroy it, a lower one will not run it).`);
      } else {
        const minAmps = minimumAmps(needW, volts);
        const amps = d.splitter?.amps ?? splitterRatingAmps(minAmps);
        if (amps + 1e-9 < minAmps) bad("splitter.amps", `It needs at least ${formatNumber(minAmps)} A at ${formatNumber(volts)} V (${formatWatts(needW)}).`);
        const sizing = sizeSplitter(volts, minAmps, settings.splitterEfficiency);
        if (sizing.poeClass === null) {
          bad("method", `A splitter for it would draw ${formatWatts(sizing.inputW)}, more than PoE can deliver (${formatWatts(MAX_PD_POWER_W)}).`);
        } else if (d.poeClass !== undefined && d.poeClass !== sizing.poeClass && POE_CLASSES[d.poeClass].pdMaxW + 1e-9 < sizing.inputW) {
          bad("poeClass", `The splitter draws ${formatWatts(sizing.inputW)}: its port must be Class ${sizing.poeClass} or higher.`);
        } else if (amps + 1e-9 >= minAmps) {
          const poeClass = d.poeClass ?? sizing.poeClass;
          const own = devicePlug(device);
          const plugLabel = d.splitter?.plug || own.label;
          const plug: PlugSpec = plugLabel === own.label ? own : { ...own, label: plugLabel };
          const attempt = attemptPoe(device, poeClass, sizing.inputW, settings);
          poe = attempt.plan;
          cable = attempt.cable;
          mergeCable(b, cable, true);
          poeProblem = attempt.works ? null : attempt.whyNot;
          splitter = {
            outputVolts: volts,
            minAmps,
            ratingAmps: amps,
            plug,
            efficiency: settings.splitterEfficiency,
            inputW: Math.round(sizing.inputW * 1000) / 1000,
            poeClass,
            poeType: POE_CLASSES[poeClass].minType,
            usbLevel: input.type === "micro_usb" || input.type === "usb_c" ? (usbLevelFor(input.type, needW)?.name ?? null) : null,
          };
          if (input.type === "dc_barrel") addCaution(b, CAUTIONS.barrel_plug);
          for (const w of base.warnings) if (PLUG_WARNINGS.has(w.code)) b.warnings.push(w);
          if (plugLabel !== own.label) {
            b.warnings.push({ code: "splitter_plug_differs", severity: "warning", deviceId: device.id, message: `The splitter's plug (${plugLabel}) is not the device's recorded plug (${own.label}): check the device before connecting.` });
          }
          b.reasons.push(`A PoE splitter next to it gives ${formatNumber(volts)} V at up to ${formatNumber(amps)} A for its ${plugLabel} input; it draws ${formatWatts(sizing.inputW)} from a Class ${poeClass} port.`);
        }
      }
    }
  } else {
    const via = outletVia(device);
    const electrician = d.method === "new_outlet";
    if (via === "poe_injector" && needW > MAX_PD_POWER_W + 1e-9) {
      bad("method", `It needs ${formatWatts(needW)}, more than PoE can deliver to a device (${formatWatts(MAX_PD_POWER_W)}), and it takes power only over its network cable.`);
    }
    outlet = { via, location: via === "own_passive_injector" ? "closet" : "device", distanceM: device.outletDistanceM ?? null, electrician };
    cable = dataCable(device, needW, settings);
    mergeCable(b, cable, false);
    if (via === "own_passive_injector") {
      addCaution(b, CAUTIONS.passive_poe);
      b.reasons.push(`Its own documented ${formatNumber((input as { volts: number }).volts)} V injector plugs into ${electrician ? "a new outlet" : "an outlet"} at the closet; never into a standard PoE port or other gear.`);
    } else if (via === "transformer") {
      addCaution(b, CAUTIONS.doorbell_transformer);
    } else if (via === "poe_injector" && input.type === "poe") {
      const injectorClass = localInjectorClass(device, base);
      b.reasons.push(`It takes power only over its network cable, so a standard PoE injector next to it (${injectorClassWords(injectorClass)}) plugs into ${electrician ? "the new outlet" : "an existing outlet"} and feeds it; the run to the closet carries data only.`);
    }
    if (electrician) {
      addCaution(b, CAUTIONS.mains_electrician);
      b.reasons.push("A licensed electrician installs a new outlet for it: that is mains work, done to local code.");
      if (device.mustStayUp) b.reasons.push("It must keep working in a power cut: put the new outlet on a circuit fed by a battery backup, or it will go down.");
    } else {
      b.reasons.push(via === "plug" ? "It plugs into an existing outlet." : via === "transformer" ? "It keeps its existing transformer wiring." : via === "adapter" ? "It keeps using its own adapter in an existing outlet." : "");
      if (via === "adapter" || via === "plug" || via === "poe_injector") {
        const far = device.outletDistanceM === undefined || device.outletDistanceM > settings.nearOutletM;
        if (far) {
          b.warnings.push({
            code: "outlet_not_near", severity: "warning", deviceId: device.id,
            message: device.outletDistanceM === undefined
              ? "The walk recorded no outlet near it: check that an outlet is within reach of its cord."
              : `The walk recorded the nearest outlet ${formatLength(device.outletDistanceM, u)} away: check that its cord reaches without an extension lead.`,
          });
        }
      }
      if (device.mustStayUp) b.reasons.push("It must keep working in a power cut: it stays up only if its outlet is on a battery backup.");
    }
  }

  if (d.sourceId === undefined && d.port !== undefined && !errors.port) bad("port", "Choose the switch or injector of that port too.");
  if (Object.keys(errors).length) return { ok: false, errors };

  b.reasons = b.reasons.filter((r) => r !== "");
  for (const w of base.warnings) if (DEVICE_LEVEL_WARNINGS.has(w.code)) b.warnings.push(w);
  const needsRun = d.method === "poe" || d.method === "poe_splitter" || input.type === "passive_poe";
  if (needsRun && device.run === undefined) {
    b.warnings.push({ code: "run_missing", severity: "info", deviceId: device.id, message: "The cable run to the closet has not been captured yet (a gap for the next walk); PoE was checked against the standard's worst-case cable." });
  }
  if (device.cableAccess === "finished_no_access" && (needsRun || d.method === "new_outlet")) {
    b.warnings.push({ code: "finished_surfaces", severity: "info", deviceId: device.id, message: "Walls and ceilings here are finished with no access above or below: expect surface raceway or patching for new cable or a new outlet." });
  }
  const recommendation = d.method;
  const label = recommendationLabel({ recommendation, poe, splitter, outlet });
  b.warnings.unshift({ code: "designer_decision", severity: "info", deviceId: device.id, message: `Designer decision: ${label}. The rules advised ${base.label}.` });
  if (poeProblem) {
    b.warnings.push({ code: "decision_poe_fails", severity: "error", deviceId: device.id, message: `PoE was chosen although ${poeProblem}.` });
  }
  const evaluation: DeviceEvaluation = {
    ...base,
    recommendation,
    label,
    poe,
    splitter,
    outlet,
    cable: cable ? cable.evaluation : null,
    reasons: b.reasons,
    cautions: b.cautions,
    warnings: b.warnings,
  };
  return { ok: true, evaluation, poeProblem };
}

export interface AppliedDecisions {
  /** One result per site device, in site order: the rules' own, or the designer's where decided. */
  readonly devices: readonly DeviceEvaluation[];
  /** Decisions that no longer fit what was captured, with the reason (the rules' advice stands). */
  readonly stale: ReadonlyMap<string, string>;
  readonly poeProblems: ReadonlyMap<string, string>;
}

/** Applies every decision to the rules' results (see the top of this file). */
export function applyDecisions(
  site: { readonly devices: readonly Device[]; readonly settings: SiteSettings },
  base: readonly DeviceEvaluation[],
  decisions: ReadonlyMap<string, DecisionCore>,
): AppliedDecisions {
  const stale = new Map<string, string>();
  const poeProblems = new Map<string, string>();
  const devices = site.devices.map((device, i) => {
    const d = decisions.get(device.id);
    if (!d) return base[i];
    const outcome = applyDecision(device, base[i], { ...d, sourceId: undefined, port: undefined }, site.settings);
    if (outcome.ok) {
      if (outcome.poeProblem) poeProblems.set(device.id, outcome.poeProblem);
      return outcome.evaluation;
    }
    const first = Object.values(outcome.errors)[0]?.[0] ?? "it no longer fits";
    stale.set(device.id, first);
    return {
      ...base[i],
      warnings: [
        { code: "decision_stale", severity: "warning" as const, deviceId: device.id, message: `The designer decision (${POWER_METHOD_WORDS[d.method]}) no longer fits what was captured: ${first} The rules' advice applies until it is changed.` },
        ...base[i].warnings,
      ],
    };
  });
  return { devices, stale, poeProblems };
}
