import { findBarrelSize } from '../standards/barrel-sizes';
import { CAUTIONS, type Caution } from '../standards/cautions';
import { PLANNING } from '../standards/planning-defaults';
import { classForPdPower, POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import { MAX_PD_POWER_W, POE_TYPES, type PoeType } from '../standards/poe-types';
import { usbLevelFor } from '../standards/usb-power';
import { powerNeedWatts, type Device, type DcBarrelInput } from '../model/device';
import type { SiteSettings } from '../model/site';
import { formatLength, formatNumber, formatPercent, formatWatts, roundTo, type UnitSystem } from '../units';
import { evaluateCableRun, type CableRunResult } from './cable-run';
import { recommendationLabel } from './labels';
import { drawForPdLoad } from './poe-loss';
import type {
  DeviceEvaluation, OutletPlan, PlanWarning, PlugSpec, PoePlan, Recommendation, SplitterPlan,
} from './result-types';
import {
  barrelPlug, MICRO_USB_PLUG, minimumAmps, polarityText, sizeSplitter, splitterRatingAmps, TERMINAL_PLUG, USB_C_PLUG,
} from './splitter';

/*
 * Decision policy — how each device is powered.
 *
 *  input                | must stay up | outlet near¹ | outdoor | PoE path works² | recommendation
 *  ---------------------|--------------|--------------|---------|-----------------|------------------------------
 *  native PoE           |      –       |      –       |    –    |      yes        | poe
 *  native PoE           |      –       |      –       |    –    |      no         | cannot_power
 *  barrel / USB /       |     yes      |      –       |    –    |      yes        | poe_splitter
 *  DC terminal block    |     yes      |     yes      |    –    |      no         | existing_outlet (+ it stays up only on a battery-backed outlet)
 *                       |     yes      |     no       |    –    |      no         | new_outlet (+ same)
 *                       |     no       |     yes      |   no    |      –          | existing_outlet
 *                       |     no       |     yes      |   yes   |      yes        | poe_splitter (low voltage beats relying on an outdoor mains outlet)
 *                       |     no       |     yes      |   yes   |      no         | existing_outlet
 *                       |     no       |     no       |    –    |      yes        | poe_splitter (no mains work)
 *                       |     no       |     no       |    –    |      no         | new_outlet
 *  passive PoE          |      –       |      –       |    –    |      –          | existing_outlet, via its own documented injector plugged in at the
 *                       |              |              |         |                 | closet — never a standard PoE port, never a standard port's cable
 *                       |              |              |         |                 | straight into it (strong caution)
 *  AC plug              |      –       |     yes      |    –    |      –          | existing_outlet
 *                       |      –       |     no       |    –    |      –          | new_outlet
 *  AC terminal block    |      –       |     yes³     |    –    |      –          | existing_outlet (keeps its transformer)
 *  (doorbell)           |      –       |     no       |    –    |      –          | new_outlet (new transformer, electrician)
 *
 *  ¹ nearest outlet ≤ settings.nearOutletM (1.5 m by default — [PRACTICE], our policy: a
 *    typical adapter cord reaches that far). An unknown distance counts as "not near".
 *  ² the load at the PD (device need, or splitter input P_in = V × A ÷ η) is ≤ 71.3 W
 *    (802.3bt Type 4 / Class 8) and the captured run passes the cable checks (channel ≤ 100 m,
 *    PD voltage and class power at the PSE's minimum voltage). A run not captured yet is a gap:
 *    PoE is assumed to work over a standard-compliant run and the expected draw is computed
 *    with the standard's worst-case loop (20 Ω Type 1, 12.5 Ω Types 2–4).
 *  ³ for AC terminal-block devices "near" means low-voltage AC wires already at the device.
 *
 *  A native PoE device's port class is its stated class, else the smallest class covering its
 *  need; the port type is the least type serving that class. A splitter's class is the smallest
 *  class covering P_in.
 */

// Sentences that do not depend on the device's own figures are built once.
const NATIVE_POE_REASON = 'It takes power over its network cable (PoE), so it needs no outlet or adapter.';
const NATIVE_POE_STAYS_UP = 'It must keep working in a power cut: it will, as long as its switch is on the battery backup.';
const SPLITTER_STAYS_UP = 'It must keep working in a power cut, so it takes power over its network cable from the battery-backed switch rather than from an outlet.';
const SPLITTER_OUTDOOR = 'It is outdoors: low-voltage power over its network cable avoids relying on an outdoor mains outlet.';
function portText(c: PoeClass): string {
  const t = POE_CLASSES[c].minType;
  return `${POE_TYPES[t].standardName}${t >= 3 ? ` Type ${t}` : ''}`;
}
const CLASS_PORT_REASON: readonly string[] = POE_CLASSES.map((c) =>
  `It is Class ${c.poeClass}: the switch port must be ${portText(c.poeClass)} and sets aside ${formatWatts(c.psePowerW)} for it.`);

export interface DeviceContext {
  readonly settings: SiteSettings;
}

interface Builder {
  readonly reasons: string[];
  readonly cautions: Caution[];
  readonly warnings: PlanWarning[];
}

function addCaution(b: Builder, c: Caution): void {
  if (!b.cautions.includes(c)) b.cautions.push(c);
}

function warn(b: Builder, deviceId: string, code: string, severity: PlanWarning['severity'], message: string): void {
  b.warnings.push({ code, severity, message, deviceId });
}

export interface PoeAttempt {
  readonly works: boolean;
  readonly plan: PoePlan | null;
  readonly cable: CableRunResult | null;
  /** Why PoE does not work, in plain words. */
  readonly whyNot: string | null;
}

/** Try to power `pdLoadW` over the device's run with a port of `poeClass` (also used for designer decisions). */
export function attemptPoe(device: Device, poeClass: PoeClass, pdLoadW: number, settings: SiteSettings): PoeAttempt {
  const cls = POE_CLASSES[poeClass];
  const poeType: PoeType = cls.minType;
  const spec = POE_TYPES[poeType];
  let cable: CableRunResult | null = null;
  let expectedPseW: number;
  let lossW: number;
  if (device.run !== undefined) {
    cable = evaluateCableRun(device.run, {
      deviceId: device.id,
      temperatureC: settings.cableTemperatureC,
      cordAllowanceM: settings.cordAllowanceM,
      units: settings.units,
      poe: { poeClass, poeType, pdLoadW },
      outdoor: device.outdoor || device.cableAccess === 'exterior',
    });
    const exp = cable.evaluation.poe!.atExpectedLoad;
    expectedPseW = exp.psePowerW;
    lossW = exp.lossW;
  } else {
    const worst = drawForPdLoad(pdLoadW, spec.pseVoltageMinV, spec.loopResistanceOhm, cls.pairs);
    expectedPseW = roundTo(worst.psePowerW, 3);
    lossW = roundTo(worst.lossW, 3);
  }
  const plan: PoePlan = {
    poeClass,
    poeType,
    standard: spec.standardName,
    pairs: cls.pairs,
    reservedW: cls.psePowerW,
    pdLoadW: roundTo(pdLoadW, 3),
    expectedPseW,
    cableLossW: lossW,
  };
  if (cable !== null && !cable.evaluation.ok) {
    const why = !cable.evaluation.withinChannel
      ? `its cable run is longer than the ${formatLength(100, settings.units)} a network cable may be`
      : 'its cable cannot carry enough power at the voltage PoE guarantees';
    return { works: false, plan, cable, whyNot: why };
  }
  return { works: true, plan, cable, whyNot: null };
}

function mergeCable(b: Builder, cable: CableRunResult | null): void {
  if (cable === null) return;
  for (const r of cable.reasons) b.reasons.push(r);
  for (const w of cable.warnings) b.warnings.push(w);
  for (const c of cable.cautions) addCaution(b, c);
}

/** Cable checks for a device whose run carries data only (outlet-powered devices). */
function dataOnlyCable(device: Device, settings: SiteSettings, b: Builder): CableRunResult | null {
  if (device.run === undefined) return null;
  const cable = evaluateCableRun(device.run, {
    deviceId: device.id,
    temperatureC: settings.cableTemperatureC,
    cordAllowanceM: settings.cordAllowanceM,
    units: settings.units,
    outdoor: device.outdoor || device.cableAccess === 'exterior',
  });
  for (const w of cable.warnings) b.warnings.push(w);
  for (const c of cable.cautions) addCaution(b, c);
  return cable;
}

function capitalize(s: string): string {
  return s.length === 0 ? s : s[0].toUpperCase() + s.slice(1);
}

function isNear(device: Device, settings: SiteSettings): boolean {
  return device.outletDistanceM !== undefined && device.outletDistanceM <= settings.nearOutletM;
}

function outletDistanceText(device: Device, u: UnitSystem): string {
  return device.outletDistanceM === undefined ? 'no outlet is known nearby' : `the nearest outlet is ${formatLength(device.outletDistanceM, u)} away`;
}

interface SplitterSpec {
  readonly volts: number;
  readonly plug: PlugSpec;
  readonly usbLevel: string | null;
}

/** What a splitter must put out for an adapter-powered device. */
function splitterSpecFor(device: Device, needW: number, b: Builder): SplitterSpec | null {
  const input = device.input;
  switch (input.type) {
    case 'dc_barrel':
      return { volts: input.volts, plug: barrelPlug(input.outerMm, input.innerMm, input.polarity), usbLevel: null };
    case 'terminal_block':
      return { volts: input.volts, plug: TERMINAL_PLUG, usbLevel: null };
    case 'micro_usb':
    case 'usb_c': {
      const level = usbLevelFor(input.type, needW);
      if (level === null) {
        if (input.type === 'micro_usb') {
          warn(b, device.id, 'usb_above_levels', 'warning',
            `It draws ${formatWatts(needW)}, more than micro-USB normally supplies (7.5 W at 1.5 A); it needs a 5 V supply rated for that current and a short, thick cable.`);
          return { volts: 5, plug: MICRO_USB_PLUG, usbLevel: null };
        }
        return null; // above USB PD 100 W: no splitter
      }
      return { volts: level.volts, plug: input.type === 'usb_c' ? USB_C_PLUG : MICRO_USB_PLUG, usbLevel: level.name };
    }
    default:
      return null;
  }
}

function barrelChecks(device: Device, input: DcBarrelInput, b: Builder): void {
  const size = findBarrelSize(input.outerMm, input.innerMm);
  addCaution(b, CAUTIONS.barrel_plug);
  if (size !== undefined && size.lookAlikes.length > 0) {
    warn(b, device.id, 'barrel_lookalike', 'info',
      `Its ${size.outerMm}×${size.innerMm} mm plug looks just like ${size.lookAlikes.map((s) => s.replace('x', '×')).join(', ')} mm, and the two do not connect reliably: check the splitter's plug (a round toothpick is snug in 2.1 mm, loose in 2.5 mm).`);
  }
  if (input.polarity === 'unknown') {
    warn(b, device.id, 'polarity_unknown', 'warning',
      'The plug polarity was not recorded: read the polarity symbol on the device or its adapter before connecting a splitter (centre-positive is common, not universal).');
  }
  if (size?.eiaj !== undefined && (input.volts < size.eiaj.minV || input.volts > size.eiaj.maxV)) {
    warn(b, device.id, 'barrel_voltage_key', 'warning',
      `A ${size.outerMm}×${size.innerMm} mm plug is the ${size.eiaj.code} size, keyed for ${size.eiaj.minV}–${size.eiaj.maxV} V, but the device says ${formatNumber(input.volts)} V: check the label.`);
  }
}

function buildResult(
  device: Device, needW: number, recommendation: Recommendation, b: Builder,
  poe: PoePlan | null, splitter: SplitterPlan | null, outlet: OutletPlan | null, cable: CableRunResult | null,
): DeviceEvaluation {
  const needsRun = recommendation === 'poe' || recommendation === 'poe_splitter' || device.input.type === 'passive_poe';
  if (needsRun && device.run === undefined) {
    warn(b, device.id, 'run_missing', 'info', 'The cable run to the closet has not been captured yet (a gap for the next walk); PoE was checked against the standard\'s worst-case cable.');
  }
  if (device.cableAccess === 'finished_no_access' && (needsRun || recommendation === 'new_outlet')) {
    warn(b, device.id, 'finished_surfaces', 'info',
      'Walls and ceilings here are finished with no access above or below: expect surface raceway or patching for new cable or a new outlet.');
  }
  const label = recommendationLabel({ recommendation, poe, splitter });
  return {
    deviceId: device.id,
    name: device.name,
    kind: device.kind,
    roomId: device.roomId,
    mustStayUp: device.mustStayUp,
    recommendation,
    label,
    needW: roundTo(needW, 3),
    typicalFigure: device.power.typical,
    poe,
    splitter,
    outlet,
    cable: cable === null ? null : cable.evaluation,
    reasons: b.reasons,
    cautions: b.cautions,
    warnings: b.warnings,
  };
}

function outletPlan(device: Device, near: boolean, via: OutletPlan['via']): OutletPlan {
  return { via, location: 'device', distanceM: device.outletDistanceM ?? null, electrician: !near };
}

function newOutletReasons(b: Builder, why: string): void {
  b.reasons.push(`It needs a new outlet: ${why}. Installing an outlet is mains work for a licensed electrician.`);
  addCaution(b, CAUTIONS.mains_electrician);
}

/** Recommend how to power one device. Pure; uses only the site settings. */
export function evaluateDevice(device: Device, site: DeviceContext): DeviceEvaluation {
  const settings = site.settings;
  const u = settings.units;
  const needW = powerNeedWatts(device.power);
  const b: Builder = { reasons: [], cautions: [], warnings: [] };
  const near = isNear(device, settings);
  const input = device.input;

  if (device.power.typical) {
    warn(b, device.id, 'typical_figure', 'info',
      `The power figure (${formatWatts(needW)}) is a typical value, not read from the device: check its label or datasheet.`);
  }

  // ── Native PoE ────────────────────────────────────────────────────────────
  if (input.type === 'poe') {
    if (needW > MAX_PD_POWER_W + 1e-9) {
      b.reasons.push(`It needs ${formatWatts(needW)}, more than PoE can deliver to a device (${formatWatts(MAX_PD_POWER_W)}, 802.3bt Type 4), and it takes power only over its network cable.`);
      return buildResult(device, needW, 'cannot_power', b, null, null, null, dataOnlyCable(device, settings, b));
    }
    const fromNeed = classForPdPower(needW)!;
    const poeClass: PoeClass = input.class ?? fromNeed;
    const cls = POE_CLASSES[poeClass];
    if (input.class !== undefined && needW > cls.pdMaxW + 1e-9) {
      warn(b, device.id, 'need_above_class', 'warning',
        `It is listed as Class ${poeClass}, but its figure of ${formatWatts(needW)} is above the ${formatWatts(cls.pdMaxW)} that Class ${poeClass} guarantees: the port may cut it off. Check the datasheet.`);
    }
    if (input.standard !== undefined && input.class === undefined) {
      const maxPd = input.standard === 'af' ? POE_TYPES[1].pdPowerW : input.standard === 'at' ? POE_TYPES[2].pdPowerW : POE_TYPES[4].pdPowerW;
      if (needW > maxPd + 1e-9) {
        warn(b, device.id, 'need_above_standard', 'warning',
          `It says 802.3${input.standard}, which delivers at most ${formatWatts(maxPd)} to a device, but its figure is ${formatWatts(needW)}: check the datasheet.`);
      }
    }
    const attempt = attemptPoe(device, poeClass, needW, settings);
    mergeCable(b, attempt.cable);
    const plan = attempt.plan!;
    if (!attempt.works) {
      b.reasons.push(`It takes power only over its network cable, but ${attempt.whyNot}.`);
      b.reasons.push('A small PoE switch closer to it, or a shorter or thicker copper cable, would make it work.');
      return buildResult(device, needW, 'cannot_power', b, null, null, null, attempt.cable);
    }
    b.reasons.push(NATIVE_POE_REASON);
    b.reasons.push(CLASS_PORT_REASON[poeClass]);
    if (device.mustStayUp) b.reasons.push(NATIVE_POE_STAYS_UP);
    return buildResult(device, needW, 'poe', b, plan, null, null, attempt.cable);
  }

  // ── Passive PoE ───────────────────────────────────────────────────────────
  if (input.type === 'passive_poe') {
    addCaution(b, CAUTIONS.passive_poe);
    warn(b, device.id, 'passive_poe_device', 'warning',
      `It uses passive PoE at ${formatNumber(input.volts)} V: never plug it into a standard PoE switch port, and never plug its injector into other gear.`);
    b.reasons.push(`It uses passive PoE at ${formatNumber(input.volts)} V: the voltage is always on its cable, with no safety check. A standard PoE switch cannot power it, and its injector must never be connected to other gear.`);
    b.reasons.push(`Power it from its own documented ${formatNumber(input.volts)} V injector (or an adapter its maker documents), plugged into an outlet at the closet.`);
    if (device.mustStayUp) b.reasons.push('To keep it up in a power cut, plug its injector into an outlet on the battery backup.');
    let cable: CableRunResult | null = null;
    if (device.run !== undefined) {
      cable = evaluateCableRun(device.run, {
        deviceId: device.id,
        temperatureC: settings.cableTemperatureC,
        cordAllowanceM: settings.cordAllowanceM,
        units: u,
        passive: { volts: input.volts, loadW: needW },
        outdoor: device.outdoor || device.cableAccess === 'exterior',
      });
      mergeCable(b, cable);
    }
    const outlet: OutletPlan = { via: 'own_passive_injector', location: 'closet', distanceM: null, electrician: false };
    return buildResult(device, needW, 'existing_outlet', b, null, null, outlet, cable);
  }

  // ── Mains-powered: AC plug, AC terminal block ─────────────────────────────
  if (input.type === 'ac_plug' || (input.type === 'terminal_block' && input.current === 'ac')) {
    const isTransformer = input.type === 'terminal_block';
    const cable = dataOnlyCable(device, settings, b);
    if (isTransformer) addCaution(b, CAUTIONS.doorbell_transformer);
    if (device.mustStayUp) b.reasons.push('It runs on mains power, so it stays up in a power cut only if its supply is on a battery backup.');
    if (near) {
      b.reasons.push(isTransformer
        ? `It takes ${formatNumber(input.volts)} V AC from the low-voltage wires already at it: keep that transformer (it should give at least 16 V and 30 VA).`
        : `It plugs into mains power, and ${outletDistanceText(device, u)}.`);
      return buildResult(device, needW, 'existing_outlet', b, null, null, outletPlan(device, true, isTransformer ? 'transformer' : 'plug'), cable);
    }
    newOutletReasons(b, isTransformer
      ? `it takes ${formatNumber(input.volts)} V AC from a doorbell transformer, which a PoE splitter cannot provide, and there is no transformer wiring at it`
      : `it plugs into mains power and ${outletDistanceText(device, u)}`);
    return buildResult(device, needW, 'new_outlet', b, null, null, outletPlan(device, false, isTransformer ? 'transformer' : 'plug'), cable);
  }

  // ── Adapter-powered: barrel, USB, DC terminal block ───────────────────────
  const eff = settings.splitterEfficiency;
  if (input.type === 'dc_barrel' && device.power.by === 'adapter' && Math.abs(device.power.volts - input.volts) > 0.05) {
    warn(b, device.id, 'adapter_volts_mismatch', 'warning',
      `Its adapter label says ${formatNumber(device.power.volts)} V but its input was recorded as ${formatNumber(input.volts)} V: check which is right before buying a splitter.`);
  }
  // Near an outlet, indoors and not critical: the table says existing outlet, whatever PoE could do.
  if (near && !device.mustStayUp && !device.outdoor) {
    const dataCable = dataOnlyCable(device, settings, b);
    b.reasons.push(`${capitalize(outletDistanceText(device, u))}, so it can keep using its own adapter.`);
    return buildResult(device, needW, 'existing_outlet', b, null, null, outletPlan(device, true, 'adapter'), dataCable);
  }
  const spec = splitterSpecFor(device, needW, b);
  let splitter: SplitterPlan | null = null;
  let attempt: PoeAttempt | null = null;
  let whyNoPoe: string;
  if (spec === null) {
    whyNoPoe = `it needs ${formatWatts(needW)}, more than any USB supply gives`;
  } else {
    const minAmps = minimumAmps(needW, spec.volts);
    const sizing = sizeSplitter(spec.volts, minAmps, eff);
    if (sizing.poeClass === null) {
      whyNoPoe = `a splitter would draw ${formatWatts(sizing.inputW)}, more than PoE can deliver (${formatWatts(MAX_PD_POWER_W)})`;
    } else {
      attempt = attemptPoe(device, sizing.poeClass, sizing.inputW, settings);
      splitter = {
        outputVolts: spec.volts,
        minAmps,
        ratingAmps: splitterRatingAmps(minAmps),
        plug: spec.plug,
        efficiency: eff,
        inputW: roundTo(sizing.inputW, 3),
        poeClass: sizing.poeClass,
        poeType: sizing.poeType!,
        usbLevel: spec.usbLevel,
      };
      whyNoPoe = attempt.works ? '' : attempt.whyNot!;
    }
  }
  const poeWorks = attempt !== null && attempt.works;

  let choice: Recommendation;
  if (device.mustStayUp) {
    choice = poeWorks ? 'poe_splitter' : near ? 'existing_outlet' : 'new_outlet';
  } else if (near) {
    choice = device.outdoor && poeWorks ? 'poe_splitter' : 'existing_outlet';
  } else {
    choice = poeWorks ? 'poe_splitter' : 'new_outlet';
  }

  if (choice === 'poe_splitter') {
    const s = splitter!;
    const plan = attempt!.plan!;
    mergeCable(b, attempt!.cable);
    if (input.type === 'dc_barrel') barrelChecks(device, input, b);
    if (device.mustStayUp) b.reasons.push(SPLITTER_STAYS_UP);
    else if (device.outdoor && near) b.reasons.push(SPLITTER_OUTDOOR);
    else b.reasons.push(`${capitalize(outletDistanceText(device, u))}, so power over its network cable saves new mains wiring.`);
    b.reasons.push(`A PoE splitter next to it turns the cable's power into ${formatNumber(s.outputVolts)} V at ${formatNumber(s.minAmps)} A or more for its ${s.plug.label} input${s.usbLevel ? ` (${s.usbLevel})` : ''}.`);
    b.reasons.push(`The splitter wastes about ${formatPercent(1 - eff)} in conversion, so it draws ${formatWatts(s.inputW)}: the switch port must be Class ${plan.poeClass} (${plan.standard}${plan.poeType >= 3 ? ` Type ${plan.poeType}` : ''}) and sets aside ${formatWatts(plan.reservedW)}.`);
    return buildResult(device, needW, 'poe_splitter', b, plan, s, null, attempt!.cable);
  }

  // Outlet choices: the cable (if any) carries data only; report its own
  // problems (length, CCA…) without the PoE-specific notes.
  const dataCable = dataOnlyCable(device, settings, b);
  if (choice === 'existing_outlet') {
    if (device.mustStayUp) {
      b.reasons.push(`It must keep working in a power cut, but it cannot run on PoE here (${whyNoPoe}): it stays up only if its outlet is on a battery backup.`);
    }
    b.reasons.push(`${capitalize(outletDistanceText(device, u))}, so it can keep using its own adapter.`);
    return buildResult(device, needW, 'existing_outlet', b, null, null, outletPlan(device, true, 'adapter'), dataCable);
  }
  if (device.mustStayUp) {
    b.reasons.push('It must keep working in a power cut: put the new outlet on a circuit fed by a battery backup, or it will go down.');
  }
  newOutletReasons(b, `${outletDistanceText(device, u)} and it cannot run on PoE here (${whyNoPoe || 'no PoE path'})`);
  return buildResult(device, needW, 'new_outlet', b, null, null, outletPlan(device, false, 'adapter'), dataCable);
}

export const NEAR_OUTLET_PROVENANCE = PLANNING.nearOutletM.provenance;
