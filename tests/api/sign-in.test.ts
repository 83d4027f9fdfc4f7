import { eq } from "drizzle-orm";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { verificationTokens } from "../../db/schema";
import { csrfToken, requestSignInLink, signInWithPassword, tryPasswordSignIn } from "../support/auth-client";
import { mailCount, waitForMail } from "../support/mail";
import { startTestServer, type TestServer } from "../support/test-server";

const CLIENT = "june@okonkwo-lindqvist.test";
const ADMIN = "imke@lanternfield.test";

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.stop());

describe("team members sign in with e-mail and password", () => {
  it("a right password gives a session; /api/me then knows the role", async () => {
    const agent = await signInWithPassword(server.url, ADMIN, DEMO_PASSWORD);
    const me = await agent.get("/api/me").expect(200);
    expect(me.body).toMatchObject({ user: { email: ADMIN, name: "Imke Varga" }, role: "admin", team: { name: "Lanternfield Low Voltage" } });
    expect(me.body.permissions["team:manage"]).toBe(true);
  });

  it("the session cookie is httpOnly and SameSite=Lax", async () => {
    const agent = request.agent(server.url);
    const token = await csrfToken(agent);
    const res = await agent
      .post("/auth/callback/credentials")
      .set("X-Auth-Return-Redirect", "1")
      .type("form")
      .send({ email: ADMIN, password: DEMO_PASSWORD, csrfToken: token });
    const cookie = ([] as string[]).concat(res.headers["set-cookie"]).find((c) => c.startsWith("authjs.session-token="));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it("a wrong password is refused with CredentialsSignin and sets no session", async () => {
    const result = await tryPasswordSignIn(request.agent(server.url), ADMIN, "not-the-password");
    expect(result.ok).toBe(false);
    expect(result.url).toContain("error=CredentialsSignin");
    expect(result.sessionCookieSet).toBe(false);
  });

  it("a client cannot sign in with a password, even a guessed one", async () => {
    const result = await tryPasswordSignIn(request.agent(server.url), CLIENT, DEMO_PASSWORD);
    expect(result.url).toContain("error=CredentialsSignin");
  });

  it("a POST without Auth.js's CSRF token is refused", async () => {
    const res = await request(server.url)
      .post("/auth/callback/credentials")
      .set("X-Auth-Return-Redirect", "1")
      .type("form")
      .send({ email: ADMIN, password: DEMO_PASSWORD });
    expect(res.body.url ?? res.headers.location).toContain("error=MissingCSRF");
  });
});

describe("clients sign in by an e-mailed link through the local SMTP sink", () => {
  it("request, capture the message, follow the link, land signed in as the client", async () => {
    const agent = request.agent(server.url);
    const since = new Date();
    const res = await expectOk(requestSignInLink(agent, CLIENT));
    expect(res.body.url).not.toContain("error=");
    const mail = await waitForMail(server.ctx.db, CLIENT, since);
    expect(mail.subject).toBe("Your Dropwise sign-in link");
    const link = mail.links.find((l) => l.includes("/auth/callback/nodemailer"));
    expect(link).toBeDefined();
    expect(link!.startsWith(`${server.url}/auth/callback/nodemailer?`)).toBe(true);
    const landed = await agent.get(new URL(link!).pathname + new URL(link!).search).expect(302);
    expect(landed.headers.location).toBe(`${server.url}/`);
    const me = await agent.get("/api/me").expect(200);
    expect(me.body).toMatchObject({ role: "client", user: { email: CLIENT } });
    // The link works once.
    const again = await request(server.url).get(new URL(link!).pathname + new URL(link!).search).expect(302);
    expect(again.headers.location).toContain("error=Verification");
  });

  it("a spoofed Host header cannot redirect the link to another site", async () => {
    const agent = request.agent(server.url);
    const since = new Date();
    await expectOk(requestSignInLink(agent, CLIENT, { Host: "evil.example", "X-Forwarded-Host": "evil.example", "X-Forwarded-Proto": "https" }));
    const mail = await waitForMail(server.ctx.db, CLIENT, since);
    expect(mail.text).not.toContain("evil.example");
    for (const link of mail.links) expect(new URL(link).origin).toBe(server.url);
  });

  it("an expired link says so (error=Verification) and gives no session", async () => {
    const agent = request.agent(server.url);
    const since = new Date();
    await expectOk(requestSignInLink(agent, CLIENT));
    const mail = await waitForMail(server.ctx.db, CLIENT, since);
    await server.ctx.db.update(verificationTokens).set({ expires: new Date(Date.now() - 1000) }).where(eq(verificationTokens.identifier, CLIENT));
    const link = new URL(mail.links.find((l) => l.includes("/auth/callback/nodemailer"))!);
    const res = await agent.get(link.pathname + link.search).expect(302);
    expect(res.headers.location).toContain("error=Verification");
    await agent.get("/api/me").expect(401);
  });

  it("nobody gets a link for an address that was not invited as a client, and no user is created", async () => {
    const before = await mailCount(server.ctx.db, "stranger@nowhere.test");
    const res = await expectOk(requestSignInLink(request.agent(server.url), "stranger@nowhere.test"));
    expect(res.body.url).toContain("error=AccessDenied");
    const teamMember = await expectOk(requestSignInLink(request.agent(server.url), ADMIN));
    expect(teamMember.body.url).toContain("error=AccessDenied");
    await new Promise((r) => setTimeout(r, 200));
    expect(await mailCount(server.ctx.db, "stranger@nowhere.test")).toBe(before);
  });
});

describe("sign-in rate limit", () => {
  it("counts wrong passwords, not sign-ins that work: a team behind one address keeps signing in", async () => {
    const limited = await startTestServer({ config: { authRateLimit: 3 } });
    try {
      for (let i = 0; i < 6; i++) await signInWithPassword(limited.url, ADMIN, DEMO_PASSWORD);
      const agent = request.agent(limited.url);
      for (let i = 0; i < 3; i++) await tryPasswordSignIn(agent, ADMIN, "wrong-password");
      const token = await csrfToken(agent);
      await agent.post("/auth/callback/credentials").type("form").send({ email: ADMIN, password: DEMO_PASSWORD, csrfToken: token }).expect(429);
    } finally {
      await limited.stop();
    }
  });

  it("answers 429 with a clear message after too many attempts", async () => {
    const limited = await startTestServer({ config: { authRateLimit: 3 } });
    try {
      const agent = request.agent(limited.url);
      for (let i = 0; i < 3; i++) await tryPasswordSignIn(agent, ADMIN, "wrong-password");
      const token = await csrfToken(agent);
      const res = await agent.post("/auth/callback/credentials").type("form").send({ email: ADMIN, password: "x", csrfToken: token }).expect(429);
      expect(res.body.error).toEqual({ code: "too_many_attempts", message: "Too many sign-in attempts from this address. Wait 15 minutes and try again." });
    } finally {
      await limited.stop();
    }
  });
});

describe("inviting a team member", () => {
  it("admin invites, the link is mailed, accepting sets a password, the invite works once", async () => {
    const admin = await signInWithPassword(server.url, ADMIN, DEMO_PASSWORD);
    const email = "noor@lanternfield.test";
    const since = new Date();
    await admin.post("/api/team/invites").send({ email, role: "surveyor" }).expect(201);
    const mail = await waitForMail(server.ctx.db, email, since);
    const link = mail.links.find((l) => l.includes("/invite/"))!;
    expect(link.startsWith(`${server.url}/invite/`)).toBe(true);
    const token = link.split("/invite/")[1];
    const info = await request(server.url).get(`/api/invites/${token}`).expect(200);
    expect(info.body.invite).toMatchObject({ email, role: "surveyor", teamName: "Lanternfield Low Voltage" });
    const weak = await request(server.url).post(`/api/invites/${token}/accept`).send({ name: "Noor", password: "short" }).expect(400);
    expect(weak.body.error.fields.password).toEqual(["Use at least 10 characters for the password."]);
    await request(server.url).post(`/api/invites/${token}/accept`).send({ name: "Noor Aziz", password: "a-long-enough-secret" }).expect(201);
    const used = await request(server.url).post(`/api/invites/${token}/accept`).send({ name: "Noor Aziz", password: "a-long-enough-secret" }).expect(410);
    expect(used.body.error.code).toBe("invite_used");
    const noor = await signInWithPassword(server.url, email, "a-long-enough-secret");
    const me = await noor.get("/api/me").expect(200);
    expect(me.body.role).toBe("surveyor");
  });

  it("an unknown invitation token is a 404 with a message", async () => {
    const res = await request(server.url).get("/api/invites/not-a-real-token").expect(404);
    expect(res.body.error.code).toBe("invite_unknown");
  });

  it("a removed member's session stops working at once", async () => {
    const admin = await signInWithPassword(server.url, ADMIN, DEMO_PASSWORD);
    const email = "temp-helper@lanternfield.test";
    const since = new Date();
    await admin.post("/api/team/invites").send({ email, role: "designer" }).expect(201);
    const token = (await waitForMail(server.ctx.db, email, since)).links[0].split("/invite/")[1];
    const accepted = await request(server.url).post(`/api/invites/${token}/accept`).send({ name: "Temp", password: "another-long-secret" }).expect(201);
    const temp = await signInWithPassword(server.url, email, "another-long-secret");
    await temp.get("/api/sites").expect(200);
    await admin.delete(`/api/team/members/${accepted.body.user.id}`).expect(204);
    await temp.get("/api/sites").expect(401);
  });

  it("the last admin cannot be demoted or removed", async () => {
    const admin = await signInWithPassword(server.url, ADMIN, DEMO_PASSWORD);
    const res = await admin.patch("/api/team/members/user_imke").send({ role: "designer" }).expect(409);
    expect(res.body.error.code).toBe("last_admin");
  });
});

async function expectOk(pending: ReturnType<typeof requestSignInLink>) {
  const res = await pending;
  expect(res.status).toBe(200);
  return res;
}

describe("rate limits stay where they belong", () => {
  it("many ordinary API requests are never throttled by the sign-in or invitation limits", async () => {
    const limited = await startTestServer({ config: { authRateLimit: 2 } });
    try {
      const agent = await signInWithPassword(limited.url, ADMIN, DEMO_PASSWORD);
      for (let i = 0; i < 20; i++) await agent.get("/api/sites").expect(200);
      for (let i = 0; i < 7; i++) await request(limited.url).get("/api/invites/not-a-token");
      const res = await request(limited.url).get("/api/invites/not-a-token").expect(429);
      expect(res.body.error.code).toBe("too_many_attempts");
      await agent.get("/api/sites").expect(200);
    } finally {
      await limited.stop();
    }
  });
});
