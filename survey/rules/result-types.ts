import type { AwgGauge } from '../standards/awg';
import type { CableCategory } from '../standards/cabling';
import type { Caution } from '../standards/cautions';
import type { PoeClass } from '../standards/poe-classes';
import type { PoeType } from '../standards/poe-types';
import type { DeviceKind, Polarity } from '../model/device';

export type Recommendation = 'poe' | 'poe_splitter' | 'existing_outlet' | 'new_outlet' | 'cannot_power';
export const RECOMMENDATION_VALUES: readonly Recommendation[] = [
  'poe', 'poe_splitter', 'existing_outlet', 'new_outlet', 'cannot_power',
];

export type Severity = 'info' | 'warning' | 'error';

export interface PlanWarning {
  readonly code: string;
  readonly severity: Severity;
  readonly message: string;
  readonly deviceId?: string;
  readonly sourceId?: string;
  readonly batteryId?: string;
}

/** Loss and voltage over one run at a given operating point. */
export interface CableAtClassPower {
  /** The class power put out by the PSE (W). */
  readonly psePowerW: number;
  readonly currentA: number;
  readonly currentPerPairsetA: number;
  readonly currentPerConductorA: number;
  readonly lossW: number;
  readonly pdPowerW: number;
  readonly pdVoltageV: number;
  /** The PD still gets its class's maximum power. */
  readonly meetsClassPower: boolean;
  /** The PD still sees at least its type's minimum voltage. */
  readonly meetsMinVoltage: boolean;
}

export interface CableAtExpectedLoad {
  readonly pdLoadW: number;
  readonly feasible: boolean;
  readonly currentA: number;
  readonly lossW: number;
  readonly psePowerW: number;
  readonly pdVoltageV: number;
  readonly meetsMinVoltage: boolean;
}

export interface CablePoeCheck {
  readonly poeClass: PoeClass;
  readonly poeType: PoeType;
  readonly pairs: 2 | 4;
  /** Checked at the PSE's minimum voltage for the type (44 / 50 / 50 / 52 V). */
  readonly pseVoltageMinV: number;
  readonly pdVoltageMinV: number;
  readonly atClassPower: CableAtClassPower;
  readonly atExpectedLoad: CableAtExpectedLoad;
}

export interface CablePassiveCheck {
  readonly volts: number;
  readonly currentA: number;
  readonly dropV: number;
  readonly deviceVolts: number;
  readonly dropFraction: number;
}

export interface CableRunEvaluation {
  readonly deviceId: string;
  /** The captured run, taken as the permanent link (m). */
  readonly lengthM: number;
  readonly cordAllowanceM: number;
  /** Permanent link + cords (m). */
  readonly channelM: number;
  readonly category: CableCategory;
  readonly gauge: AwgGauge;
  readonly gaugeAssumed: boolean;
  readonly cca: boolean;
  readonly temperatureC: number;
  readonly conductorOhmPerM: number;
  /** Loop resistance of one pairset over the channel (Ω). */
  readonly loopOhm: number;
  readonly withinPermanentLink: boolean;
  readonly withinChannel: boolean;
  readonly poe: CablePoeCheck | null;
  readonly passive: CablePassiveCheck | null;
  /** PoE (or passive) power can be delivered over this run within the standard. */
  readonly ok: boolean;
  /** Short codes of what is wrong, e.g. "channel_over_100m", "cca", "pd_voltage_low". */
  readonly problems: readonly string[];
}

/** The PoE port a device (or its splitter) needs. */
export interface PoePlan {
  readonly poeClass: PoeClass;
  readonly poeType: PoeType;
  /** "802.3af" | "802.3at" | "802.3bt". */
  readonly standard: string;
  readonly pairs: 2 | 4;
  /** Class power reserved at the PSE (W). */
  readonly reservedW: number;
  /** What the PD draws from the cable (W): device need, or splitter input P_in. */
  readonly pdLoadW: number;
  /** Expected draw at the PSE: PD load + cable loss (W). */
  readonly expectedPseW: number;
  readonly cableLossW: number;
}

export type PlugSpec =
  | { readonly kind: 'barrel'; readonly outerMm: number; readonly innerMm: number; readonly polarity: Polarity; readonly label: string }
  | { readonly kind: 'micro_usb'; readonly label: string }
  | { readonly kind: 'usb_c'; readonly label: string }
  | { readonly kind: 'terminal'; readonly label: string };

export interface SplitterPlan {
  readonly outputVolts: number;
  /** Least current the splitter must supply (A). */
  readonly minAmps: number;
  /** Rating to buy: minAmps rounded up to the next 0.5 A (our grouping convention). */
  readonly ratingAmps: number;
  readonly plug: PlugSpec;
  readonly efficiency: number;
  /** P_in = V × A ÷ efficiency (W): what the splitter draws as a PD. */
  readonly inputW: number;
  readonly poeClass: PoeClass;
  readonly poeType: PoeType;
  /** USB level the splitter output must offer (USB devices only). */
  readonly usbLevel: string | null;
}

export interface OutletPlan {
  /** How the device is fed from the outlet. */
  readonly via: 'adapter' | 'plug' | 'own_passive_injector' | 'transformer' | 'poe_injector';
  /** Where the outlet is: next to the device, or at the closet (passive injectors). */
  readonly location: 'device' | 'closet';
  readonly distanceM: number | null;
  /** Needs a licensed electrician (new mains outlet or transformer). */
  readonly electrician: boolean;
}

export interface DeviceEvaluation {
  readonly deviceId: string;
  readonly name: string;
  readonly kind: DeviceKind;
  readonly roomId: string;
  readonly mustStayUp: boolean;
  readonly recommendation: Recommendation;
  /** "PoE (Class 4, 802.3at port)", "PoE + splitter (12 V · 1.5 A · 5.5×2.1 mm)", … */
  readonly label: string;
  /** The device's own power need (W). */
  readonly needW: number;
  /** The need is a pre-filled typical figure, not read from the device. */
  readonly typicalFigure: boolean;
  readonly poe: PoePlan | null;
  readonly splitter: SplitterPlan | null;
  readonly outlet: OutletPlan | null;
  readonly cable: CableRunEvaluation | null;
  /** Plain-language reasons, for the homeowner. */
  readonly reasons: readonly string[];
  readonly cautions: readonly Caution[];
  readonly warnings: readonly PlanWarning[];
}
