// Typed numbers and percentages as the closet and materials forms read them.
// The expected values are plain arithmetic on what was typed (no external source needed).
import { describe, expect, it } from 'vitest';
import { parseTypedNumber, TypedFields } from '../../survey/typed-numbers';

describe('typed numbers', () => {
  it.each([
    ['12.5', 12.5], ['12,5', 12.5], [' 88 ', 88], ['1,299.50', 1299.5], ['1.299,50', 1299.5], ['1 299.50', 1299.5],
    ['-4', -4], ['.5', 0.5], ['0', 0],
  ])('reads %j as %d', (text, value) => {
    expect(parseTypedNumber(text)).toBe(value);
  });

  it('is undefined when blank and NaN for what is not a number', () => {
    expect(parseTypedNumber('  ')).toBeUndefined();
    for (const bad of ['abc', '12abc', '1e3', '12.5.6', 'Infinity', '--3', ',']) expect(parseTypedNumber(bad)).toBeNaN();
  });
});

describe('typed fields of a form', () => {
  it('marks a field that is not a number instead of sending it as nothing', () => {
    const f = new TypedFields();
    expect(f.number('ownDrawW', 'abc', 'Own draw')).toBeUndefined();
    expect(f.ok).toBe(false);
    expect(f.errors.ownDrawW).toEqual(['Own draw must be a number, e.g. 12.5.']);
  });

  it('reads percentages as typed (88 is 0.88) and marks those outside (0, 100] in percent', () => {
    const f = new TypedFields();
    expect(f.percent('supplyEfficiency', '88', 'Supply efficiency')).toBeCloseTo(0.88, 12);
    expect(f.percent('inverterEfficiency', '100', 'Inverter efficiency')).toBe(1);
    expect(f.percent('ageFactor', '', 'Age derate')).toBeUndefined();
    expect(f.ok).toBe(true);
    expect(f.percent('supplyEfficiency', '150', 'Supply efficiency')).toBeUndefined();
    expect(f.percent('depthOfDischarge', '0', 'Depth of discharge')).toBeUndefined();
    expect(f.errors.supplyEfficiency).toEqual(['Supply efficiency is a percentage above 0 and at most 100 (got 150); type 88 for 88 %.']);
    expect(f.errors.depthOfDischarge?.[0]).toMatch(/above 0 and at most 100/);
  });
});
