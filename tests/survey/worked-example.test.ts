import { readFileSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { evaluateSite, parseSite } from '../../survey/index';

/**
 * DEVELOPERS.md holds one worked example (section "Power rules"): the first ```json block is a site,
 * the second is its evaluation. This test keeps the document honest.
 *
 * After a deliberate change to the rules, regenerate the second block with
 *   UPDATE_RULES_DOC=1 npx vitest run tests/survey/worked-example.test.ts
 * and review the diff before committing.
 */
const DOC = resolve(__dirname, '../../DEVELOPERS.md');
const FENCE = /```json\n([\s\S]*?)\n```/g;

function jsonBlocks(md: string): { text: string; index: number }[] {
  return [...md.matchAll(FENCE)].map((m) => ({ text: m[1], index: m.index! }));
}

describe('DEVELOPERS.md worked example', () => {
  const md = readFileSync(DOC, 'utf8');
  const blocks = jsonBlocks(md);

  it('has exactly two JSON blocks: a site and its evaluation', () => {
    expect(blocks).toHaveLength(2);
  });

  it('the documented site is valid and small (3–4 devices)', () => {
    const r = parseSite(JSON.parse(blocks[0].text));
    expect(r.errors).toEqual([]);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.value.devices.length).toBeGreaterThanOrEqual(3);
    if (r.ok) expect(r.value.devices.length).toBeLessThanOrEqual(4);
  });

  it('evaluateSite(documented site) deep-equals the documented evaluation', () => {
    const r = parseSite(JSON.parse(blocks[0].text));
    if (!r.ok) throw new Error('invalid documented site');
    const actual = evaluateSite(r.value);
    if (process.env.UPDATE_RULES_DOC === '1') {
      const out = JSON.stringify(actual, null, 2);
      const b = blocks[1];
      const start = b.index + '```json\n'.length;
      writeFileSync(DOC, md.slice(0, start) + out + md.slice(start + b.text.length));
      return;
    }
    expect(actual).toEqual(JSON.parse(blocks[1].text));
    // And the other way round, so the document cannot carry stale extra fields.
    expect(JSON.parse(JSON.stringify(actual))).toStrictEqual(JSON.parse(blocks[1].text));
  });
});
