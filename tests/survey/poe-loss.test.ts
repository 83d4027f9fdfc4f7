import Qty from 'js-quantities';
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { drawForPdLoad, lossAtPsePower, POE_CLASSES, POE_TYPES } from '../../survey/index';

/**
 * Facts §1.4: every class's PD power follows from the PSE minimum voltage and
 * the standard's worst-case loop (20 Ω Type 1 [CONFIRMED S4], 12.5 Ω per
 * pairset Types 2–4 [CONFIRMED S4 for Type 2, MEMORY for bt]). Rows [DERIVED].
 */
const rows = [
  // class, type, P_PSE, V, R, pairs, I, P_loss, P_PD, V_PD, published PD power
  { c: 0, t: 1, p: 15.4, v: 44, r: 20, pairs: 2, i: 0.35, loss: 2.45, pd: 12.95, vpd: 37.0, pub: 12.95 },
  { c: 3, t: 1, p: 15.4, v: 44, r: 20, pairs: 2, i: 0.35, loss: 2.45, pd: 12.95, vpd: 37.0, pub: 12.95 },
  { c: 1, t: 1, p: 4.0, v: 44, r: 20, pairs: 2, i: 0.0909, loss: 0.165, pd: 3.835, vpd: 42.18, pub: 3.84 },
  { c: 2, t: 1, p: 7.0, v: 44, r: 20, pairs: 2, i: 0.1591, loss: 0.506, pd: 6.494, vpd: 40.82, pub: 6.49 },
  { c: 4, t: 2, p: 30, v: 50, r: 12.5, pairs: 2, i: 0.6, loss: 4.5, pd: 25.5, vpd: 42.5, pub: 25.5 },
  { c: 5, t: 3, p: 45, v: 50, r: 12.5, pairs: 4, i: 0.9, loss: 5.06, pd: 39.94, vpd: 44.375, pub: 40 }, // facts print 44.38 (rounded)
  { c: 6, t: 3, p: 60, v: 50, r: 12.5, pairs: 4, i: 1.2, loss: 9.0, pd: 51.0, vpd: 42.5, pub: 51 },
  { c: 7, t: 4, p: 75, v: 52, r: 12.5, pairs: 4, i: 1.4423, loss: 13.0, pd: 62.0, vpd: 42.99, pub: 62 },
  { c: 8, t: 4, p: 90, v: 52, r: 12.5, pairs: 4, i: 1.7308, loss: 18.72, pd: 71.28, vpd: 41.18, pub: 71.3 },
] as const;

