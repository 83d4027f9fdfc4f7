// Tables Auth.js's Drizzle adapter reads and writes (accounts, sessions, e-mail verification tokens),
// plus Dropwise's own invites and the captured mail of the local SMTP sink.
import { integer, pgTable, primaryKey, text, timestamp, index } from "drizzle-orm/pg-core";
import { userRole } from "./enums";
import { teams, users } from "./teams";

export const accounts = pgTable(
  "accounts",
  {
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    type: text().notNull(),
    provider: text().notNull(),
    providerAccountId: text().notNull(),
    refresh_token: text(),
    access_token: text(),
    expires_at: integer(),
    token_type: text(),
    scope: text(),
    id_token: text(),
    session_state: text(),
  },
  (t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })],
);

export const sessions = pgTable("sessions", {
  sessionToken: text().primaryKey(),
  userId: text()
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  expires: timestamp({ mode: "date", withTimezone: true }).notNull(),
});

export const verificationTokens = pgTable(
  "verification_tokens",
  {
    identifier: text().notNull(),
    token: text().notNull(),
    expires: timestamp({ mode: "date", withTimezone: true }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.identifier, t.token] })],
);

/** An admin's invitation of a team member. Only the token's hash is stored. */
export const invites = pgTable(
  "invites",
  {
    id: text().primaryKey(),
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    email: text().notNull(),
    role: userRole().notNull(),
    tokenHash: text().notNull().unique(),
    invitedBy: text().references(() => users.id, { onDelete: "set null" }),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    acceptedAt: timestamp({ withTimezone: true }),
    acceptedBy: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("invites_team_idx").on(t.teamId)],
);

/** Messages the local SMTP sink received in place of a hosted mail service (development and tests). */
export const capturedMail = pgTable("captured_mail", {
  id: text().primaryKey(),
  to: text().notNull(),
  from: text().notNull(),
  subject: text().notNull(),
  text: text().notNull(),
  html: text(),
  links: text().array().notNull().default([]),
  receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
