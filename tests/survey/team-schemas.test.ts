// The team's shared form schemas: each wrong field gets one message that says what to fix.
import * as v from "valibot";
import { describe, expect, it } from "vitest";
import { InviteMemberSchema } from "../../survey/team";
import { fieldErrors } from "../../survey/validation";

const errorsOf = (input: unknown) => {
  const r = v.safeParse(InviteMemberSchema, input);
  return r.success ? {} : fieldErrors(r.issues);
};

describe("InviteMemberSchema", () => {
  it("an empty e-mail asks for one, once", () => {
    expect(errorsOf({ email: "   ", role: "surveyor" })).toEqual({ email: ["Enter an e-mail address."] });
  });
  it("a wrong e-mail says so, once", () => {
    expect(errorsOf({ email: "wren at lanternfield", role: "surveyor" })).toEqual({ email: ["That does not look like an e-mail address."] });
  });
  it("takes a good one, trimmed and in lower case", () => {
    const r = v.safeParse(InviteMemberSchema, { email: "  Wren@Lanternfield.TEST ", role: "surveyor" });
    expect(r.success && r.output.email).toBe("wren@lanternfield.test");
  });
});
