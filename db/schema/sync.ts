// Server side of the sync protocol: which local store belongs to whom and how far it got,
// the changes refused with their reasons, same-field conflicts, and photos in object storage.
import { bigint, index, integer, jsonb, pgTable, primaryKey, text, timestamp } from "drizzle-orm/pg-core";
import { items, sites } from "./sites";
import { teams, users } from "./teams";

export const syncClients = pgTable("sync_clients", {
  clientId: text().primaryKey(),
  userId: text()
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  teamId: text()
    .notNull()
    .references(() => teams.id, { onDelete: "cascade" }),
  /** The highest mutation id applied for this client, committed with the mutation's effects. */
  lastMutationId: bigint({ mode: "number" }).notNull().default(0),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  lastSeenAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

export const syncRejections = pgTable(
  "sync_rejections",
  {
    clientId: text()
      .notNull()
      .references(() => syncClients.clientId, { onDelete: "cascade" }),
    mutationId: bigint({ mode: "number" }).notNull(),
    code: text().notNull(),
    message: text().notNull(),
    /** Team version when it was recorded: the next pull brings it back to the phone. */
    version: bigint({ mode: "number" }).notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.clientId, t.mutationId] })],
);

/** A value that lost a same-field race: kept so the people involved see it once. */
export const itemConflicts = pgTable(
  "item_conflicts",
  {
    id: text().primaryKey(),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    siteId: text()
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    itemId: text()
      .notNull()
      .references(() => items.id, { onDelete: "cascade" }),
    field: text().notNull(),
    lostValue: jsonb(),
    keptValue: jsonb(),
    lostBy: text().references(() => users.id, { onDelete: "set null" }),
    keptBy: text().references(() => users.id, { onDelete: "set null" }),
    version: bigint({ mode: "number" }).notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("item_conflicts_team_version_idx").on(t.teamId, t.version)],
);

export const photos = pgTable(
  "photos",
  {
    id: text().primaryKey(),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    siteId: text()
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    itemId: text(),
    label: text().notNull().default(""),
    mime: text().notNull(),
    size: integer().notNull(),
    objectKey: text().notNull(),
    uploadedBy: text().references(() => users.id, { onDelete: "set null" }),
    version: bigint({ mode: "number" }).notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("photos_team_version_idx").on(t.teamId, t.version)],
);
