import { describe, expect, it } from 'vitest';
import { itemsOfSite, type SiteItem } from '../../survey/capture';
import { demoSite, demoSiteInput } from '../../survey/demo-site';
import { evaluateSite } from '../../survey/rules/evaluate-site';
import { walkAdvice } from '../../survey/walk/advice';
import { describeValue, fieldWord, heldFieldWords, heldNotice } from '../../survey/walk/describe';
import { adviceWaitsFor, checkDeviceForm, deviceToForm, devicePatch, draftData, formToFields, parseNumber } from '../../survey/walk/device-form';
import { nextFreeName } from '../../survey/walk/words';

const demoItems: SiteItem[] = itemsOfSite(demoSiteInput).map((i) => ({ ...i, siteId: 's', deleted: false, version: 1 }));
const device = (id: string) => demoItems.find((i) => i.id === id)!.data;

describe('the device form', () => {
  it('every demo device survives a round trip through the form unchanged', () => {
    for (const d of demoSiteInput.devices) {
      const form = deviceToForm(device(d.id), 'metric');
      const check = checkDeviceForm(form, 'metric');
      expect(check.errors, d.id).toEqual({});
      const { id: _id, sourceId: _s, port: _p, ...stored } = d as Record<string, unknown>; // the form does not pin ports
      const fields = Object.fromEntries(Object.entries(check.fields).filter(([, value]) => value !== null));
      const expected: Record<string, unknown> = { mustStayUp: false, outdoor: false, ...stored };
      if (expected.power) expected.power = { typical: false, ...(expected.power as object) };
      if (expected.run) expected.run = { cca: false, ...(expected.run as object) };
      if ((expected.input as { type: string }).type === 'terminal_block') expected.input = { current: 'dc', ...(expected.input as object) };
      expect(fields, d.id).toEqual(expected);
    }
  });

  it('shows and takes lengths in feet on an imperial site, and stores metres', () => {
    const form = deviceToForm(device('ap-living'), 'imperial');
    expect(form.runLength).toBe('52.49');
    expect(devicePatch(form, form, 'imperial').patch).toEqual({}); // untouched: nothing re-sent, nothing rounded
    const edited = { ...form, runLength: '50', outletDistance: '3' };
    const { patch } = devicePatch(form, edited, 'imperial');
    expect(patch).toEqual({ run: { lengthM: 15.24, category: 'cat6', cca: false }, outletDistanceM: 0.914 });
  });

  it('accepts a decimal comma and refuses text that is not a number', () => {
    expect(parseNumber(' 12,5 ')).toBe(12.5);
    expect(parseNumber('')).toBeUndefined();
    expect(parseNumber('12 W')).toBeNaN();
  });

  it('marks bad fields with the schema messages and still saves the good ones', () => {
    const form = deviceToForm(device('cam-garage'), 'metric');
    const edited = { ...form, volts: 'twelve', mount: 'ceiling' as const, runLength: '-4' };
    const { patch, check, held } = devicePatch(form, edited, 'metric');
    expect(patch).toEqual({ mount: 'ceiling' });
    expect(held.sort()).toEqual(['power', 'run']);
    expect(check.errors.volts).toEqual(['Adapter voltage must be a number']);
    expect(check.errors.runLength).toEqual(['Cable run cannot be negative (got -4 m)']);
  });

  it('counts the entries marked on screen, not the stored fields they belong to', () => {
    const form = deviceToForm(device('cam-garage'), 'metric');
    // Two bad adapter figures are one stored field (power) but two marked inputs.
    const edited = { ...form, volts: 'twelve', amps: '-1', mount: 'ceiling' as const };
    const { held, marked, check } = devicePatch(form, edited, 'metric');
    expect(held).toEqual(['power']);
    expect(Object.keys(check.errors).filter((k) => (check.errors[k as keyof typeof check.errors]?.length ?? 0) > 0).sort()).toEqual(['amps', 'volts']);
    expect(marked).toEqual(['Adapter volts', 'Adapter amps']);
    const notice = heldNotice(held, marked, true);
    expect(notice.title).toBe('2 entries need fixing');
    expect(notice.text).toBe('Fix Adapter volts and Adapter amps (marked in the form). Until then the power need (its figure and how it is printed are saved together) is not saved; what you typed is still here. The other fields are saved on this phone.');
    expect(heldNotice(['run'], ['Cable run to the closet'], false).title).toBe('One entry needs fixing');
  });

  it('speaks feet as well when an imperial length is refused', () => {
    const form = deviceToForm(device('ap-living'), 'imperial');
    const { check } = devicePatch(form, { ...form, runLength: '4000' }, 'imperial');
    expect(check.errors.runLength).toEqual(['Cable run of 1219.2 m is too large (at most 1000 m; the PoE channel limit is 100 m) — you typed 4000 ft = 1219.2 m.']);
  });

  it('asks for what a choice needs: a category with a run length, a polarity with a barrel', () => {
    const form = deviceToForm({ kind: 'camera', name: 'Shed camera', roomId: 'r' }, 'metric');
    const check = checkDeviceForm({ ...form, runLength: '12', inputType: 'dc_barrel', barrelOuter: '5.5', barrelInner: '2.1', barrelVolts: '12' }, 'metric');
    // A part left out is asked for in the words of its input, not the schema's "This field is required.".
    expect(check.errors.runCategory).toEqual(['Choose its cable category (Cat 5e, Cat 6 or Cat 6A): a run is saved with its length and category together.']);
    expect(check.errors.polarity).toEqual(['Choose the plug\'s polarity, or "Not marked" when nothing says.']);
    const sizes = checkDeviceForm({ ...form, inputType: 'dc_barrel', barrelOuter: '5.5', barrelInner: '2.2', polarity: 'centre_positive', barrelVolts: '12' }, 'metric');
    expect(sizes.errors.barrelInner?.[0]).toMatch(/^5\.5×2\.2 mm is not a barrel size we know/);
    const poe = checkDeviceForm({ ...form, inputType: 'poe', poeClass: '4', poeStandard: 'af' }, 'metric');
    expect(poe.errors.poeClass).toEqual(['Class 4 needs 802.3at; a device that says 802.3af cannot be Class 4']);
  });

  it('clears a field the surveyor empties, and never clears the name', () => {
    const form = deviceToForm(device('hub-hall'), 'metric');
    expect(devicePatch(form, { ...form, outletDistance: '' }, 'metric').patch).toEqual({ outletDistanceM: null });
    const noName = devicePatch(form, { ...form, name: ' ' }, 'metric');
    expect(noName.patch).toEqual({});
    expect(noName.check.errors.name).toEqual(['Give it a name']);
  });

  it('the live draft keeps stored values where the form is not valid yet', () => {
    const stored = device('hub-hall');
    const form = deviceToForm(stored, 'metric');
    const draft = draftData(stored, { ...form, amps: 'x', outletDistance: '3' }, 'metric');
    expect(draft.power).toEqual(stored.power);
    expect(draft.outletDistanceM).toBe(3);
    expect(formToFields({ ...form, notes: '' }, 'metric').notes).toBeNull();
  });
});

