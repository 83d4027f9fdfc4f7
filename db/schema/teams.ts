import { bigint, pgTable, primaryKey, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { userRole, unitSystem } from "./enums";

export const teams = pgTable("teams", {
  id: text().primaryKey(),
  name: text().notNull(),
  units: unitSystem().notNull().default("metric"),
  /** The team's sync cursor: bumped under a row lock inside every push transaction. */
  version: bigint({ mode: "number" }).notNull().default(0),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

export const users = pgTable(
  "users",
  {
    id: text()
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    name: text(),
    email: text().notNull(),
    emailVerified: timestamp({ withTimezone: true, mode: "date" }),
    image: text(),
    passwordHash: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("users_email_unique").on(t.email)],
);

/** A user's place in a team. Every member has exactly one role in a team. */
export const memberships = pgTable(
  "memberships",
  {
    teamId: text()
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: userRole().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.teamId, t.userId] })],
);
