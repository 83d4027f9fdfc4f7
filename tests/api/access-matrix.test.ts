// Every API route × every kind of caller. A route added without its row here fails the first test.
import { randomUUID } from "node:crypto";
import type { Express, Router } from "express";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { deviceDecisions, invites, items, memberships, photos, teams, users } from "../../db/schema";
import { createApp } from "../../server/app";
import { demoSiteInput } from "../../survey/demo-site";
import { hashPassword } from "../../server/auth/passwords";
import { newInviteToken } from "../../server/services/invite-tokens";
import { signInWithPassword, type Agent } from "../support/auth-client";
import { listRoutes } from "../support/route-list";
import { createTestDb, type TestDb } from "../support/test-db";
import { testContext } from "../support/test-server";

type Caller = "anonymous" | "admin" | "designer" | "surveyor" | "otherSurveyor" | "client" | "otherTeam";
const CALLERS: Caller[] = ["anonymous", "admin", "designer", "surveyor", "otherSurveyor", "client", "otherTeam"];

const EMAILS: Record<Exclude<Caller, "anonymous" | "client">, string> = {
  admin: "imke@lanternfield.test",
  designer: "tomas@lanternfield.test",
  surveyor: "priya@lanternfield.test", // assigned to the demo site
  otherSurveyor: "odile@lanternfield.test", // same team, not assigned
  otherTeam: "boss@brightwire.test", // admin of another team
};

let testDb: TestDb;
let app: Express;
const agents = {} as Record<Caller, Agent>;

interface Cell {
  path: string;
  body?: unknown;
}
interface Row {
  route: string; // "METHOD /pattern" as registered
  /** Builds the concrete request for one caller (fresh ids where a request consumes something). */
  make: (caller: Caller) => Promise<Cell> | Cell;
  expect: Record<Caller, number>;
}

const PUBLIC = (status: number): Record<Caller, number> => Object.fromEntries(CALLERS.map((c) => [c, status])) as Record<Caller, number>;
const MEMBERS = (status: number): Record<Caller, number> => ({ ...PUBLIC(status), anonymous: 401 });

async function addMember(teamId: string, role: "admin" | "designer" | "surveyor", email = `${randomUUID()}@lanternfield.test`) {
  const id = randomUUID();
  await testDb.db.insert(users).values({ id, email, name: `Member ${role}`, passwordHash: await hashPassword(DEMO_PASSWORD) });
  await testDb.db.insert(memberships).values({ teamId, userId: id, role });
  return id;
}

async function addInvite(teamId: string) {
  const { token, tokenHash } = newInviteToken();
  const id = randomUUID();
  await testDb.db.insert(invites).values({ id, teamId, email: `${randomUUID()}@invited.test`, role: "surveyor", tokenHash, expiresAt: new Date(Date.now() + 86_400_000) });
  return { id, token };
}

const JPEG = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(64, 1)]);
const DEMO_PHOTO_ID = randomUUID();

