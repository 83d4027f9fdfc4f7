// Auth.js for Express: team members sign in with e-mail and password (argon2), clients with an
// e-mailed link. JWT sessions (required for credentials) with the Drizzle adapter for link tokens.
import { DrizzleAdapter } from "@auth/drizzle-adapter";
import type { ExpressAuthConfig } from "@auth/express";
import Credentials from "@auth/express/providers/credentials";
import Nodemailer from "@auth/express/providers/nodemailer";
import { eq, sql } from "drizzle-orm";
import * as v from "valibot";
import { SignInSchema } from "../../survey/team";
import { accounts, memberships, sessions, users, verificationTokens } from "../../db/schema";
import type { AppContext } from "../context";
import type { Mailer } from "../mail/mailer";
import { verifyPassword } from "./passwords";

export const SIGN_IN_LINK_MINUTES = 15;

export function createAuthConfig(ctx: AppContext, mailer: Mailer): ExpressAuthConfig {
  const { db, config, logger } = ctx;
  const origin = new URL(config.publicOrigin);

  async function userByEmail(email: string) {
    const rows = await db
      .select({ id: users.id, name: users.name, email: users.email, passwordHash: users.passwordHash, role: memberships.role })
      .from(users)
      .innerJoin(memberships, eq(memberships.userId, users.id))
      .where(eq(users.email, email.trim().toLowerCase()))
      .limit(1);
    return rows[0];
  }

  return {
    secret: config.authSecret,
    basePath: "/auth",
    // The Host header is pinned to PUBLIC_ORIGIN before this mount (see host-pin.ts).
    trustHost: true,
    useSecureCookies: origin.protocol === "https:",
    adapter: DrizzleAdapter(db, { usersTable: users, accountsTable: accounts, sessionsTable: sessions, verificationTokensTable: verificationTokens }),
    session: { strategy: "jwt", maxAge: 30 * 24 * 60 * 60 },
    pages: { signIn: "/sign-in", error: "/sign-in", verifyRequest: "/sign-in" },
    providers: [
      Credentials({
        id: "credentials",
        credentials: { email: { type: "email" }, password: { type: "password" } },
        async authorize(raw) {
          const parsed = v.safeParse(SignInSchema, raw);
          if (!parsed.success) return null;
          const user = await userByEmail(parsed.output.email);
          // Clients have no password: they use the e-mailed link.
          if (!user || user.role === "client") return null;
          if (!(await verifyPassword(user.passwordHash, parsed.output.password))) return null;
          return { id: user.id, name: user.name, email: user.email };
        },
      }),
      Nodemailer({
        id: "nodemailer",
        server: mailer.transportOptions,
        from: config.mailFrom,
        maxAge: SIGN_IN_LINK_MINUTES * 60,
        async sendVerificationRequest({ identifier, url }) {
          // Defence in depth: never mail a link that points anywhere but our own origin.
          if (new URL(url).origin !== origin.origin) throw new Error(`refusing a sign-in link for ${new URL(url).origin}`);
          await mailer.send({
            to: identifier,
            subject: "Your Dropwise sign-in link",
            text: [
              "Hello,",
              "",
              "Open this link to sign in to Dropwise and read the scope your installer prepared:",
              url,
              "",
              `The link works once and expires in ${SIGN_IN_LINK_MINUTES} minutes. If you did not ask for it, ignore this message.`,
            ].join("\n"),
          });
        },
      }),
    ],
    callbacks: {
      async signIn({ user, account, email }) {
        if (account?.provider !== "nodemailer") return true;
        // Links only for homeowners who were invited to a site; nobody signs up by themselves.
        if (email?.verificationRequest) {
          const known = user.email ? await userByEmail(user.email) : undefined;
          return known?.role === "client";
        }
        return true;
      },
      jwt({ token, user }) {
        if (user?.id) token.uid = user.id;
        return token;
      },
      session({ session, token }) {
        if (typeof token.uid === "string") session.user.id = token.uid;
        return session;
      },
    },
    logger: {
      error: (error) => logger.warn({ err: { name: error.name, message: error.message } }, "auth"),
      warn: (code) => logger.debug({ code }, "auth warning"),
      debug: () => {},
    },
  };
}

/**
 * The member's current team and role, as the database has them now: what the member directory
 * (member-directory.ts) reads when it does not remember a member, and on every request while it
 * cannot. A prepared statement (planned once per connection by Postgres, built once by Drizzle).
 */
export function membershipLookup(db: AppContext["db"]) {
  const query = db
    .select({ userId: users.id, name: users.name, email: users.email, teamId: memberships.teamId, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.userId, sql.placeholder("userId")))
    .limit(1)
    .prepare("member_by_user");
  return async (userId: string) => (await query.execute({ userId }))[0];
}
