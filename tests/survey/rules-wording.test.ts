// What the rules say about a device, checked against the published limits they quote.
import * as v from 'valibot';
import { describe, expect, it } from 'vitest';
import { CableRunSchema, demoSite, evaluateCableRun, evaluateDevice, evaluateSite, parseSite, type Site, type SiteInput } from '../../survey/index';
import { demoSiteInput } from '../../survey/demo-site';

function deviceOf(over: Partial<SiteInput['devices'][number]>) {
  const base = demoSiteInput.devices.find((d) => d.id === 'ap-living')!;
  const parsed = parseSite({ ...demoSiteInput, devices: [{ ...base, ...over }] });
  if (!parsed.ok) throw new Error(parsed.errors[0].message);
  return evaluateDevice(parsed.value.devices[0], parsed.value);
}

describe('the cable reason names the class power the device may draw', () => {
  // IEEE 802.3-2022 Table 33-11 / 145-16: Class 4 is 30 W at the PSE and 25.5 W at the PD.
  it('a Class 4 port over a short run: the device can draw its full 25.5 W, never "gets" the port\'s 30 W less the loss', () => {
    const r = evaluateCableRun(v.parse(CableRunSchema, { lengthM: 20, category: 'cat6' }), {
      deviceId: 'd', temperatureC: 20, cordAllowanceM: 5, units: 'metric', poe: { poeClass: 4, poeType: 2, pdLoadW: 20 },
    });
    expect(r.reasons).toHaveLength(1);
    expect(r.reasons[0]).toMatch(/of the port's 30 W, so the device can draw the full 25\.5 W of Class 4, at [0-9.]+ V or more \(it needs at least 42\.5 V\)\./);
    expect(r.reasons[0]).not.toMatch(/still gets/);
  });
});

describe('a run longer than a channel', () => {
  // TIA-568.2-D: a channel is at most 100 m, of which at most 90 m is fixed cable.
  it('says the cords make the channel too long, and does not suggest a thicker cable', () => {
    const e = deviceOf({ input: { type: 'poe', class: 4 }, run: { lengthM: 100, category: 'cat6', cca: false } });
    expect(e.recommendation).toBe('cannot_power');
    const channel = e.warnings.find((w) => w.code === 'channel_over_100m')!;
    expect(channel.severity).toBe('error');
    expect(channel.message).toBe('The cable run is 100 m; with its patch cords the channel is 105 m, longer than the 100 m a network channel may be (at most 90 m of fixed cable plus cords). Put a small switch closer or find a shorter route.');
    expect(e.reasons.join(' ')).toContain('its cable run with patch cords is longer than the 100 m a network channel may be');
    expect(e.reasons.join(' ')).toContain('or a shorter route, would make it work');
    expect(e.reasons.join(' ')).not.toMatch(/thicker/);
  });

  it('a run within the channel that cannot carry the power still points at a thicker cable', () => {
    // 90 m of 26 AWG copper-clad aluminium at Class 8: the loop is far over the 802.3bt 6.25 Ω per pairset budget.
    const e = deviceOf({ input: { type: 'poe', class: 8 }, power: { by: 'watts', watts: 70 }, run: { lengthM: 90, category: 'cat6', gauge: 26, cca: true } });
    expect(e.recommendation).toBe('cannot_power');
    expect(e.reasons.join(' ')).toContain('a shorter or thicker copper cable, would make it work');
  });
});

describe('a device that needs more than its listed class', () => {
  // IEEE 802.3 Class 3: at most 12.95 W at the PD; a PSE may cut off a PD drawing above its class.
  it('is a problem to fix before sign-off, not only a warning', () => {
    const e = deviceOf({ input: { type: 'poe', class: 3 }, power: { by: 'watts', watts: 20 } });
    const w = e.warnings.find((x) => x.code === 'need_above_class')!;
    expect(w.severity).toBe('error');
    expect(w.message).toContain('above the 12.95 W that Class 3 guarantees');
  });
});

describe('articles before a standard\'s number', () => {
  it('"an 802.3bt" port, as it is read aloud', () => {
    const site = { ...demoSite, powerSources: demoSite.powerSources.filter((s) => s.kind !== 'injector') };
    const words = JSON.stringify(evaluateSiteWords(site));
    expect(words).toMatch(/needs an 802\.3bt Type [34] port/);
    expect(words).not.toMatch(/\ba 802\./);
  });
});

function evaluateSiteWords(site: Site): string[] {
  const ev = evaluateSite(site);
  return [...ev.warnings.map((w) => w.message), ...ev.assignment.unassigned.map((u) => u.reason), ...ev.switches.flatMap((s) => [...s.reasons, ...s.suggestions])];
}

describe('a switch planned by expected draw whose classes add up to more than its budget', () => {
  // IEEE 802.3 PSE power per class (Table 33-11 / 145-16): Class 2 = 7 W, 3 = 15.4 W, 4 = 30 W.
  it('warns that a switch setting power aside by class would refuse devices; planned by class it is over budget instead', () => {
    const byExpected = evaluateSite({ ...demoSite, settings: { ...demoSite.settings, budgetBasis: 'expected' } });
    const sw = byExpected.switches.find((s) => s.sourceId === 'sw-closet')!;
    const classSum = sw.rows.reduce((t, r) => t + ({ 0: 15.4, 1: 4, 2: 7, 3: 15.4, 4: 30 } as Record<number, number>)[r.poeClass], 0);
    expect(sw.reservedW).toBeCloseTo(classSum, 6);
    expect(classSum).toBeGreaterThan(sw.budgetW);
    const w = sw.warnings.find((x) => x.code === 'class_reservation_over_budget')!;
    expect(w.severity).toBe('warning');
    expect(w.message).toContain(`its devices' classes add up to ${classSum.toFixed(1).replace(/\.0$/, '')} W, over its ${sw.budgetW} W budget`);
    const byClass = evaluateSite({ ...demoSite, settings: { ...demoSite.settings, budgetBasis: 'class' } });
    expect(byClass.switches.find((s) => s.sourceId === 'sw-closet')!.warnings.map((x) => x.code)).not.toContain('class_reservation_over_budget');
  });
});

describe('a doorbell on its transformer', () => {
  it('is labelled by the transformer it keeps, not by an outlet', () => {
    const e = evaluateSite(demoSite).devices.find((d) => d.deviceId === 'bell-front')!;
    expect(e.outlet?.via).toBe('transformer');
    expect(e.label).toBe('existing transformer');
  });
});

describe('a splitter\'s reason', () => {
  it('names the input it matches in brackets, and for USB the power level it is sized to', () => {
    const drive = evaluateSite(demoSite).devices.find((d) => d.deviceId === 'cam-drive')!;
    expect(drive.reasons).toContain('A PoE splitter next to it turns the cable\'s power into 12 V at 0.5 A or more to match its input (5.5×2.5 mm, polarity unknown).');
    const hub = evaluateSite(demoSite).devices.find((d) => d.deviceId === 'hub-kitchen')!;
    expect(hub.reasons.find((r) => r.startsWith('A PoE splitter'))).toMatch(/to match its input \(USB-C; the USB .+ power level\)\.$/);
  });
});
