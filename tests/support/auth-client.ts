// Signs in through Auth.js exactly as the app does: CSRF token, form POST, session cookie.
import request from "supertest";
import type { App } from "supertest/types";

export type Agent = ReturnType<typeof request.agent>;

export async function csrfToken(agent: Agent): Promise<string> {
  const res = await agent.get("/auth/csrf").expect(200);
  return res.body.csrfToken as string;
}

/** Returns the agent signed in, or throws with Auth.js's answer when the sign-in failed. */
export async function signInWithPassword(appOrUrl: App | string, email: string, password: string): Promise<Agent> {
  const agent = request.agent(appOrUrl);
  const result = await tryPasswordSignIn(agent, email, password);
  if (!result.ok) throw new Error(`sign-in failed for ${email}: ${result.url}`);
  return agent;
}

export async function tryPasswordSignIn(agent: Agent, email: string, password: string) {
  const token = await csrfToken(agent);
  const res = await agent
    .post("/auth/callback/credentials")
    .set("X-Auth-Return-Redirect", "1")
    .type("form")
    .send({ email, password, csrfToken: token, callbackUrl: "/" });
  const url: string = res.body?.url ?? res.headers.location ?? "";
  const setCookie = ([] as string[]).concat(res.headers["set-cookie"] ?? []);
  return { ok: res.status === 200 && !url.includes("error="), status: res.status, url, body: res.body, sessionCookieSet: setCookie.some((c) => c.includes("authjs.session-token=")) };
}

export async function requestSignInLink(agent: Agent, email: string, extraHeaders: Record<string, string> = {}) {
  const token = await csrfToken(agent);
  const req = agent.post("/auth/signin/nodemailer").set("X-Auth-Return-Redirect", "1");
  for (const [k, v] of Object.entries(extraHeaders)) req.set(k, v);
  return req.type("form").send({ email, csrfToken: token, callbackUrl: "/" });
}
