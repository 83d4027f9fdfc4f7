// Seeds the invented demo scenario once, on the first start against an empty database.
import { hash } from "@node-rs/argon2";
import { sql } from "drizzle-orm";
import type { Db } from "./client";
import { DEMO_PASSWORD, demoAccounts, demoTeam } from "./demo-accounts";
import { memberships, siteAssignments, sites, teams, users } from "./schema";

export const DEMO_SITE_ID = "site_larchmere";

export async function seedDemoOnce(db: Db): Promise<boolean> {
  const existing = await db.select({ n: sql<number>`count(*)::int` }).from(teams);
  if ((existing[0]?.n ?? 0) > 0) return false;
  const passwordHash = await hash(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    await tx.insert(teams).values({ id: demoTeam.id, name: demoTeam.name, units: "metric" });
    for (const a of demoAccounts) {
      await tx.insert(users).values({
        id: a.id,
        name: a.name,
        email: a.email,
        emailVerified: new Date(),
        passwordHash: a.role === "client" ? null : passwordHash,
      });
      await tx.insert(memberships).values({ teamId: demoTeam.id, userId: a.id, role: a.role });
    }
    await tx.insert(sites).values({
      id: DEMO_SITE_ID,
      teamId: demoTeam.id,
      name: "Okonkwo-Lindqvist house",
      address: "14 Larchmere Lane",
      status: "surveying",
      clientUserId: "user_june",
    });
    await tx.insert(siteAssignments).values({ siteId: DEMO_SITE_ID, userId: "user_priya" });
  });
  return true;
}
