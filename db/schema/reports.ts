// Published versions of a site's recommendation report, the client's comments and sign-off, and the
// optional deposit. A published version and a sign-off are never changed or deleted (database
// triggers refuse it; see the migration), so the team can prove later what was signed.
import { bigint, boolean, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { sites } from "./sites";
import { teams, users } from "./teams";

export const reportVersions = pgTable(
  "report_versions",
  {
    id: text().primaryKey(),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "restrict" }),
    siteId: text()
      .notNull()
      .references(() => sites.id, { onDelete: "restrict" }),
    version: integer().notNull(),
    content: jsonb().notNull(),
    /** SHA-256 of the canonical JSON of `content`. */
    contentHash: text().notNull(),
    publishedBy: text().references(() => users.id, { onDelete: "set null" }),
    publishedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("report_versions_site_version").on(t.siteId, t.version)],
);

export const reportViews = pgTable(
  "report_views",
  {
    reportId: text()
      .notNull()
      .references(() => reportVersions.id),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    viewedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("report_views_user_idx").on(t.userId, t.reportId)],
);

export const reportComments = pgTable(
  "report_comments",
  {
    id: text().primaryKey(),
    reportId: text()
      .notNull()
      .references(() => reportVersions.id),
    siteId: text()
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    authorId: text().references(() => users.id, { onDelete: "set null" }),
    /** A device id of the report, or "general". */
    itemRef: text().notNull(),
    body: text().notNull(),
    changeRequest: boolean().notNull().default(false),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("report_comments_report_idx").on(t.reportId)],
);

export const signoffs = pgTable("signoffs", {
  id: text().primaryKey(),
  reportId: text()
    .notNull()
    .unique()
    .references(() => reportVersions.id),
  siteId: text()
    .notNull()
    .references(() => sites.id, { onDelete: "restrict" }),
  clientUserId: text()
    .notNull()
    .references(() => users.id, { onDelete: "restrict" }),
  typedName: text().notNull(),
  contentHash: text().notNull(),
  signedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  ipAddress: text().notNull(),
  userAgent: text().notNull(),
});

/** A team's deposit policy: off unless an admin turns it on. */
export const depositSettings = pgTable("deposit_settings", {
  teamId: text()
    .primaryKey()
    .references(() => teams.id, { onDelete: "cascade" }),
  enabled: boolean().notNull().default(false),
  amountCents: integer().notNull().default(0),
  currency: text().notNull().default("usd"),
});

export const deposits = pgTable("deposits", {
  id: text().primaryKey(),
  signoffId: text()
    .notNull()
    .unique()
    .references(() => signoffs.id),
  teamId: text()
    .notNull()
    .references(() => teams.id, { onDelete: "cascade" }),
  amountCents: integer().notNull(),
  currency: text().notNull(),
  checkoutSessionId: text().notNull().unique(),
  checkoutUrl: text().notNull(),
  status: text({ enum: ["unpaid", "paid"] }).notNull().default("unpaid"),
  paidAt: timestamp({ withTimezone: true }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/** Webhook events already handled: a delivery seen twice has no second effect. */
export const paymentEvents = pgTable("payment_events", {
  id: text().primaryKey(),
  type: text().notNull(),
  receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  createdAtProvider: bigint({ mode: "number" }).notNull(),
});