/** Publishes a new version of the demo site's report (as the designer) and returns its id. */
async function freshReport(): Promise<string> {
  const res = await agents.designer.post(`/api/sites/${DEMO_SITE_ID}/reports`).send({});
  if (res.status !== 201) throw new Error(`publish failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.report.id;
}

const siteRead = { anonymous: 401, admin: 200, designer: 200, surveyor: 200, otherSurveyor: 404, client: 200, otherTeam: 404 };

/** A closet item of the demo site, written straight to the database (one per request that consumes it). */
async function addClosetItem(kind: "source" | "battery") {
  const id = randomUUID();
  const data = kind === "source" ? { id, kind: "injector", name: "Matrix injector", poeType: 2 } : { id, name: "Matrix battery", capacity: { by: "wh", wh: 100 } };
  await testDb.db.insert(items).values({ id, teamId: "team_lanternfield", siteId: DEMO_SITE_ID, kind, data, version: 1 });
  return id;
}

const planRead = { anonymous: 401, admin: 200, designer: 200, surveyor: 200, otherSurveyor: 404, client: 403, otherTeam: 404 };

const siteWrite = { anonymous: 401, admin: 200, designer: 200, surveyor: 403, otherSurveyor: 404, client: 403, otherTeam: 404 };

const ROWS: Row[] = [
  { route: "GET /health", make: () => ({ path: "/api/health" }), expect: PUBLIC(200) },
  { route: "GET /invites/:token", make: async () => ({ path: `/api/invites/${(await addInvite("team_lanternfield")).token}` }), expect: PUBLIC(200) },
  {
    route: "POST /invites/:token/accept",
    make: async () => ({ path: `/api/invites/${(await addInvite("team_lanternfield")).token}/accept`, body: { name: "New Person", password: "a-long-enough-secret" } }),
    expect: PUBLIC(201),
  },
  { route: "GET /session", make: () => ({ path: "/api/session" }), expect: PUBLIC(200) },
  { route: "GET /me", make: () => ({ path: "/api/me" }), expect: MEMBERS(200) },
  { route: "PATCH /me", make: (c) => ({ path: "/api/me", body: { name: `Name of ${c}` } }), expect: MEMBERS(200) },
  { route: "GET /sites", make: () => ({ path: "/api/sites" }), expect: MEMBERS(200) },
  {
    route: "POST /sites",
    make: () => ({ path: "/api/sites", body: { name: "A new house", address: "1 Test Row" } }),
    expect: { anonymous: 401, admin: 201, designer: 201, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 201 },
  },
  {
    route: "GET /sites/:siteId",
    make: () => ({ path: `/api/sites/${DEMO_SITE_ID}` }),
    expect: { anonymous: 401, admin: 200, designer: 200, surveyor: 200, otherSurveyor: 404, client: 200, otherTeam: 404 },
  },
  { route: "PATCH /sites/:siteId", make: () => ({ path: `/api/sites/${DEMO_SITE_ID}`, body: { address: "14 Larchmere Lane" } }), expect: siteWrite },
  { route: "PUT /sites/:siteId/surveyors", make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/surveyors`, body: { surveyorIds: ["user_priya"] } }), expect: siteWrite },
  {
    route: "POST /sites/:siteId/client",
    make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/client`, body: { email: "june@okonkwo-lindqvist.test", name: "June Okonkwo-Lindqvist" } }),
    expect: { ...siteWrite, admin: 201, designer: 201 },
  },
  {
    route: "GET /team/members",
    make: () => ({ path: "/api/team/members" }),
    expect: { anonymous: 401, admin: 200, designer: 200, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 200 },
  },
  {
    route: "POST /team/invites",
    make: () => ({ path: "/api/team/invites", body: { email: `${randomUUID()}@new.test`, role: "surveyor" } }),
    expect: { anonymous: 401, admin: 201, designer: 403, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 201 },
  },
  {
    route: "DELETE /team/invites/:inviteId",
    make: async () => ({ path: `/api/team/invites/${(await addInvite("team_lanternfield")).id}` }),
    expect: { anonymous: 401, admin: 204, designer: 403, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 404 },
  },
  {
    route: "PATCH /team/members/:userId",
    make: async () => ({ path: `/api/team/members/${await addMember("team_lanternfield", "surveyor")}`, body: { role: "designer" } }),
    expect: { anonymous: 401, admin: 200, designer: 403, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 404 },
  },
  {
    route: "DELETE /team/members/:userId",
    make: async () => ({ path: `/api/team/members/${await addMember("team_lanternfield", "surveyor")}` }),
    expect: { anonymous: 401, admin: 204, designer: 403, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 404 },
  },
  {
    route: "POST /sync/push",
    make: () => ({ path: "/api/sync/push", body: { clientId: randomUUID(), mutations: [] } }),
    expect: MEMBERS(200),
  },
  {
    route: "POST /sync/pull",
    make: () => ({ path: "/api/sync/pull", body: { clientId: randomUUID(), cursor: 0, knownSiteIds: [] } }),
    expect: MEMBERS(200),
  },
  {
    route: "POST /photos",
    make: () => ({ path: "/api/photos", body: { upload: randomUUID() } }),
    expect: { anonymous: 401, admin: 201, designer: 201, surveyor: 201, otherSurveyor: 404, client: 403, otherTeam: 404 },
  },
  {
    route: "GET /photos/:photoId",
    make: () => ({ path: `/api/photos/${DEMO_PHOTO_ID}` }),
    expect: { anonymous: 401, admin: 200, designer: 200, surveyor: 200, otherSurveyor: 404, client: 200, otherTeam: 404 },
  },
  { route: "POST /rules/evaluate", make: () => ({ path: "/api/rules/evaluate", body: demoSiteInput }), expect: MEMBERS(200) },
  { route: "POST /sites/:siteId/reports", make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/reports`, body: {} }), expect: { ...siteWrite, admin: 201, designer: 201 } },
  { route: "GET /sites/:siteId/reports", make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/reports` }), expect: siteRead },
  { route: "GET /reports/:reportId", make: async () => ({ path: `/api/reports/${await freshReport()}` }), expect: siteRead },
  { route: "GET /reports/:reportId/pdf", make: async () => ({ path: `/api/reports/${await freshReport()}/pdf` }), expect: siteRead },
  {
    route: "POST /reports/:reportId/comments",
    make: async () => ({ path: `/api/reports/${await freshReport()}/comments`, body: { itemRef: "general", body: "Looks good." } }),
    expect: { ...siteRead, admin: 201, designer: 201, surveyor: 201, client: 201 },
  },
  {
    route: "POST /reports/:reportId/signoff",
    // The client types the name on their account (another row renames everyone).
    make: async () => ({ path: `/api/reports/${await freshReport()}/signoff`, body: { typedName: (await agents.client.get("/api/me")).body.user.name, confirm: true } }),
    expect: { anonymous: 401, admin: 403, designer: 403, surveyor: 403, otherSurveyor: 404, client: 201, otherTeam: 404 },
  },
  {
    route: "PUT /team/deposit",
    make: () => ({ path: "/api/team/deposit", body: { enabled: false, amountCents: 0 } }),
    expect: { anonymous: 401, admin: 200, designer: 403, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 200 },
  },
  {
    route: "GET /outbox",
    make: () => ({ path: "/api/outbox" }),
    expect: { anonymous: 401, admin: 200, designer: 403, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 200 },
  },
  // The designer's desk: the team reads the working plan, designers and admins change it.
  { route: "GET /sites/:siteId/plan", make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/plan` }), expect: planRead },
  { route: "GET /sites/:siteId/materials.csv", make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/materials.csv` }), expect: planRead },
  {
    route: "PUT /sites/:siteId/devices/:deviceId/decision",
    make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/devices/bell-back/decision`, body: { method: "poe", poeClass: 2, reason: "Matrix check" } }),
    expect: siteWrite,
  },
  {
    route: "DELETE /sites/:siteId/devices/:deviceId/decision",
    make: async () => {
      await testDb.db.insert(deviceDecisions).values({ siteId: DEMO_SITE_ID, deviceId: "hub-hall", teamId: "team_lanternfield", method: "existing_outlet", reason: "Matrix check" }).onConflictDoNothing();
      return { path: `/api/sites/${DEMO_SITE_ID}/devices/hub-hall/decision`, body: { reason: "Matrix check" } };
    },
    expect: siteWrite,
  },
  { route: "POST /sites/:siteId/assign-ports", make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/assign-ports`, body: {} }), expect: siteWrite },
  { route: "PUT /sites/:siteId/prices", make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/prices`, body: { "wall-plate:1-port": 2.5 } }), expect: siteWrite },
  {
    route: "POST /sites/:siteId/closet/sources",
    make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/closet/sources`, body: { kind: "injector", name: "Spare injector", poeType: 2 } }),
    expect: { ...siteWrite, admin: 201, designer: 201 },
  },
  { route: "PATCH /sites/:siteId/closet/sources/:sourceId", make: async () => ({ path: `/api/sites/${DEMO_SITE_ID}/closet/sources/${await addClosetItem("source")}`, body: { name: "Renamed injector" } }), expect: siteWrite },
  { route: "DELETE /sites/:siteId/closet/sources/:sourceId", make: async () => ({ path: `/api/sites/${DEMO_SITE_ID}/closet/sources/${await addClosetItem("source")}` }), expect: siteWrite },
  {
    route: "POST /sites/:siteId/closet/batteries",
    make: () => ({ path: `/api/sites/${DEMO_SITE_ID}/closet/batteries`, body: { name: "Spare battery", capacity: { by: "wh", wh: 200 } } }),
    expect: { ...siteWrite, admin: 201, designer: 201 },
  },
  { route: "PATCH /sites/:siteId/closet/batteries/:batteryId", make: async () => ({ path: `/api/sites/${DEMO_SITE_ID}/closet/batteries/${await addClosetItem("battery")}`, body: { ageFactor: 0.8 } }), expect: siteWrite },
  { route: "DELETE /sites/:siteId/closet/batteries/:batteryId", make: async () => ({ path: `/api/sites/${DEMO_SITE_ID}/closet/batteries/${await addClosetItem("battery")}` }), expect: siteWrite },
  {
    route: "GET /desk/sites",
    make: () => ({ path: "/api/desk/sites" }),
    expect: { anonymous: 401, admin: 200, designer: 200, surveyor: 403, otherSurveyor: 403, client: 403, otherTeam: 200 },
  },
];

beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
  await addMember("team_lanternfield", "surveyor", EMAILS.otherSurveyor);
  await testDb.db.insert(teams).values({ id: "team_brightwire", name: "Brightwire Installs" });
  await addMember("team_brightwire", "admin", EMAILS.otherTeam);
  await testDb.db.insert(photos).values({ id: DEMO_PHOTO_ID, teamId: "team_lanternfield", siteId: DEMO_SITE_ID, mime: "image/jpeg", size: 68, objectKey: "demo/photo.jpg", version: 1 });
  app = createApp(testContext(testDb.db));
  agents.anonymous = request.agent(app);
  for (const [caller, email] of Object.entries(EMAILS)) agents[caller as Caller] = await signInWithPassword(app, email, DEMO_PASSWORD);
  // The client signs in by link in real life; here the session comes from the link flow's twin:
  agents.client = await clientAgent();
});
afterAll(() => testDb.drop());

/** Signs the demo client in through the e-mail provider's callback with a token we plant ourselves. */
async function clientAgent(): Promise<Agent> {
  const { createHash, randomBytes } = await import("node:crypto");
  const { verificationTokens } = await import("../../db/schema");
  const ctx = testContext(testDb.db);
  await ctx.objects.put("demo/photo.jpg", JPEG, "image/jpeg");
  const token = randomBytes(16).toString("hex");
  // Auth.js stores sha256(token + secret) and compares with the hashed token from the link.
  const hashed = createHash("sha256").update(`${token}${ctx.config.authSecret}`).digest("hex");
  await testDb.db.insert(verificationTokens).values({ identifier: "june@okonkwo-lindqvist.test", token: hashed, expires: new Date(Date.now() + 600_000) });
  app = createApp(ctx);
  const agent = request.agent(app);
  const res = await agent.get(`/auth/callback/nodemailer?token=${token}&email=${encodeURIComponent("june@okonkwo-lindqvist.test")}&callbackUrl=%2F`);
  expect(res.status).toBe(302);
  expect(res.headers.location).not.toContain("error");
  // Re-sign the password users against the app instance that shares this secret.
  for (const [caller, email] of Object.entries(EMAILS)) agents[caller as Caller] = await signInWithPassword(app, email, DEMO_PASSWORD);
  agents.anonymous = request.agent(app);
  return agent;
}

describe("access matrix", () => {
  it("has a row for every API route", () => {
    const routers = app.locals.apiRouters as { publicApi: Router; memberApi: Router };
    const registered = listRoutes(routers.publicApi, routers.memberApi);
    expect(ROWS.map((r) => r.route).sort()).toEqual(registered);
  });

  for (const row of ROWS) {
    describe(row.route, () => {
      for (const caller of CALLERS) {
        it(`${caller} → ${row.expect[caller]}`, async () => {
          const cell = await row.make(caller);
          const method = row.route.split(" ")[0].toLowerCase() as "get" | "post" | "put" | "patch" | "delete";
          let req = agents[caller][method](cell.path);
          const upload = (cell.body as { upload?: string } | undefined)?.upload;
          if (upload) req = req.field("id", upload).field("siteId", DEMO_SITE_ID).attach("file", JPEG, "photo.jpg");
          else if (cell.body !== undefined) req = req.send(cell.body as object);
          const res = await req;
          expect({ status: res.status, body: res.status >= 400 ? res.body : "ok" }).toMatchObject({ status: row.expect[caller] });
          if (res.status >= 400) expect(res.body.error.message).toEqual(expect.any(String));
        });
      }
    });
  }
});

describe("what each caller sees", () => {
  it("lists only the sites a caller may open", async () => {
    const names = async (c: Caller) => ((await agents[c].get("/api/sites")).body.sites as { id: string }[]).map((s) => s.id);
    expect(await names("surveyor")).toEqual([DEMO_SITE_ID]);
    expect(await names("otherSurveyor")).toEqual([]);
    expect(await names("client")).toEqual([DEMO_SITE_ID]);
    expect(await names("otherTeam")).not.toContain(DEMO_SITE_ID);
    expect(await names("designer")).toContain(DEMO_SITE_ID);
  });

  it("a signed-in caller asking for a route that does not exist gets a JSON 404", async () => {
    const res = await agents.designer.get("/api/no-such-thing").expect(404);
    expect(res.body.error.code).toBe("no_such_route");
  });

  it("refuses cross-site writes and non-JSON bodies", async () => {
    const cross = await agents.designer.post("/api/sites").set("Origin", "https://elsewhere.example").send({ name: "x" }).expect(403);
    expect(cross.body.error.code).toBe("cross_origin");
    const form = await agents.designer.post("/api/sites").type("form").send("name=x").expect(415);
    expect(form.body.error.code).toBe("unsupported_type");
  });
});
