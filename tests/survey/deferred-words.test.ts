import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { demoSite, evaluateDevice, evaluateSite, parseSite, type Device, type Site } from '../../survey/index';
import { deferredField, deferredList } from '../../survey/rules/deferred-text';
import { generateBenchSite } from '../bench/rules-bench';

/**
 * The rules write their sentences (reasons, warning messages, suggestions) only when they are
 * first read. These tests pin that the words are the same as when they were written eagerly,
 * that deferred lists and records behave like plain ones, and that nothing else changes.
 */

describe('deferred lists', () => {
  it('write their items once, on first use, and then behave like plain arrays', () => {
    let writes = 0;
    const list = deferredList<string>((into) => {
      writes++;
      into.push('a', 'b');
    });
    expect(writes).toBe(0);
    expect(list.length).toBe(2);
    expect(writes).toBe(1);
    expect(list[1]).toBe('b');
    expect([...list]).toEqual(['a', 'b']);
    expect(list.map((s) => s.toUpperCase())).toEqual(['A', 'B']);
    expect(Array.isArray(list)).toBe(true);
    expect(Object.keys(list)).toEqual(['0', '1']);
    expect(JSON.stringify({ list })).toBe('{"list":["a","b"]}');
    expect(list).toEqual(['a', 'b']);
    expect(writes).toBe(1);
  });

  it('can be frozen before they are read', () => {
    const list = Object.freeze(deferredList<string>((into) => into.push('a')));
    expect([...list]).toEqual(['a']);
    const record = Object.freeze(deferredField({ code: 'x', message: '' }, 'message', () => 'Words.'));
    expect(record.message).toBe('Words.');
  });

  it('are written by JSON.stringify and by deep equality even when read first that way', () => {
    const a = deferredList<number>((into) => into.push(1, 2, 3));
    expect(JSON.stringify(a)).toBe('[1,2,3]');
    const b = deferredList<number>((into) => into.push(1, 2, 3));
    expect(b).toStrictEqual([1, 2, 3]);
  });
});

describe('deferred fields', () => {
  it('write the field on its first read only, keep the key order, and read like plain records', () => {
    let writes = 0;
    const w = deferredField({ code: 'x', severity: 'info', message: '', deviceId: 'd' }, 'message', () => {
      writes++;
      return 'Written.';
    });
    expect(w.code).toBe('x');
    expect(w.severity).toBe('info');
    expect(writes).toBe(0);
    expect(w.message).toBe('Written.');
    expect(w.message).toBe('Written.');
    expect(Object.keys(w)).toEqual(['code', 'severity', 'message', 'deviceId']);
    expect(writes).toBe(1);
    expect(JSON.stringify(w)).toBe('{"code":"x","severity":"info","message":"Written.","deviceId":"d"}');
    expect({ ...w }).toEqual({ code: 'x', severity: 'info', message: 'Written.', deviceId: 'd' });
  });

  it('are written by spread, JSON.stringify and deep equality', () => {
    const make = () => deferredField({ code: 'x', message: '' }, 'message', () => 'Words.');
    expect({ ...make() }).toEqual({ code: 'x', message: 'Words.' });
    expect(JSON.parse(JSON.stringify(make()))).toEqual({ code: 'x', message: 'Words.' });
    expect(make()).toStrictEqual({ code: 'x', message: 'Words.' });
  });
});

function withSettings(site: Site, units: 'metric' | 'imperial', budgetBasis: 'class' | 'expected'): Site {
  return { ...site, settings: { ...site.settings, units, budgetBasis } };
}

function jsonHash(x: unknown): string {
  return createHash('sha256').update(JSON.stringify(x)).digest('hex').slice(0, 32);
}

