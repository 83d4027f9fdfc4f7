// Seeds the invented demo scenario once, on the first start against an empty database.
import { hash } from "@node-rs/argon2";
import { eq, sql } from "drizzle-orm";
import { itemsOfSite } from "../survey/capture";
import { demoSiteInput } from "../survey/demo-site";
import type { Db } from "./client";
import { DEMO_PASSWORD, demoAccounts, demoTeam } from "./demo-accounts";
import { items, memberships, siteAssignments, sites, teams, users } from "./schema";

export const DEMO_SITE_ID = "site_larchmere";

const SEED_LOCK = 7_140_552;

export async function seedDemoOnce(db: Db): Promise<boolean> {
  const existing = await db.select({ n: sql<number>`count(*)::int` }).from(teams);
  if ((existing[0]?.n ?? 0) > 0) return false;
  const passwordHash = await hash(DEMO_PASSWORD);
  return db.transaction(async (tx) => {
    // Servers starting together: one seeds, the others see it done.
    await tx.execute(sql`select pg_advisory_xact_lock(${SEED_LOCK})`);
    const [again] = await tx.select({ n: sql<number>`count(*)::int` }).from(teams);
    if ((again?.n ?? 0) > 0) return false;
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
      name: "The Okonkwo-Lindqvist house",
      address: "14 Larchmere Lane",
      status: "surveying",
      clientUserId: "user_june",
    });
    await tx.insert(siteAssignments).values({ siteId: DEMO_SITE_ID, userId: "user_priya" });
    // The walk so far: every floor, room, device and closet power source of the demo house.
    const walked = itemsOfSite(demoSiteInput);
    await tx.insert(items).values(walked.map((i) => ({ id: i.id, teamId: demoTeam.id, siteId: DEMO_SITE_ID, kind: i.kind, data: i.data, version: 1, updatedBy: "user_priya" })));
    await tx.update(sites).set({ closetRoomId: demoSiteInput.closetRoomId, settings: demoSiteInput.settings ?? {}, version: 1 }).where(eq(sites.id, DEMO_SITE_ID));
    await tx.update(teams).set({ version: 1 }).where(eq(teams.id, demoTeam.id));
    return true;
  });
}
