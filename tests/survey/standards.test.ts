import { describe, expect, it } from 'vitest';
import {
  AWG_TABLE, awgDiameterMm, BARREL_SIZES, CCA_RESISTANCE_FACTOR, CHANNEL_LIMITS, classForPdPower,
  conductorOhmPerMFromDiameter, COPPER_ALPHA_PER_C, CAUTIONS, DEFAULT_GAUGE, findBarrelSize, pairsetLoopOhm,
  PLANNING, POE_CLASSES, POE_TYPES, resistanceAtTemperature, SITE_CAUTION_IDS, TSB_184_A, TYPE4_PTYPE_CEILING_W,
  USB_POWER_LEVELS, usbLevelFor, NEC_725_144_THRESHOLD_W, TYPICAL_DEVICE_WATTS,
} from '../../survey/index';

describe('PoE classes 0–8 (facts §1.3)', () => {
  // [CONFIRMED] S3v, S6, S7, S11v (classes 0–4); S3v, S6, S7, S9 (5–8); Class 8 S7, S8, S9.
  const published: [number, number, number][] = [
    [0, 15.4, 12.95], [1, 4.0, 3.84], [2, 7.0, 6.49], [3, 15.4, 12.95], [4, 30, 25.5],
    [5, 45, 40], [6, 60, 51], [7, 75, 62], [8, 90, 71.3],
  ];
  it.each(published)('Class %i: %f W at the PSE, %f W at the PD', (c, pse, pd) => {
    expect(POE_CLASSES[c].psePowerW).toBe(pse);
    expect(POE_CLASSES[c].pdMaxW).toBe(pd);
    expect(POE_CLASSES[c].provenance.power.mark).toBe('CONFIRMED');
  });

  it('Class 8 is 90 W at the PSE — never 99 W or 100 W (S7, S8, S9 vs. the 99 W misprint in S3v, S6)', () => {
    expect(POE_CLASSES[8].psePowerW).toBe(90);
    for (const c of POE_CLASSES) {
      expect(c.psePowerW).not.toBe(99);
      expect(c.psePowerW).not.toBe(100);
      expect(c.pdMaxW).not.toBe(99);
    }
    // 99.9 W is the Type 4 P_Type ceiling [CONFIRMED S2], not a class value.
    expect(TYPE4_PTYPE_CEILING_W).toBe(99.9);
    expect(POE_CLASSES[8].provenance.power.sources).toEqual(['S7', 'S8', 'S9']);
  });

  it('classes 5–8 use four pairs, 0–4 two (S3v, S6; "5–6 need 4" from memory)', () => {
    expect(POE_CLASSES.map((c) => c.pairs)).toEqual([2, 2, 2, 2, 2, 4, 4, 4, 4]);
  });

  it('least type per class: Type 1 for 0–3, Type 2 for 4, Type 3 for 5–6, Type 4 for 7–8 (S6)', () => {
    expect(POE_CLASSES.map((c) => c.minType)).toEqual([1, 1, 1, 1, 2, 3, 3, 4, 4]);
  });

  it('splitter sizing picks the smallest class covering the load (facts §5, DERIVED)', () => {
    expect(classForPdPower(3.84)).toBe(1);
    expect(classForPdPower(3.85)).toBe(2);
    expect(classForPdPower(6.49)).toBe(2);
    expect(classForPdPower(12.95)).toBe(3);
    expect(classForPdPower(12.96)).toBe(4);
    expect(classForPdPower(25.5)).toBe(4);
    expect(classForPdPower(40)).toBe(5);
    expect(classForPdPower(51)).toBe(6);
    expect(classForPdPower(62)).toBe(7);
    expect(classForPdPower(71.3)).toBe(8);
    expect(classForPdPower(71.31)).toBeNull();
  });
});

describe('PoE types 1–4 (facts §1.2)', () => {
  it('PSE and PD power per type (S3v, S7, S8, S9)', () => {
    expect([1, 2, 3, 4].map((t) => POE_TYPES[t as 1].psePowerW)).toEqual([15.4, 30, 60, 90]);
    expect([1, 2, 3, 4].map((t) => POE_TYPES[t as 1].pdPowerW)).toEqual([12.95, 25.5, 51, 71.3]);
  });
  it('PSE minimum voltages 44/50/50/52 V and PD minima 37/42.5/42.5/41.1 V (S3v, S4, S9)', () => {
    expect([1, 2, 3, 4].map((t) => POE_TYPES[t as 1].pseVoltageMinV)).toEqual([44, 50, 50, 52]);
    expect([1, 2, 3, 4].map((t) => POE_TYPES[t as 1].pdVoltageMinV)).toEqual([37, 42.5, 42.5, 41.1]);
    expect([1, 2, 3, 4].map((t) => POE_TYPES[t as 1].pseVoltageMaxV)).toEqual([57, 57, 57, 57]);
  });
  it('current per pairset 350/600/600/960 mA (S3v, S4, S10v)', () => {
    expect([1, 2, 3, 4].map((t) => POE_TYPES[t as 1].maxCurrentPerPairsetA)).toEqual([0.35, 0.6, 0.6, 0.96]);
  });
  it('worst-case loop 20 Ω (Type 1) and 12.5 Ω (Type 2) are CONFIRMED S4; 12.5 Ω for bt is MEMORY', () => {
    expect(POE_TYPES[1].loopResistanceOhm).toBe(20);
    expect(POE_TYPES[2].loopResistanceOhm).toBe(12.5);
    expect(POE_TYPES[1].provenance.loopResistance).toMatchObject({ mark: 'CONFIRMED', sources: ['S4'] });
    expect(POE_TYPES[3].provenance.loopResistance.mark).toBe('MEMORY');
    expect(POE_TYPES[4].provenance.loopResistance.mark).toBe('MEMORY');
  });
  it('standards names per type', () => {
    expect([1, 2, 3, 4].map((t) => POE_TYPES[t as 1].standardName)).toEqual(['802.3af', '802.3at', '802.3bt', '802.3bt']);
  });
});

