// Publishing, the PDF, the client's review and sign-off, and the deposit through the payments SDK
// against the local fake provider, on a real server with its mail sink, object store and Postgres.
import { eq, sql } from "drizzle-orm";
import { PDFParse } from "pdf-parse";
import request from "supertest";
import Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID } from "../../db/seed";
import { reportVersions, sites, signoffs } from "../../db/schema";
import { createSignInLink } from "../../server/auth/sign-in-link";
import { evaluateSite, parseSite } from "../../survey";
import { assembleSite } from "../../survey/capture";
import { signInWithPassword, type Agent } from "../support/auth-client";
import { waitForMail } from "../support/mail";
import { startTestServer, type TestServer } from "../support/test-server";

const CLIENT = "june@okonkwo-lindqvist.test";
let server: TestServer;
let designer: Agent;
let admin: Agent;
let client: Agent;

async function followMailLink(to: string, since: Date, contains: string): Promise<Agent> {
  const mail = await waitForMail(server.ctx.db, to, since);
  const link = new URL(mail.links.find((l) => l.includes(contains))!);
  const agent = request.agent(server.url);
  const res = await agent.get(link.pathname + link.search).expect(302);
  expect(res.headers.location).not.toContain("error");
  return agent;
}

async function publish(): Promise<{ id: string; version: number; contentHash: string }> {
  const res = await designer.post(`/api/sites/${DEMO_SITE_ID}/reports`).send({}).expect(201);
  return res.body.report;
}

