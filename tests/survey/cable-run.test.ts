import { describe, expect, it } from 'vitest';
import { AWG_TABLE, CABLE_CATEGORY_VALUES, CableRunSchema, evaluateCableRun, type CableRunOptions } from '../../survey/index';
import * as v from 'valibot';

const run = (x: Record<string, unknown>) => v.parse(CableRunSchema, { category: 'cat6', ...x });
const opts = (over: Partial<CableRunOptions> = {}): CableRunOptions => ({
  deviceId: 'd', temperatureC: 20, cordAllowanceM: 5, units: 'metric', ...over,
});

describe('channel length (S15, S16, S17): the captured run is the permanent link, plus a 5 m cord allowance (PRACTICE)', () => {
  it('90 m link + 5 m cords = 95 m channel, within both limits', () => {
    const r = evaluateCableRun(run({ lengthM: 90 }), opts()).evaluation;
    expect(r).toMatchObject({ channelM: 95, withinPermanentLink: true, withinChannel: true, ok: true });
  });
  it('95 m link: channel 100 m still fits, the link is out of spec (warning)', () => {
    const r = evaluateCableRun(run({ lengthM: 95 }), opts());
    expect(r.evaluation).toMatchObject({ channelM: 100, withinPermanentLink: false, withinChannel: true });
    expect(r.warnings.map((w) => [w.code, w.severity])).toEqual([['link_over_90m', 'warning']]);
  });
  it('96 m link: the 101 m channel is over 100 m (error, not ok)', () => {
    const r = evaluateCableRun(run({ lengthM: 96 }), opts());
    expect(r.evaluation).toMatchObject({ channelM: 101, withinChannel: false, ok: false });
    expect(r.warnings[0]).toMatchObject({ code: 'channel_over_100m', severity: 'error' });
  });
  it('the cord allowance is a site setting', () => {
    expect(evaluateCableRun(run({ lengthM: 90 }), opts({ cordAllowanceM: 10 })).evaluation.channelM).toBe(100);
  });
});

describe('loop resistance from gauge, length and temperature (S18, α = 0.00393)', () => {
  it('Cat 5e defaults to 24 AWG: 95 m → 8.00 Ω per pairset', () => {
    const r = evaluateCableRun(run({ lengthM: 90, category: 'cat5e' }), opts()).evaluation;
    expect(r).toMatchObject({ gauge: 24, gaugeAssumed: true });
    expect(r.loopOhm).toBeCloseTo(95 * AWG_TABLE[24].ohmPerM, 3);
  });
  it('a stated gauge wins; Cat 6 and 6A default to 23 AWG (S17)', () => {
    expect(evaluateCableRun(run({ lengthM: 10, gauge: 22 }), opts()).evaluation).toMatchObject({ gauge: 22, gaugeAssumed: false });
    for (const c of CABLE_CATEGORY_VALUES.filter((x) => x !== 'cat5e')) {
      expect(evaluateCableRun(run({ lengthM: 10, category: c }), opts()).evaluation.gauge).toBe(23);
    }
  });
  it('at 60 °C the resistance is 1.1572 × the 20 °C value', () => {
    const cold = evaluateCableRun(run({ lengthM: 50 }), opts()).evaluation.loopOhm;
    const hot = evaluateCableRun(run({ lengthM: 50 }), opts({ temperatureC: 60 })).evaluation.loopOhm;
    expect(hot / cold).toBeCloseTo(1 + 0.00393 * 40, 3);
  });
  it('CCA: 1.54 × copper and flagged non-compliant (S29, S30v; DERIVED)', () => {
    const cu = evaluateCableRun(run({ lengthM: 50 }), opts()).evaluation.loopOhm;
    const r = evaluateCableRun(run({ lengthM: 50, cca: true }), opts());
    expect(r.evaluation.loopOhm / cu).toBeCloseTo(1.54, 3);
    expect(r.evaluation.problems).toContain('cca');
    expect(r.warnings.find((w) => w.code === 'cca_cable')!.severity).toBe('error');
    expect(r.cautions.map((c) => c.id)).toContain('no_cca');
  });
  it('26 AWG in a fixed run is flagged as patch-cord wire', () => {
    expect(evaluateCableRun(run({ lengthM: 20, gauge: 26 }), opts()).evaluation.problems).toContain('thin_gauge');
  });
});

describe('PoE over the run, at the PSE minimum voltage', () => {
  it('Class 4 over 95 m of Cat 6 still gets 25.5 W and ≥ 42.5 V', () => {
    const r = evaluateCableRun(run({ lengthM: 90 }), opts({ poe: { poeClass: 4, poeType: 2, pdLoadW: 25.5 } })).evaluation;
    expect(r.poe!.pseVoltageMinV).toBe(50);
    expect(r.poe!.atClassPower.currentA).toBeCloseTo(0.6, 6);
    expect(r.poe!.atClassPower.lossW).toBeCloseTo(0.36 * r.loopOhm, 2);
    expect(r.poe!.atClassPower.meetsClassPower).toBe(true);
    expect(r.poe!.atClassPower.pdVoltageV).toBeGreaterThan(42.5);
    expect(r.ok).toBe(true);
  });
  it('Class 8 uses 4 pairs: per-conductor current is a quarter of the total', () => {
    const r = evaluateCableRun(run({ lengthM: 50 }), opts({ poe: { poeClass: 8, poeType: 4, pdLoadW: 60 } })).evaluation;
    expect(r.poe!.pairs).toBe(4);
    expect(r.poe!.atClassPower.currentPerConductorA).toBeCloseTo(90 / 52 / 4, 4);
  });
  it('Type 3/4 runs get the bundling caution (TSB-184-A) and a Cat 6A note; > 60 W the NEC 725.144 note', () => {
    const r = evaluateCableRun(run({ lengthM: 30 }), opts({ poe: { poeClass: 7, poeType: 4, pdLoadW: 55 } }));
    expect(r.cautions.map((c) => c.id)).toContain('bundling');
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['cat6a_recommended', 'nec_725_144']));
    const t2 = evaluateCableRun(run({ lengthM: 30 }), opts({ poe: { poeClass: 4, poeType: 2, pdLoadW: 20 } }));
    expect(t2.cautions.map((c) => c.id)).not.toContain('bundling');
    const c6 = evaluateCableRun(run({ lengthM: 30 }), opts({ poe: { poeClass: 6, poeType: 3, pdLoadW: 45 } }));
    expect(c6.warnings.map((w) => w.code)).not.toContain('nec_725_144'); // 60 W is not > 60 W
  });
  it('a Class 1 PD on Type 1 at the standard\'s worst case (20 Ω) gets ≥ 37 V', () => {
    // 100 m CCA 24 AWG at 20 °C ≈ 12.97 Ω — still inside Type 1's 20 Ω, so Class 1 works.
    const r = evaluateCableRun(run({ lengthM: 95, category: 'cat5e', cca: true }), opts({ poe: { poeClass: 1, poeType: 1, pdLoadW: 3.84 } })).evaluation;
    expect(r.poe!.atClassPower.pdVoltageV).toBeGreaterThan(37);
    expect(r.ok).toBe(true);
  });
});
