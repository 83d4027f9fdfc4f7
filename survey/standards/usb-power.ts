import { confirmed, type Provenance } from './source-marks';

export interface UsbPowerLevel {
  readonly id: string;
  readonly name: string;
  readonly volts: number;
  readonly amps: number;
  readonly watts: number;
  /** Which connectors carry this level in our model. */
  readonly connectors: readonly ('micro_usb' | 'usb_c')[];
  readonly provenance: Provenance;
}

function level(id: string, name: string, volts: number, amps: number, connectors: readonly ('micro_usb' | 'usb_c')[], provenance: Provenance): UsbPowerLevel {
  return { id, name, volts, amps, watts: volts * amps, connectors, provenance };
}

const common = confirmed(['S52', 'S53v', 'S54v']);
const pd = confirmed(['S52', 'S53v', 'S55v', 'S56']);

/**
 * USB power levels, smallest first (facts §4.2). Micro-USB stops at USB
 * Battery Charging 1.2 (1.5 A); USB-C adds Type-C Current 1.5/3 A and USB PD.
 */
export const USB_POWER_LEVELS: readonly UsbPowerLevel[] = [
  level('usb2', 'USB 2.0 default', 5, 0.5, ['micro_usb', 'usb_c'], common),
  level('usb3', 'USB 3.x default', 5, 0.9, ['usb_c'], common),
  level('bc12', 'USB Battery Charging 1.2', 5, 1.5, ['micro_usb'], common),
  level('typec_1a5', 'USB Type-C Current @1.5 A', 5, 1.5, ['usb_c'], confirmed(['S54v'])),
  level('typec_3a', 'USB Type-C Current @3.0 A', 5, 3.0, ['usb_c'], confirmed(['S54v', 'S53v'], 'S54v prints 7.5 W, a typo; 5 V × 3 A = 15 W')),
  level('pd_9v', 'USB PD 9 V', 9, 3, ['usb_c'], pd),
  level('pd_15v', 'USB PD 15 V', 15, 3, ['usb_c'], pd),
  level('pd_20v_3a', 'USB PD 20 V 3 A', 20, 3, ['usb_c'], pd),
  level('pd_20v_5a', 'USB PD 20 V 5 A (5 A e-marked cable)', 20, 5, ['usb_c'], pd),
];

/**
 * Smallest USB level on `connector` that covers `watts`, using the USB PD power
 * rules for USB-C above 15 W (S56: ≤ 15 W 5 V; 15–27 W 9 V; 27–45 W 15 V; 45–100 W 20 V).
 * Returns null when no USB level covers the load.
 */
export function usbLevelFor(connector: 'micro_usb' | 'usb_c', watts: number): UsbPowerLevel | null {
  for (const l of USB_POWER_LEVELS) {
    if (!l.connectors.includes(connector)) continue;
    if (watts <= l.watts + 1e-9) return l;
  }
  return null;
}