describe('I²R loss at each type\'s minimum voltage and worst-case loop (facts §1.4, DERIVED; method S4)', () => {
  it.each(rows)('Class $c, Type $t: $p W at $v V through $r Ω → $pd W at $vpd V', (row) => {
    // Inputs come from the standards tables, not from the row.
    const cls = POE_CLASSES[row.c];
    const type = POE_TYPES[row.t];
    expect(cls.psePowerW).toBe(row.p);
    expect(type.pseVoltageMinV).toBe(row.v);
    expect(type.loopResistanceOhm).toBe(row.r);
    expect(cls.pairs).toBe(row.pairs);

    const r = lossAtPsePower(cls.psePowerW, type.pseVoltageMinV, type.loopResistanceOhm, cls.pairs);
    expect(r.currentA).toBeCloseTo(row.i, 3);
    expect(r.lossW).toBeCloseTo(row.loss, 2);
    expect(r.pdPowerW).toBeCloseTo(row.pd, 2);
    expect(r.pdVoltageV).toBeCloseTo(row.vpd, 2);
    // …and matches the published PD power of the class (rounded as published).
    expect(Math.abs(r.pdPowerW - row.pub)).toBeLessThanOrEqual(0.07);
    expect(r.pdPowerW).toBeCloseTo(cls.pdMaxW, 0);
    // The PD voltage meets the type's minimum (37 / 42.5 / 42.5 / 41.1 V).
    expect(r.pdVoltageV).toBeGreaterThanOrEqual(type.pdVoltageMinV - 1e-9);
  });

  it('"802.3af tolerates a 2.45 W cable loss" (CONFIRMED S5)', () => {
    expect(lossAtPsePower(15.4, 44, 20, 2).lossW).toBeCloseTo(2.45, 10);
  });

  it('S5 worked example: Cat 6 at 7 Ω per 100 m loop, 350 mA → 0.858 W loss (CONFIRMED S5, arithmetic DERIVED)', () => {
    // 350 mA at 44 V is 15.4 W out of the PSE; loss = I²R = 0.35² × 7.
    const r = lossAtPsePower(0.35 * 44, 44, 7, 2);
    expect(r.lossW).toBeCloseTo(0.8575, 4);
    expect(44 - r.pdVoltageV).toBeCloseTo(2.45, 6);
  });

  it('the inverse formula recovers the PSE power from the PD load (DERIVED)', () => {
    for (const row of rows) {
      const fwd = lossAtPsePower(row.p, row.v, row.r, row.pairs);
      const inv = drawForPdLoad(fwd.pdPowerW, row.v, row.r, row.pairs);
      expect(inv.feasible).toBe(true);
      expect(inv.psePowerW).toBeCloseTo(row.p, 9);
      expect(inv.currentA).toBeCloseTo(fwd.currentA, 9);
      expect(inv.pdVoltageV).toBeCloseTo(fwd.pdVoltageV, 9);
    }
  });

  it('a load beyond V²/4R is reported infeasible without NaN', () => {
    const r = drawForPdLoad(100, 44, 20, 2); // V²/4R = 24.2 W
    expect(r.feasible).toBe(false);
    expect(r.maxDeliverableW).toBeCloseTo(24.2, 6);
    for (const x of [r.currentA, r.lossW, r.psePowerW, r.pdVoltageV]) expect(Number.isFinite(x)).toBe(true);
  });

  it('Class 8 per-conductor current 0.433 A is within the 0.5 A NEC 725.144 anchor (DERIVED §2.3; S26v)', () => {
    const r = lossAtPsePower(90, 52, 12.5, 4);
    expect(r.currentPerPairsetA / 2).toBeCloseTo(0.433, 3);
    expect(r.currentPerPairsetA).toBeLessThanOrEqual(POE_TYPES[4].maxCurrentPerPairsetA);
  });
});

describe('cross-check of the loss arithmetic with independent unit libraries (facts §8)', () => {
  it('mathjs: (0.35 A)² × 20 Ω = 2.45 W; 15.4 W / 44 V = 350 mA', () => {
    const ours = lossAtPsePower(15.4, 44, 20, 2);
    expect(evaluate('(0.35 A)^2 * 20 ohm').toNumber('W')).toBeCloseTo(ours.lossW, 9);
    expect(evaluate('15.4 W / 44 V').toNumber('mA')).toBeCloseTo(ours.currentA * 1000, 9);
  });
  it('js-quantities: 0.35 A × 44 V = 15.4 W; 0.35 A × 0.35 A × 20 Ω = 2.45 W', () => {
    const ours = lossAtPsePower(15.4, 44, 20, 2);
    expect(Qty('0.35 A').mul(Qty('44 V')).to('W').scalar).toBeCloseTo(ours.psePowerW, 9);
    expect(Qty('0.35 A').mul(Qty('0.35 A')).mul(Qty('20 ohm')).to('W').scalar).toBeCloseTo(ours.lossW, 9);
  });
  it('mathjs: Class 8 4-pair loss = 2 × (I/2)² × R', () => {
    const ours = lossAtPsePower(90, 52, 12.5, 4);
    const m = evaluate('2 * ((90 W / 52 V) / 2)^2 * 12.5 ohm').toNumber('W');
    expect(m).toBeCloseTo(ours.lossW, 9);
    expect(m).toBeCloseTo(18.72, 2);
  });
});
