import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sortForPlacement } from '../../survey/rules/assign-ports';
import { DevicePlan } from '../../survey/rules/device-plan';
import { SitePlan } from '../../survey/rules/site-plan';
import type { Device } from '../../survey/index';

/**
 * The order of automatic port placement (assign-ports.ts, step 2): critical devices first,
 * then the larger demand, then site order. Three ways of sorting are used depending on the
 * demands (buckets, packed numeric keys, a comparator); each must give the plain comparator's order.
 */

function planWith(critical: readonly boolean[]): SitePlan {
  const plan = new SitePlan(critical.length, false);
  const p = new DevicePlan();
  critical.forEach((c, i) => plan.store(i, p, { mustStayUp: c } as Device));
  return plan;
}

function reference(auto: readonly number[], critical: readonly boolean[], demand: Float64Array): number[] {
  return auto.slice().sort((a, b) => (Number(critical[b]) - Number(critical[a])) || (demand[b] - demand[a]) || (a - b));
}

// Up to 300 devices (size 'max': fast-check's default would keep arrays short, under the 32 buckets).
const site = (demand: fc.Arbitrary<number>) => fc.array(fc.record({ critical: fc.boolean(), demand, auto: fc.boolean() }), { maxLength: 300, size: 'max' });

describe('automatic placement order', () => {
  const check = (rows: { critical: boolean; demand: number; auto: boolean }[]) => {
    const critical = rows.map((r) => r.critical);
    const demand = Float64Array.from(rows.map((r) => r.demand));
    const auto = rows.flatMap((r, i) => (r.auto ? [i] : []));
    const expected = reference(auto, critical, demand);
    sortForPlacement(auto, planWith(critical), demand);
    expect(auto).toEqual(expected);
  };

  it('deals a few distinct demands (class powers) into buckets in the comparator order', () => {
    // The PSE powers of Classes 0–8 (IEEE 802.3bt Table 145-16), the reservations on a class basis.
    fc.assert(fc.property(site(fc.constantFrom(15.4, 4, 7, 15.4, 30, 45, 60, 75, 90)), check), { numRuns: 200 });
  });

  it('packs many distinct whole-milliwatt demands into numeric keys in the comparator order', () => {
    fc.assert(fc.property(site(fc.integer({ min: 0, max: 100_000 }).map((mW) => mW / 1000)), check), { numRuns: 200 });
  });

  it('does not pack demands a hair off a whole milliwatt (results passed in need not be rounded)', () => {
    const nearMilliwatts = fc.tuple(fc.integer({ min: 0, max: 200 }), fc.constantFrom(0, 0, 1e-10, -1e-10))
      .map(([mW, off]) => Math.max(0, mW / 1000 + off));
    fc.assert(fc.property(site(nearMilliwatts), check), { numRuns: 300 });
  });

  it('falls back to comparing for demands finer than a milliwatt', () => {
    fc.assert(fc.property(site(fc.double({ min: 0, max: 100, noNaN: true })), check), { numRuns: 200 });
  });
});
