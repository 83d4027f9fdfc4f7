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
  // draw whose classes add up to more than its budget got a warning; and when a splitter's reason
  // began naming the input it matches in brackets ("to match its input (5.5×2.1 mm, centre-positive)").
  const RECORDED: Readonly<Record<string, string>> = {
    'demo metric class': '1e7982db574a2c79b828001bca6002cb',
    'demo metric expected': '2512cb7bd478945e69e268abed56c94e',
    'demo imperial class': 'c99ca7ce24ce9158c9d9a0d3b7ef380a',
    'demo imperial expected': '01b824538f60ccd14c2e7364b669b376',
    'generated-40 metric class': '9ef4f463800050d440864fb5fe066c4d',
    'generated-40 metric expected': '7e60d5251c60d09887676592ae88e02e',
    'generated-40 imperial class': 'ab54c691f61ad1df9e2d6c9148ed724d',
    'generated-40 imperial expected': '7079c77cb85b394d12e3c7756163630e',
    'generated-400 metric class': '7575df6229db6752b3727acbd6b6f8cf',
    'generated-400 metric expected': '91974496f403921c7f7d6e4655df3c2b',
    'generated-400 imperial class': 'c32b38922216f078615bd82507475a42',
    'generated-400 imperial expected': '673d5c28503b83b94488549ee0849ff8',
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