describe('cabling (facts §2)', () => {
  it('channel 100 m = 90 m permanent link + 10 m cords (S15, S16, S17)', () => {
    expect(CHANNEL_LIMITS).toMatchObject({ channelMaxM: 100, permanentLinkMaxM: 90, cordsMaxM: 10 });
    expect(CHANNEL_LIMITS.permanentLinkMaxM + CHANNEL_LIMITS.cordsMaxM).toBe(CHANNEL_LIMITS.channelMaxM);
    expect(CHANNEL_LIMITS.provenance.sources).toEqual(['S15', 'S16', 'S17']);
  });
  it('default gauges: Cat 5e 24 AWG, Cat 6/6A 23 AWG (S17)', () => {
    expect(DEFAULT_GAUGE).toEqual({ cat5e: 24, cat6: 23, cat6a: 23 });
  });
  it('TSB-184-A: ≤ 24 cables per bundle, 1 A per pair, ≤ 15 °C rise, Cat 6A for new builds (S21, S23v)', () => {
    expect(TSB_184_A).toMatchObject({ maxCablesPerBundle: 24, designCurrentPerPairA: 1, maxTemperatureRiseC: 15, newBuildCategory: 'cat6a' });
  });
  it('NEC Table 725.144 only above 60 W per cable (S26v, S27v)', () => {
    expect(NEC_725_144_THRESHOLD_W).toBe(60);
  });
});

describe('AWG resistance (facts §2.2)', () => {
  // [CONFIRMED] S18 Ω/1000 ft; S19 Ω/km; per-100 m figures [DERIVED].
  it.each([
    [22, 16.14, 5.296], [23, 20.36, 6.68], [24, 25.67, 8.421], [26, 40.81, 13.39],
  ] as const)('%i AWG: %f Ω/kft = %f Ω per 100 m (S18)', (g, kft, per100) => {
    expect(AWG_TABLE[g].ohmPerKft).toBe(kft);
    expect(AWG_TABLE[g].ohmPerM * 100).toBeCloseTo(per100, 2);
  });
  it('S19 Ω/km figures: 22 AWG 52.94, 23 AWG 66.78, 24 AWG 84.2', () => {
    expect(AWG_TABLE[22].ohmPerM * 1000).toBeCloseTo(52.94, 1);
    expect(AWG_TABLE[23].ohmPerM * 1000).toBeCloseTo(66.78, 0);
    expect(AWG_TABLE[24].ohmPerM * 1000).toBeCloseTo(84.2, 1);
  });
  it('ASTM B258 diameter formula (MEMORY) + ρ = 1.724e-8 Ω·m (S18) reproduce the table within 0.05 % (DERIVED)', () => {
    for (const g of [22, 23, 24, 26] as const) {
      const d = awgDiameterMm(g);
      expect(Math.abs(d - AWG_TABLE[g].diameterMm) / AWG_TABLE[g].diameterMm).toBeLessThan(0.0005);
      const r = conductorOhmPerMFromDiameter(d);
      expect(Math.abs(r - AWG_TABLE[g].ohmPerM) / AWG_TABLE[g].ohmPerM).toBeLessThan(0.0005);
    }
  });
  it('24 AWG, 100 m at 60 °C reads 9.74 Ω (DERIVED; α = 0.00393, 0.0039 CONFIRMED S20)', () => {
    expect(COPPER_ALPHA_PER_C).toBe(0.00393);
    const r = resistanceAtTemperature(AWG_TABLE[24].ohmPerM * 100, 60);
    // 8.4219 × 1.1572 = 9.7458; the facts file rounds the factor to 1.157 and prints 9.74.
    expect(Math.abs(r - 9.74)).toBeLessThan(0.01);
  });
  it('loop per pairset ≈ conductor Ω/m × length: 100 m of 24 AWG = 8.42 Ω (DERIVED §2.2)', () => {
    expect(pairsetLoopOhm(AWG_TABLE[24].ohmPerM, 100)).toBeCloseTo(8.42, 2);
  });
  it('CCA is 1.54 × copper, so 100 m of "24 AWG" CCA ≈ 12.97 Ω, over the 12.5 Ω budget (DERIVED from S20; S30v "about 55 %")', () => {
    expect(CCA_RESISTANCE_FACTOR).toBe(1.54);
    const loop = pairsetLoopOhm(AWG_TABLE[24].ohmPerM * CCA_RESISTANCE_FACTOR, 100);
    expect(loop).toBeCloseTo(12.97, 1);
    expect(loop).toBeGreaterThan(POE_TYPES[2].loopResistanceOhm);
    // Physics check: 10 % Cu / 90 % Al cross-section, ρ_Cu 1.72e-8, ρ_Al 2.82e-8 (S20).
    const gCu = 0.1 / 1.72e-8;
    const gAl = 0.9 / 2.82e-8;
    expect(1 / (gCu + gAl) / 1.72e-8).toBeCloseTo(1.54, 2);
  });
});

