// The per-write record of which client last set each field of an item (server/services/field-writes.ts).
import { describe, expect, it } from "vitest";
import { lastWrites, recordWrite } from "../../server/services/field-writes";

describe("field writes", () => {
  it("records a first write of several fields under one key", () => {
    expect(recordWrite({}, ["name", "power"], 7, "phone-a")).toEqual({ "7:phone-a": ["name", "power"] });
  });

  it("moves a field to its latest write and drops writes that hold no field any more", () => {
    let w = recordWrite({}, ["name", "power"], 7, "phone-a");
    w = recordWrite(w, ["power"], 9, "phone-b");
    expect(w).toEqual({ "7:phone-a": ["name"], "9:phone-b": ["power"] });
    w = recordWrite(w, ["name"], 10, "phone-b");
    expect(w).toEqual({ "9:phone-b": ["power"], "10:phone-b": ["name"] });
    expect(lastWrites(w).get("name")).toEqual({ v: 10, c: "phone-b" });
    expect(lastWrites(w).get("power")).toEqual({ v: 9, c: "phone-b" });
  });

  it("adds to the same write when one push changes an item twice, without repeating a field", () => {
    let w = recordWrite({}, ["name"], 4, "phone-a");
    w = recordWrite(w, ["name", "mount"], 4, "phone-a");
    expect(w).toEqual({ "4:phone-a": ["name", "mount"] });
  });

  it("keeps client ids that contain a colon (the desk's ids do)", () => {
    const w = recordWrite({}, ["run"], 12, "desk:user_tomas");
    expect(lastWrites(w).get("run")).toEqual({ v: 12, c: "desk:user_tomas" });
  });

  it("reads an item with no writes as having none", () => {
    expect(lastWrites({}).size).toBe(0);
  });
});