async function pdfText(agent: Agent, reportId: string) {
  const res = await agent
    .get(`/api/reports/${reportId}/pdf`)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks)));
    })
    .expect(200);
  expect(res.headers["content-type"]).toBe("application/pdf");
  const parser = new PDFParse({ data: new Uint8Array(res.body as Buffer) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

let v1: { id: string; version: number; contentHash: string };

beforeAll(async () => {
  server = await startTestServer();
  designer = await signInWithPassword(server.url, "tomas@lanternfield.test", DEMO_PASSWORD);
  admin = await signInWithPassword(server.url, "imke@lanternfield.test", DEMO_PASSWORD);
  const since = new Date();
  v1 = await publish();
  client = await followMailLink(CLIENT, since, "/auth/callback/nodemailer");
}, 120_000);
afterAll(() => server?.stop());

describe("publishing", () => {
  it("freezes version 1 with its hash, e-mails the client a sign-in link, and marks the site out for sign-off", async () => {
    expect(v1.version).toBe(1);
    expect(v1.contentHash).toMatch(/^[0-9a-f]{64}$/);
    const [site] = await server.ctx.db.select().from(sites).where(eq(sites.id, DEMO_SITE_ID));
    expect(site.status).toBe("out_for_sign_off");
    const me = await client.get("/api/me").expect(200);
    expect(me.body.role).toBe("client");
  });

  it("the PDF holds the figures the rules computed for the demo site, the cautions and the version and hash", async () => {
    const rows = await server.ctx.db.execute(sql`select id, site_id, kind, data, deleted, version from items where site_id = ${DEMO_SITE_ID} and deleted = false`);
    const itemsOfSite = rows.rows.map((r) => ({ id: r.id as string, siteId: r.site_id as string, kind: r.kind as never, data: r.data as Record<string, unknown>, deleted: false, version: Number(r.version) }));
    const [site] = await server.ctx.db.select().from(sites).where(eq(sites.id, DEMO_SITE_ID));
    const assembled = assembleSite({ id: site.id, name: site.name, address: site.address, closetRoomId: site.closetRoomId, settings: site.settings as Record<string, unknown> }, itemsOfSite);
    const parsed = parseSite(assembled.site);
    if (!parsed.ok) throw new Error("demo site does not parse");
    const evaluation = evaluateSite(parsed.value);
    const text = (await pdfText(client, v1.id)).replace(/\s+/g, " ");
    expect(text).toContain("The Okonkwo-Lindqvist house");
    expect(text).toContain(`Version 1`);
    expect(text).toContain(v1.contentHash);
    expect(text).toContain(`${evaluation.summary.deviceCount} devices are planned`);
    expect(text).toContain(`${Math.round(evaluation.summary.poeWatts.reservedW * 10) / 10} W`);
    const firstPoe = evaluation.devices.find((d) => d.recommendation === "poe")!;
    expect(text).toContain(firstPoe.label);
    // Each device in everyday words, with the rules' reasons as the technical detail after them.
    const v1Content = (await client.get(`/api/reports/${v1.id}`).expect(200)).body.content;
    const firstDevice = v1Content.rooms[0].devices[0];
    const plainAt = text.indexOf(firstDevice.plain[0]);
    expect(plainAt).toBeGreaterThan(0);
    expect(text.indexOf("Technical detail, for your installer", plainAt)).toBeGreaterThan(plainAt);
    expect(text).toMatch(/licensed electrician/);
    expect(text).toMatch(/Local codes and the authority having jurisdiction decide/);
    expect(text).toContain("IEEE 802.3af/at/bt");
    // No unit prices are set in the demo: the total says it covers the priced lines only.
    const content = (await client.get(`/api/reports/${v1.id}`).expect(200)).body.content;
    expect(content.materials.unpricedCount).toBe(content.materials.lines.length);
    // An unpriced line reads "to be priced", never a 0 that looks free.
    expect(content.materials.lines.every((l: { priced?: boolean }) => l.priced === false)).toBe(true);
    expect(text).toContain(`${content.materials.lines[0].description} · to be priced`);
    expect(text).not.toContain("· 0.00 USD");
    expect(text).toContain(`${content.materials.lines.length} lines are still to be priced: the total covers the priced lines only.`);
  });

  it("a published version cannot change; republishing makes version 2 and leaves version 1 as it was", async () => {
    await expect(server.ctx.db.execute(sql`update report_versions set content_hash = 'x' where id = ${v1.id}`)).rejects.toThrow();
    await expect(server.ctx.db.execute(sql`delete from report_versions where id = ${v1.id}`)).rejects.toThrow();
    const before = await client.get(`/api/reports/${v1.id}`).expect(200);
    const v2 = await publish();
    expect(v2.version).toBe(2);
    const [row] = await server.ctx.db.select().from(reportVersions).where(eq(reportVersions.id, v1.id));
    expect(row.contentHash).toBe(v1.contentHash);
    const again = await client.get(`/api/reports/${v1.id}`).expect(200);
    expect(again.body.content).toEqual(before.body.content);
    const latest = await client.get(`/api/reports/${v2.id}`).expect(200);
    expect(latest.body.changes).toMatchObject({ sinceVersion: 1, added: [], removed: [] });
  });

  it("only a designer or admin publishes", async () => {
    await client.post(`/api/sites/${DEMO_SITE_ID}/reports`).send({}).expect(403);
    const surveyor = await signInWithPassword(server.url, "priya@lanternfield.test", DEMO_PASSWORD);
    await surveyor.post(`/api/sites/${DEMO_SITE_ID}/reports`).send({}).expect(403);
  });
});

describe("the client's review", () => {
  it("comments on an item; a change request reaches the designer and marks the site", async () => {
    const list = await client.get(`/api/sites/${DEMO_SITE_ID}/reports`).expect(200);
    const latestId = list.body.reports[0].id;
    const report = await client.get(`/api/reports/${latestId}`).expect(200);
    const device = report.body.content.rooms[0].devices[0];
    await client.post(`/api/reports/${latestId}/comments`).send({ itemRef: device.id, body: "Can this one move to the other wall?" }).expect(201);
    const since = new Date();
    await client.post(`/api/reports/${latestId}/comments`).send({ itemRef: device.id, body: "Please put the camera higher.", changeRequest: true }).expect(201);
    const mail = await waitForMail(server.ctx.db, "tomas@lanternfield.test", since);
    expect(mail.subject).toContain("Changes asked");
    expect(mail.text).toContain("Please put the camera higher.");
    const [site] = await server.ctx.db.select().from(sites).where(eq(sites.id, DEMO_SITE_ID));
    expect(site.status).toBe("changes_asked");
    const seen = await designer.get(`/api/reports/${latestId}`).expect(200);
    expect(seen.body.comments.map((c: { body: string }) => c.body)).toEqual(["Can this one move to the other wall?", "Please put the camera higher."]);
    // The designer sees them on the plan's device row too, not only on the Report tab.
    const plan = (await designer.get(`/api/sites/${DEMO_SITE_ID}/plan`).expect(200)).body.plan;
    const row = plan.devices.find((d: { deviceId: string }) => d.deviceId === device.id);
    expect(row.homeowner).toMatchObject({ comments: 2, changesAsked: 1, latest: { body: "Please put the camera higher.", changeRequest: true, version: list.body.reports[0].version } });
    expect(plan.devices.filter((d: { homeowner: unknown }) => d.homeowner !== null)).toHaveLength(1);
    const bad = await client.post(`/api/reports/${latestId}/comments`).send({ itemRef: "no-such-device", body: "x" }).expect(400);
    expect(bad.body.error.fields.itemRef).toEqual(["Not a device of this report."]);
  });
});

describe("sign-off", () => {
  it("only the invited client signs, only the latest version, once; the record cannot be changed", async () => {
    const latest = await publish(); // version 3
    await designer.post(`/api/reports/${latest.id}/signoff`).send({ typedName: "Tomas Ferreira-Lund", confirm: true }).expect(403);
    const old = await client.post(`/api/reports/${v1.id}/signoff`).send({ typedName: "June Okonkwo-Lindqvist", confirm: true }).expect(409);
    expect(old.body.error.code).toBe("not_latest");
    const unconfirmed = await client.post(`/api/reports/${latest.id}/signoff`).send({ typedName: "June Okonkwo-Lindqvist" }).expect(400);
    expect(unconfirmed.body.error.fields.confirm).toEqual(["Tick the box to confirm you agree to this scope."]);
    const wrongName = await client.post(`/api/reports/${latest.id}/signoff`).send({ typedName: "Someone Else", confirm: true }).expect(400);
    expect(wrongName.body.error.fields.typedName[0]).toContain("June Okonkwo-Lindqvist");
    const signed = await client.post(`/api/reports/${latest.id}/signoff`).set("User-Agent", "test-phone").send({ typedName: "june okonkwo-lindqvist", confirm: true }).expect(201);
    expect(signed.body.signoff.contentHash).toBe(latest.contentHash);
    const twice = await client.post(`/api/reports/${latest.id}/signoff`).send({ typedName: "June Okonkwo-Lindqvist", confirm: true }).expect(409);
    expect(twice.body.error.code).toBe("already_signed");
    const [record] = await server.ctx.db.select().from(signoffs).where(eq(signoffs.reportId, latest.id));
    expect(record).toMatchObject({ clientUserId: "user_june", contentHash: latest.contentHash, userAgent: "test-phone" });
    expect(record.ipAddress).toMatch(/127\.0\.0\.1/);
    await expect(server.ctx.db.execute(sql`update signoffs set typed_name = 'x' where id = ${record.id}`)).rejects.toThrow();
    await expect(server.ctx.db.execute(sql`delete from signoffs where id = ${record.id}`)).rejects.toThrow();
    const [site] = await server.ctx.db.select().from(sites).where(eq(sites.id, DEMO_SITE_ID));
    expect(site.status).toBe("signed");
    const desk = await designer.get("/api/sites").expect(200);
    expect(desk.body.sites.find((s: { id: string }) => s.id === DEMO_SITE_ID).status).toBe("signed");
  });
});

describe("the plan after its scope was signed", () => {
  const planScope = async () => (await designer.get(`/api/sites/${DEMO_SITE_ID}/plan`).expect(200)).body.plan.scope;

  it("says nothing changed while the plan is the signed version; a price or a designer decision afterwards shows as a change, and undoing it clears it", async () => {
    // The sign-off test above signed version 3.
    const signed = await planScope();
    expect(signed).toMatchObject({ sinceVersion: 3, signed: true, changed: false, otherParts: [] });
    expect(signed.signedAt).toEqual(expect.any(String));

    await designer.put(`/api/sites/${DEMO_SITE_ID}/prices`).send({ "wall-plate:1-port": 2.5 }).expect(200);
    const priced = await planScope();
    expect(priced.changed).toBe(true);
    expect(priced.changes.totalBefore).toBe(0);
    expect(priced.changes.totalAfter).toBeGreaterThan(0);

    const reason = "The homeowner wants it on the outlet behind the television.";
    await designer.put(`/api/sites/${DEMO_SITE_ID}/devices/ap-living/decision`).send({ method: "existing_outlet", reason }).expect(200);
    const decided = await planScope();
    expect(decided.changes.methodChanged).toEqual([expect.objectContaining({ id: "ap-living", before: "PoE (Class 4, 802.3at port)" })]);

    await designer.delete(`/api/sites/${DEMO_SITE_ID}/devices/ap-living/decision`).send({ reason: "Back to the rules' advice." }).expect(200);
    await designer.put(`/api/sites/${DEMO_SITE_ID}/prices`).send({ "wall-plate:1-port": null }).expect(200);
    expect(await planScope()).toMatchObject({ sinceVersion: 3, signed: true, changed: false });

    // Publishing the changed plan again makes the new version the one compared, not yet signed.
    await designer.put(`/api/sites/${DEMO_SITE_ID}/prices`).send({ "wall-plate:1-port": 2.5 }).expect(200);
    const v4 = await publish();
    expect(await planScope()).toMatchObject({ sinceVersion: v4.version, signed: false, signedAt: null, changed: false });
    await designer.put(`/api/sites/${DEMO_SITE_ID}/prices`).send({ "wall-plate:1-port": null }).expect(200);
  });
});

describe("signing while changes are asked", () => {
  it("a version the homeowner asked changes on is signed only when they say they sign it as it is", async () => {
    const latest = await publish();
    const report = await client.get(`/api/reports/${latest.id}`).expect(200);
    const device = report.body.content.rooms[0].devices[0];
    await client.post(`/api/reports/${latest.id}/comments`).send({ itemRef: device.id, body: "Move it to the other wall, please.", changeRequest: true }).expect(201);

    const refused = await client.post(`/api/reports/${latest.id}/signoff`).send({ typedName: "June Okonkwo-Lindqvist", confirm: true }).expect(409);
    expect(refused.body.error.code).toBe("changes_asked");
    expect(refused.body.error.message).toBe(`You asked for a change on version ${latest.version}, and your installer has not answered with a new version yet. Wait for it, or confirm that you sign this version as it is, without that change.`);
    expect(refused.body.error.fields.despiteChangeRequests).toEqual([`Tick to sign version ${latest.version} as it is, without the change you asked for.`]);
    expect(await server.ctx.db.select().from(signoffs).where(eq(signoffs.reportId, latest.id))).toHaveLength(0);

    const wrongType = await client.post(`/api/reports/${latest.id}/signoff`).send({ typedName: "June Okonkwo-Lindqvist", confirm: true, despiteChangeRequests: "yes" }).expect(400);
    expect(wrongType.body.error.fields.despiteChangeRequests).toBeDefined();

    await client.post(`/api/reports/${latest.id}/signoff`).send({ typedName: "June Okonkwo-Lindqvist", confirm: true, despiteChangeRequests: true }).expect(201);
    // A new version answers the request: it is signed with no such confirmation.
    const next = await publish();
    await client.post(`/api/reports/${next.id}/signoff`).send({ typedName: "June Okonkwo-Lindqvist", confirm: true }).expect(201);
  });
});

describe("deposit", () => {
  it("signing leads to a checkout with the provider's SDK; the signed webhook marks it paid; forged and replayed webhooks are refused; paid survives a restart", async () => {
    await admin.put("/api/team/deposit").send({ enabled: true, amountCents: 25_000, currency: "usd" }).expect(200);
    const latest = await publish();
    const signed = await client.post(`/api/reports/${latest.id}/signoff`).send({ typedName: "June Okonkwo-Lindqvist", confirm: true }).expect(201);
    expect(signed.body.deposit).toMatchObject({ status: "unpaid", amountCents: 25_000, currency: "usd" });
    const checkout = new URL(signed.body.deposit.checkoutUrl);
    const page = await request(checkout.origin).get(checkout.pathname).expect(200);
    expect(page.text).toContain("250.00 USD");

    const payments = server.ctx.payments!;
    const sessionId = checkout.pathname.split("/").pop()!;
    const payload = JSON.stringify({ id: "evt_forged", object: "event", type: "checkout.session.completed", created: Math.floor(Date.now() / 1000), data: { object: { id: sessionId, payment_status: "paid" } } });
    const forged = Stripe.webhooks.generateTestHeaderString({ payload, secret: "whsec_not_ours" });
    await request(server.url).post("/api/payments/webhook").set("Content-Type", "application/json").set("Stripe-Signature", forged).send(payload).expect(400);
    const stale = Stripe.webhooks.generateTestHeaderString({ payload, secret: payments.webhookSecret, timestamp: Math.floor(Date.now() / 1000) - 3600 });
    const replay = await request(server.url).post("/api/payments/webhook").set("Content-Type", "application/json").set("Stripe-Signature", stale).send(payload).expect(400);
    expect(replay.body.error.code).toBe("bad_signature");
    let view = await client.get(`/api/reports/${latest.id}`).expect(200);
    expect(view.body.deposit.status).toBe("unpaid");

    // The homeowner pays on the provider's page; the provider calls our webhook, signed.
    const paid = await request(checkout.origin).post(`${checkout.pathname}/complete`).expect(303);
    expect(paid.headers.location).toBe(`${server.url}/sites/${DEMO_SITE_ID}/report?paid=1`);
    view = await client.get(`/api/reports/${latest.id}`).expect(200);
    expect(view.body.deposit.status).toBe("paid");

    // The same event delivered again has no second effect.
    const good = JSON.stringify({ id: "evt_again", object: "event", type: "checkout.session.completed", created: Math.floor(Date.now() / 1000), data: { object: { id: sessionId, payment_status: "paid" } } });
    const header = Stripe.webhooks.generateTestHeaderString({ payload: good, secret: payments.webhookSecret });
    await request(server.url).post("/api/payments/webhook").set("Content-Type", "application/json").set("Stripe-Signature", header).send(good).expect(200);
    const dup = await request(server.url).post("/api/payments/webhook").set("Content-Type", "application/json").set("Stripe-Signature", header).send(good).expect(200);
    expect(dup.body.duplicate).toBe(true);

    // Restart: a new server over the same database still knows it was paid.
    const secret = server.ctx.config.authSecret;
    const testDb = server.testDb;
    await server.close();
    server = await startTestServer({ reuse: testDb, seed: false, config: { authSecret: secret } });
    const link = new URL(await createSignInLink(server.ctx, CLIENT, "/"));
    const june = request.agent(server.url);
    await june.get(link.pathname + link.search).expect(302);
    const after = await june.get(`/api/reports/${latest.id}`).expect(200);
    expect(after.body.deposit.status).toBe("paid");
    await testDb.drop();
  });
});