describe('USB power levels (facts §4.2)', () => {
  it('5 V 0.5 / 0.9 / 1.5 / 3 A = 2.5 / 4.5 / 7.5 / 15 W (S52, S53v, S54v)', () => {
    const byId = Object.fromEntries(USB_POWER_LEVELS.map((l) => [l.id, l]));
    expect(byId.usb2.watts).toBe(2.5);
    expect(byId.usb3.watts).toBe(4.5);
    expect(byId.bc12.watts).toBe(7.5);
    expect(byId.typec_1a5.watts).toBe(7.5);
    expect(byId.typec_3a.watts).toBe(15); // S54v prints 7.5 W — a typo noted in the facts file
    expect(byId.pd_20v_5a.watts).toBe(100);
  });
  it('USB PD power rules: 15–27 W at 9 V, 27–45 W at 15 V, 45–100 W at 20 V (S56)', () => {
    expect(usbLevelFor('usb_c', 14)?.volts).toBe(5);
    expect(usbLevelFor('usb_c', 20)?.volts).toBe(9);
    expect(usbLevelFor('usb_c', 30)?.volts).toBe(15);
    expect(usbLevelFor('usb_c', 50)?.volts).toBe(20);
    expect(usbLevelFor('usb_c', 101)).toBeNull();
    expect(usbLevelFor('micro_usb', 7.5)?.id).toBe('bc12');
    expect(usbLevelFor('micro_usb', 8)).toBeNull();
  });
});

describe('barrel sizes (facts §4.1)', () => {
  it('includes the common and EIAJ sizes; 3.5×1.35 is marked from memory', () => {
    const ids = BARREL_SIZES.map((b) => b.id);
    expect(ids).toEqual(['5.5x2.1', '5.5x2.5', '3.5x1.35', '2.35x0.7', '4.0x1.7', '4.75x1.7', '5.5x3.3', '6.5x4.4']);
    expect(BARREL_SIZES.find((b) => b.id === '3.5x1.35')!.provenance.mark).toBe('MEMORY');
    for (const b of BARREL_SIZES.filter((x) => x.id !== '3.5x1.35')) expect(b.provenance.mark).toBe('CONFIRMED');
  });
  it('EIAJ-04 is 5.5/3.3 mm with a 1.0 mm pin for 10.5–13.5 V (S50)', () => {
    expect(findBarrelSize(5.5, 3.3)).toMatchObject({ pinMm: 1.0, eiaj: { code: 'EIAJ-04', minV: 10.5, maxV: 13.5 } });
  });
  it('5.5×2.1 and 5.5×2.5 are look-alikes (S45v, S46v, S48v); 5.5×3.0 does not exist', () => {
    expect(findBarrelSize(5.5, 2.1)!.lookAlikes).toEqual(['5.5x2.5']);
    expect(findBarrelSize(5.5, 3.0)).toBeUndefined();
  });
});

describe('planning values and cautions carry their marks', () => {
  it('80 % ceiling and 0.85 splitter efficiency are PRACTICE (no standard)', () => {
    expect(PLANNING.planningCeiling).toMatchObject({ value: 0.8, provenance: { mark: 'PRACTICE' } });
    expect(PLANNING.splitterEfficiency).toMatchObject({ value: 0.85, provenance: { mark: 'PRACTICE' } });
    expect(PLANNING.inverterEfficiency).toMatchObject({ value: 0.9, provenance: { mark: 'CONFIRMED', sources: ['S33', 'S35'] } });
    expect(TYPICAL_DEVICE_WATTS.access_point.provenance.mark).toBe('MEMORY');
  });
  it('the site-wide caution list follows facts §7, each with a source tag', () => {
    expect(SITE_CAUTION_IDS).toEqual([
      'local_code', 'mains_electrician', 'cable_rating', 'no_cca', 'mains_separation', 'bundling', 'passive_poe', 'barrel_plug', 'outdoor_runs',
    ]);
    for (const c of Object.values(CAUTIONS)) expect(c.source).toMatch(/\[(CONFIRMED|DERIVED|MEMORY|PRACTICE)\]/);
  });
});