describe('the evaluation reads the same with deferred words', () => {
  // sha256 (first 32 hex digits) of JSON.stringify(evaluateSite(site)), recorded with the rules as
  // they were before the words were deferred: every figure, key, reason, warning and caution, in order.
  // After a deliberate change to the rules' figures or wording, record them again (and review why).
  // Last recorded when the cable reason began naming the run and its patch cords apart, and stopped
  // promising power over a run longer than a channel may be, and again when a splitter's reason began
  // naming the stock rating bought when it is above the current needed; and again when the cable
  // reason began saying the device can draw its full class power (not the port's power less the loss),
  // a run over the channel stopped suggesting thicker cable, and "an 802.3…" took its article; and
  // again when a doorbell on its transformer was labelled by it, and a switch planned by expected
  // draw whose classes add up to more than its budget got a warning.
  const RECORDED: Readonly<Record<string, string>> = {
    'demo metric class': '5ca387999669172a9b81575582bafadd',
    'demo metric expected': '93ccb43a725351a10ad00bb740f36ad9',
    'demo imperial class': '669e920f8969af7c83cc2b449a4b9704',
    'demo imperial expected': '83d73e0ec1b60ce3571c2d2af6b1a112',
    'generated-40 metric class': 'caab3e9e7491154370e3d4df980eaa5f',
    'generated-40 metric expected': '9c02dc9dbcb7db4423d67ca7ef2bdbaa',
    'generated-40 imperial class': 'c9efc4d6583beeeac70cf9fb10a0e9f7',
    'generated-40 imperial expected': '66c9e620c44185e0b359f1141291018d',
    'generated-400 metric class': 'f2bad9d821f06ed8ce28b99f12479589',
    'generated-400 metric expected': '1724d032ba307f954f34737088b4e4d3',
    'generated-400 imperial class': '8fa25a40ab9e4ef434ba7b379829be62',
    'generated-400 imperial expected': '0f34b9f19afffce20f96372e65797349',
  };
  const sites: Record<string, Site> = {
    demo: demoSite,
    'generated-40': generateBenchSite(40, 7),
    'generated-400': generateBenchSite(400, 11),
  };

  for (const [name, site] of Object.entries(sites)) {
    for (const units of ['metric', 'imperial'] as const) {
      for (const basis of ['class', 'expected'] as const) {
        const key = `${name} ${units} ${basis}`;
        it(`${key}: the JSON text is the recorded one`, () => {
          expect(jsonHash(evaluateSite(withSettings(site, units, basis)))).toBe(RECORDED[key]);
        });
      }
    }
  }

  it('the words do not depend on what is read first', () => {
    const site = withSettings(generateBenchSite(200, 3), 'imperial', 'class');
    const a = evaluateSite(site);
    const b = evaluateSite(site);
    // a: messages first, then reasons; b: reasons first, then messages.
    const messagesA = a.warnings.map((w) => w.message);
    const reasonsA = a.devices.map((d) => [...d.reasons]);
    const reasonsB = b.devices.map((d) => [...d.reasons]);
    const messagesB = b.warnings.map((w) => w.message);
    expect(reasonsA).toEqual(reasonsB);
    expect(messagesA).toEqual(messagesB);
    expect(JSON.stringify(a)).toBe(JSON.stringify(b));
  });

  it('a parsed site cannot be edited afterwards, so a result read later still matches its site', () => {
    // A result is read from its site when its records are first read: parseSite freezes the site.
    const site = withSettings(generateBenchSite(200, 5), 'metric', 'expected');
    const parsed = parseSite(site);
    expect(parsed.ok).toBe(true);
    const frozen = (parsed as { value: Site }).value;
    const e = evaluateSite(frozen);
    const edits: (() => void)[] = [
      () => { (frozen.settings as { units: string }).units = 'imperial'; },
      () => { (frozen.devices[0] as { name: string }).name = 'Edited'; },
      () => { (frozen.devices[0].power as { typical: boolean }).typical = true; },
      () => { (frozen.devices as Device[]).push(frozen.devices[1]); },
      () => { (frozen.powerSources[0] as { name: string }).name = 'Edited source'; },
    ];
    for (const edit of edits) expect(edit).toThrow(TypeError);
    // The same site as an editable copy gives the same result, read in any order; evaluating it
    // freezes it too, so it cannot be edited under a result either.
    const copy = structuredClone(frozen);
    expect(Object.isFrozen(copy.devices[0])).toBe(false);
    const c = evaluateSite(copy);
    expect(() => { (copy.devices[0].power as { typical: boolean }).typical = true; }).toThrow(TypeError);
    expect(() => { (copy.devices[0] as { name: string }).name = 'Edited'; }).toThrow(TypeError);
    expect(c.warnings.map((w) => w.message)).toEqual(e.warnings.map((w) => w.message));
    expect(JSON.stringify(c)).toBe(JSON.stringify(e));
    expect(JSON.stringify(frozen.devices.map((d) => evaluateDevice(d, frozen)))).toBe(JSON.stringify(e.devices));
  });
});
