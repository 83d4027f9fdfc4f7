// What the designer is asked to look at before publishing: each open thing once, in words.
import { describe, expect, it } from "vitest";
import { publishReadiness, reasonsBesideDecision } from "../../survey/report";

const ready = { problems: 0, unpricedLines: 0, materialLines: 12, devicesWithGaps: 0, devicesLeftOut: 0, sincePublished: null };

describe("publishReadiness", () => {
  it("is empty when nothing is open", () => {
    expect(publishReadiness(ready)).toEqual([]);
    expect(publishReadiness({ ...ready, sincePublished: { version: 2, changed: true } })).toEqual([]);
  });

  it("names every open thing, with its count, problems first", () => {
    expect(publishReadiness({ problems: 2, unpricedLines: 13, materialLines: 13, devicesWithGaps: 2, devicesLeftOut: 1, sincePublished: { version: 1, changed: false } })).toEqual([
      "2 problems are still open in the plan: the homeowner reads them in the scope as they stand.",
      "1 device is left out of the plan: the walk has gaps for it, so the scope does not cover it.",
      "2 devices still have gaps from the walk (a typical power figure, a run not measured).",
      "13 of 13 material lines are not priced yet: the total covers the priced lines only.",
      "Nothing changed since version 1: the homeowner gets the same scope again, as version 2.",
    ]);
  });

  it("says one thing in the singular", () => {
    expect(publishReadiness({ ...ready, problems: 1, devicesWithGaps: 1, unpricedLines: 1, materialLines: 1 })).toEqual([
      "1 problem is still open in the plan: the homeowner reads it in the scope as they stand.",
      "1 device still has gaps from the walk (a typical power figure, a run not measured).",
      "1 of 1 material line is not priced yet: the total covers the priced lines only.",
    ]);
  });
});

describe("reasonsBesideDecision", () => {
  it("says the designer's reason once, above the reasons, not again among them", () => {
    const reasons = ["Designer decision: Keep it on the cable.", "It takes power over its network cable (PoE)."];
    expect(reasonsBesideDecision({ reasons, decision: { label: "PoE", reason: "Keep it on the cable.", by: "A designer" } })).toEqual(["It takes power over its network cable (PoE)."]);
    expect(reasonsBesideDecision({ reasons, decision: null })).toEqual(reasons);
  });
});
