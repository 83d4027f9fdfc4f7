import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  assignPorts, conductorOhmPerM, drawForPdLoad, evaluateCableRun, evaluateDevice, evaluateSite, lossAtPsePower,
  parseDevice, POE_CLASSES, POE_TYPES, sourceBudgetW, type PoeClass,
} from '../../survey/index';
import { allFinite, deviceArb, siteArb } from './arbitraries';

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
const pairsArb = fc.constantFrom(2 as const, 4 as const);
const classArb = fc.constantFrom(...([0, 1, 2, 3, 4, 5, 6, 7, 8] as PoeClass[]));

describe('properties (fast-check)', () => {
  it('P_device + P_loss = P_source, both directions', () => {
    fc.assert(fc.property(num(0.1, 100), num(44, 57), num(0, 25), pairsArb, (p, v, r, pairs) => {
      const fwd = lossAtPsePower(p, v, r, pairs);
      expect(fwd.pdPowerW + fwd.lossW).toBeCloseTo(p, 9);
      expect(fwd.pdVoltageV * fwd.currentA).toBeCloseTo(fwd.pdPowerW, 9);
      const inv = drawForPdLoad(p, v, r, pairs);
      if (inv.feasible) {
        expect(inv.psePowerW).toBeCloseTo(p + inv.lossW, 9);
        expect(v * inv.currentA).toBeCloseTo(inv.psePowerW, 7);
        expect(inv.pdVoltageV * inv.currentA).toBeCloseTo(p, 7);
      }
    }));
  });

  it('loss is monotone non-decreasing in cable length (class power and expected load)', () => {
    fc.assert(fc.property(
      num(0.01, 1000), num(0.01, 1000), fc.constantFrom(22, 23, 24, 26 as const), fc.boolean(), num(-40, 60), classArb, num(0.1, 1),
      (a, b, gauge, cca, temp, cls, share) => {
        const [short, long] = a <= b ? [a, b] : [b, a];
        const spec = POE_CLASSES[cls];
        const o = { deviceId: 'd', temperatureC: temp, cordAllowanceM: 5, units: 'metric' as const, poe: { poeClass: cls, poeType: spec.minType, pdLoadW: spec.pdMaxW * share } };
        const run = (lengthM: number) => evaluateCableRun({ lengthM, category: 'cat6', cca, gauge: gauge as 22 }, o).evaluation.poe!;
        const s = run(short);
        const l = run(long);
        expect(l.atClassPower.lossW).toBeGreaterThanOrEqual(s.atClassPower.lossW);
        expect(l.atClassPower.pdVoltageV).toBeLessThanOrEqual(s.atClassPower.pdVoltageV);
        if (l.atExpectedLoad.feasible) expect(l.atExpectedLoad.lossW).toBeGreaterThanOrEqual(s.atExpectedLoad.lossW);
        // Unrounded check of the same thing.
        const rS = conductorOhmPerM(gauge as 22, temp, cca) * (short + 5);
        const rL = conductorOhmPerM(gauge as 22, temp, cca) * (long + 5);
        const v = POE_TYPES[spec.minType].pseVoltageMinV;
        expect(lossAtPsePower(spec.psePowerW, v, rL, spec.pairs).lossW).toBeGreaterThanOrEqual(lossAtPsePower(spec.psePowerW, v, rS, spec.pairs).lossW);
      },
    ));
  });

  it('V_PD ≥ the type minimum and P_PD ≥ the class maximum at ≤ 100 m with the standard\'s worst-case loop', () => {
    fc.assert(fc.property(classArb, num(0, 100), (cls, lengthM) => {
      const spec = POE_CLASSES[cls];
      const type = POE_TYPES[spec.minType];
      // The standard's loop budget is for 100 m; a shorter channel has proportionally less.
      const loop = type.loopResistanceOhm * (lengthM / 100);
      const r = lossAtPsePower(spec.psePowerW, type.pseVoltageMinV, loop, spec.pairs);
      expect(r.pdVoltageV).toBeGreaterThanOrEqual(type.pdVoltageMinV - 1e-9);
      // Published PD maxima are rounded (3.84, 6.49, 40): allow the rounding.
      expect(r.pdPowerW).toBeGreaterThanOrEqual(spec.pdMaxW - 0.07);
    }));
  });

  it('any solid-copper 22–24 AWG channel ≤ 100 m up to 60 °C carries full class power', () => {
    fc.assert(fc.property(classArb, num(0.01, 95), fc.constantFrom(22, 23, 24 as const), num(-40, 60), (cls, lengthM, gauge, temp) => {
      const spec = POE_CLASSES[cls];
      const e = evaluateCableRun({ lengthM, category: 'cat6', cca: false, gauge: gauge as 22 }, {
        deviceId: 'd', temperatureC: temp, cordAllowanceM: 5, units: 'metric', poe: { poeClass: cls, poeType: spec.minType, pdLoadW: spec.pdMaxW },
      }).evaluation;
      expect(e.ok).toBe(true);
    }));
  });

  it('never NaN for any valid device', () => {
    fc.assert(fc.property(deviceArb('d', ['room'], []), fc.boolean(), (input, imperial) => {
      const r = parseDevice(input);
      fc.pre(r.ok);
      if (!r.ok) return;
      const settings = { units: imperial ? 'imperial' as const : 'metric' as const, planningCeiling: 0.8, splitterEfficiency: 0.85, cableTemperatureC: 20, cordAllowanceM: 5, nearOutletM: 1.5, budgetBasis: 'class' as const };
      const e = evaluateDevice(r.value, { settings });
      expect(allFinite(e)).toBeNull();
      expect(JSON.stringify(e)).not.toMatch(/NaN|Infinity/);
      expect(e.reasons.length).toBeGreaterThan(0);
      for (const s of e.reasons) expect(s).not.toMatch(/NaN|undefined|Infinity/);
    }), { numRuns: 500 });
  });

  it('never NaN for any valid site, and the evaluation is JSON-stable', () => {
    fc.assert(fc.property(siteArb(), (site) => {
      const e = evaluateSite(site);
      expect(allFinite(e)).toBeNull();
      expect(JSON.parse(JSON.stringify(e))).toEqual(e);
      const texts = [...e.warnings.map((w) => w.message), ...e.devices.flatMap((d) => d.reasons), ...e.outage.devices.map((d) => d.reason)];
      for (const t of texts) expect(t).not.toMatch(/NaN|undefined|Infinity/);
      const sum = Object.values(e.summary.byRecommendation).reduce((n, x) => n + x, 0);
      expect(sum).toBe(site.devices.length);
    }), { numRuns: 200 });
  });

  it('assignment never exceeds budget, planning ceiling or port count, and respects port types', () => {
    fc.assert(fc.property(siteArb({ pins: false }), (site) => {
      const evals = site.devices.map((d) => evaluateDevice(d, site));
      const a = assignPorts(site, evals);
      const byClass = site.settings.budgetBasis === 'class';
      for (const src of site.powerSources) {
        if (src.kind === 'outlet') continue;
        const mine = a.placements.filter((p) => p.sourceId === src.id);
        const ports = src.kind === 'poe_switch' ? src.poePorts : src.ports;
        expect(mine.length).toBeLessThanOrEqual(ports);
        expect(new Set(mine.map((p) => p.port)).size).toBe(mine.length);
        for (const p of mine) {
          expect(p.port).toBeGreaterThanOrEqual(1);
          expect(p.port).toBeLessThanOrEqual(ports);
          const d = evals.find((e) => e.deviceId === p.deviceId)!;
          expect(d.poe!.poeType).toBeLessThanOrEqual(src.poeType);
        }
        const load = mine.reduce((n, p) => n + (byClass ? p.reservedW : p.expectedPseW), 0);
        const budget = sourceBudgetW(src);
        const limit = src.kind === 'poe_switch' ? budget * site.settings.planningCeiling : budget;
        expect(load).toBeLessThanOrEqual(limit + 1e-6);
        expect(load).toBeLessThanOrEqual(budget + 1e-6);
      }
      // Every PoE device is either placed once or listed as unassigned, never both.
      const placed = new Set(a.placements.map((p) => p.deviceId));
      const un = new Set(a.unassigned.map((u) => u.deviceId));
      for (const e of evals) {
        if (e.poe === null) expect(placed.has(e.deviceId) || un.has(e.deviceId)).toBe(false);
        else expect(placed.has(e.deviceId) !== un.has(e.deviceId)).toBe(true);
      }
    }), { numRuns: 300 });
  });

  it('assignment keeps hand pins: a device pinned to a source lands there or is unassigned with a pin reason', () => {
    fc.assert(fc.property(siteArb({ pins: true }), (site) => {
      const a = assignPorts(site);
      const bySource = new Map(site.powerSources.map((s) => [s.id, s]));
      for (const d of site.devices) {
        const src = d.sourceId === undefined ? undefined : bySource.get(d.sourceId);
        if (src === undefined || src.kind === 'outlet') continue;
        const p = a.placements.find((x) => x.deviceId === d.id);
        const u = a.unassigned.find((x) => x.deviceId === d.id);
        if (p) expect(p.sourceId).toBe(src.id);
        if (u) expect(['pinned_type_too_low', 'pinned_source_full']).toContain(u.code);
      }
    }), { numRuns: 200 });
  });
});
