import { pgEnum } from "drizzle-orm/pg-core";

export const userRole = pgEnum("user_role", ["admin", "designer", "surveyor", "client"]);

export const siteStatus = pgEnum("site_status", [
  "surveying",
  "planning",
  "out_for_sign_off",
  "signed",
  "changes_asked",
]);

export const unitSystem = pgEnum("unit_system", ["metric", "imperial"]);

/** The kinds of things a walk captures inside a site; see items.ts. */
export const itemKind = pgEnum("item_kind", ["floor", "room", "device", "source", "battery"]);
