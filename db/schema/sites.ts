import { bigint, boolean, index, jsonb, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { itemKind, siteStatus } from "./enums";
import { teams, users } from "./teams";

export const sites = pgTable(
  "sites",
  {
    id: text().primaryKey(),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    name: text().notNull(),
    address: text().notNull().default(""),
    status: siteStatus().notNull().default("surveying"),
    clientUserId: text().references(() => users.id, { onDelete: "set null" }),
    /** The room holding the network closet, where every run ends (an item id). */
    closetRoomId: text(),
    /** Site-wide settings for the rules (units, planning ceiling, …), validated by survey/. */
    settings: jsonb().notNull().default({}),
    /** Team version of the last change to the site's own fields (name, status, closet…). */
    version: bigint({ mode: "number" }).notNull().default(0),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("sites_team_idx").on(t.teamId)],
);

/** Surveyors assigned to a site: they see and edit it. */
export const siteAssignments = pgTable(
  "site_assignments",
  {
    siteId: text()
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
  },
  (t) => [index("site_assignments_user_idx").on(t.userId), index("site_assignments_site_idx").on(t.siteId)],
);

/**
 * Everything a walk captures inside a site (floors, rooms, devices, closet power sources, the battery),
 * one row per thing. `data` holds the fields, validated by the survey/ schema of its kind; `version` is
 * the team version of the last change, so a pull is one indexed range scan. Deletes are tombstones.
 */
export const items = pgTable(
  "items",
  {
    id: text().primaryKey(),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    siteId: text()
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    kind: itemKind().notNull(),
    data: jsonb().$type<Record<string, unknown>>().notNull(),
    /** Which write last set each field: {"<team version>:<client id>": [field, ...]} (finds same-field conflicts). */
    fieldVersions: jsonb().$type<Record<string, string[]>>().notNull().default({}),
    deleted: boolean().notNull().default(false),
    version: bigint({ mode: "number" }).notNull(),
    updatedBy: text().references(() => users.id, { onDelete: "set null" }),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("items_team_version_idx").on(t.teamId, t.version), index("items_site_idx").on(t.siteId)],
);
