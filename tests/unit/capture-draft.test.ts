import { describe, expect, it } from "vitest";
import { assembleSite, checkItemDraft, itemsOfSite, mergeFields } from "../../survey/capture";
import { demoSite, demoSiteInput, evaluateSite, parseSite } from "../../survey";

describe("draft items", () => {
  it("refuses keys that are not fields, including Object's own member names", () => {
    for (const key of ["constructor", "toString", "__proto__", "hasOwnProperty"]) {
      const merged = mergeFields({}, { [key]: [] });
      const result = checkItemDraft("battery", merged);
      expect(result.ok, key).toBe(false);
    }
    expect(Object.getPrototypeOf(mergeFields({}, JSON.parse('{"__proto__": {"polluted": true}}')))).toBe(Object.prototype);
    expect(({} as { polluted?: boolean }).polluted).toBeUndefined();
  });

  it("accepts a partial device and names a bad field", () => {
    expect(checkItemDraft("device", { name: "Porch camera", kind: "camera" })).toEqual({ ok: true });
    const bad = checkItemDraft("device", { power: { by: "watts", watts: -3 } });
    expect(bad.ok).toBe(false);
  });

  it("a null clears a field", () => {
    expect(mergeFields({ a: 1, b: 2 }, { a: null })).toEqual({ b: 2 });
  });

  it("the demo site survives the round trip through items and gives the same evaluation", () => {
    const items = itemsOfSite(demoSiteInput).map((i) => ({ ...i, siteId: demoSite.id, deleted: false, version: 1 }));
    const { site, incompleteDeviceIds } = assembleSite({ id: demoSite.id, name: demoSite.name, address: demoSiteInput.address, closetRoomId: demoSiteInput.closetRoomId, settings: demoSiteInput.settings as Record<string, unknown> }, items);
    expect(incompleteDeviceIds).toEqual([]);
    const parsed = parseSite(site);
    expect(parsed.ok).toBe(true);
    if (parsed.ok) expect(evaluateSite(parsed.value).summary).toEqual(evaluateSite(demoSite).summary);
  });
});