describe('the instant advice', () => {
  it('gives every demo device the same recommendation as the desk', () => {
    const advice = walkAdvice({ id: demoSite.id, name: demoSite.name, closetRoomId: demoSite.closetRoomId, units: 'metric' }, demoItems);
    const desk = evaluateSite(demoSite);
    expect(advice.byDevice.size).toBe(desk.devices.length);
    for (const d of desk.devices) expect(advice.byDevice.get(d.deviceId)?.label, d.deviceId).toBe(d.label);
    expect(advice.cautions.map((c) => c.id)).toContain('mains_electrician');
  });

  it('leaves incomplete devices out, and sets aside a device that breaks a site-wide check', () => {
    const items: SiteItem[] = [
      ...demoItems,
      { id: 'new-cam', siteId: 's', kind: 'device', data: { kind: 'camera', name: 'New camera', roomId: 'rm-hall' }, deleted: false, version: 0 },
      { id: 'pinned', siteId: 's', kind: 'device', data: { ...device('ap-living'), id: 'pinned', sourceId: 'sw-closet', port: 99 }, deleted: false, version: 0 },
    ];
    const advice = walkAdvice({ id: 's', name: 'S', closetRoomId: 'rm-closet', units: 'imperial' }, items);
    expect(advice.byDevice.has('new-cam')).toBe(false);
    expect(advice.byDevice.has('pinned')).toBe(false);
    expect(advice.refused.get('pinned')).toMatch(/Port 99 does not exist/);
    expect(advice.byDevice.get('hub-hall')?.reasons.join(' ')).toMatch(/ft/);
  });

  it('describes values for notices in the site units', () => {
    expect(describeValue('power', { by: 'adapter', volts: 12, amps: 1.5 }, 'metric')).toBe('12 V × 1.5 A');
    expect(describeValue('run', { lengthM: 30.48, category: 'cat6a', cca: true }, 'imperial')).toBe('100 ft of Cat 6A, CCA');
    expect(describeValue('notes', 'behind the fridge', 'metric')).toBe('“behind the fridge”');
    expect(describeValue('outletDistanceM', null, 'metric')).toBe('nothing');
  });
});

describe('names', () => {
  it('numbers a room type already taken', () => {
    expect(nextFreeName('Kitchen', ['Hall'])).toBe('Kitchen');
    expect(nextFreeName('Bedroom', ['Bedroom', 'bedroom 2'])).toBe('Bedroom 3');
  });
});

describe('the live advice of the device form', () => {
  it('waits while a changed field does not pass, rather than advising from the stored values', () => {
    const initial = deviceToForm(device('ap-living'), 'metric'); // stored as native PoE, Class 4
    expect(adviceWaitsFor(initial, initial, 'metric')).toEqual([]);
    const passive = { ...initial, inputType: 'passive_poe' as const, passiveVolts: '' };
    const waiting = adviceWaitsFor(initial, passive, 'metric');
    expect(waiting.length).toBeGreaterThan(0);
    expect(waiting.join(' ')).toMatch(/volt/i);
    // The stored input would still read as native PoE: that is the advice the form must not show.
    expect((draftData(device('ap-living'), passive, 'metric').input as { type: string }).type).toBe('poe');
    expect(adviceWaitsFor(initial, { ...initial, watts: '-5' }, 'metric').join(' ')).toMatch(/power|watt/i);
    expect(adviceWaitsFor(initial, { ...passive, passiveVolts: '24' }, 'metric')).toEqual([]);
  });
});

describe('a held field in words', () => {
  it('says which parts wait together with it', () => {
    expect(heldFieldWords('run')).toBe('cable run (its length, category, gauge and copper-clad aluminium are saved together)');
    expect(heldFieldWords('name')).toBe(fieldWord('name'));
  });
});
