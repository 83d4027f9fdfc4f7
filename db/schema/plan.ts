// The designer's side of a site's plan: decisions that override the rules for a device, their
// history, and the plan's own settings (unit prices, which pins the automatic assignment wrote).
// Closet sources, the battery and port pins are items (see sites.ts), so phones pull them.
import { boolean, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp } from "drizzle-orm/pg-core";
import { sites } from "./sites";
import { teams, users } from "./teams";

export const powerMethod = pgEnum("power_method", ["poe", "poe_splitter", "existing_outlet", "new_outlet"]);

/** The decision in force for a device (at most one per device). */
export const deviceDecisions = pgTable(
  "device_decisions",
  {
    siteId: text()
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    /** The device's item id. */
    deviceId: text().notNull(),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    method: powerMethod().notNull(),
    poeClass: integer(),
    sourceId: text(),
    port: integer(),
    /** {volts, amps, plug?} for a PoE + splitter decision. */
    splitter: jsonb().$type<{ volts: number; amps: number; plug?: string }>(),
    reason: text().notNull(),
    /** Placed over the budget or the planning ceiling on purpose. */
    forced: boolean().notNull().default(false),
    decidedBy: text().references(() => users.id, { onDelete: "set null" }),
    decidedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.siteId, t.deviceId] })],
);

/** Every decision, change of port and removal, with who, when, what and why. Never updated. */
export const decisionHistory = pgTable(
  "decision_history",
  {
    id: text().primaryKey(),
    siteId: text()
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    deviceId: text().notNull(),
    /** decided · cleared · auto_placed · source_removed */
    action: text().notNull(),
    /** What was decided (the decision, or the port it was placed on). */
    after: jsonb().$type<Record<string, unknown> | null>(),
    /** What it replaced. */
    before: jsonb().$type<Record<string, unknown> | null>(),
    reason: text().notNull(),
    forced: boolean().notNull().default(false),
    actorId: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("decision_history_site_idx").on(t.siteId, t.createdAt)],
);

/** One row per planned site: unit prices (in cents, by price key) and the pins the automatic assignment wrote. */
export const sitePlans = pgTable("site_plans", {
  siteId: text()
    .primaryKey()
    .references(() => sites.id, { onDelete: "cascade" }),
  teamId: text()
    .notNull()
    .references(() => teams.id, { onDelete: "cascade" }),
  prices: jsonb().$type<Record<string, number>>().notNull().default({}),
  /** Devices whose pin came from the automatic assignment (re-running it may move them). */
  autoPlaced: jsonb().$type<string[]>().notNull().default([]),
  updatedBy: text().references(() => users.id, { onDelete: "set null" }),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
