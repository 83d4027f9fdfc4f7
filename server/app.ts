import { ExpressAuth } from "@auth/express";
import express from "express";
import { rateLimit } from "express-rate-limit";
import { loadActor } from "./auth/actor";
import { createAuthConfig } from "./auth/auth-config";
import { pinHost } from "./auth/host-pin";
import type { AppContext } from "./context";
import { HttpError, apiNotFound, errorHandler } from "./errors";
import { securityHeaders } from "./middleware/security-headers";
import { rejectNulCharacters } from "./middleware/reject-nul";
import { requestLog } from "./middleware/request-log";
import { sameOriginWrites } from "./middleware/same-origin-writes";
import { writesRefreshSiteLists } from "./middleware/writes-refresh-site-lists";
import { healthRouter } from "./routes/health";
import { invitesRouter } from "./routes/invites";
import { meRouter, sessionRouter } from "./routes/me";
import { outboxRouter } from "./routes/outbox";
import { photosRouter } from "./routes/photos";
import { paymentsWebhookRouter } from "./routes/payments-webhook";
import { reportsRouter } from "./routes/reports";
import { closetRouter } from "./routes/closet";
import { deskRouter } from "./routes/desk";
import { planRouter } from "./routes/plan";
import { rulesRouter } from "./routes/rules";
import { sitesRouter } from "./routes/sites";
import { syncRouter } from "./routes/sync";
import { teamRouter } from "./routes/team";
import { requireSignedIn } from "./auth/actor";
import { webRouter } from "./web";

function limiter(limit: number, message: string, options: { skipSuccessfulRequests?: boolean; requestWasSuccessful?: (req: express.Request, res: express.Response) => boolean } = {}) {
  return rateLimit({
    windowMs: 15 * 60 * 1000,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    ...options,
    handler: () => {
      throw new HttpError(429, "too_many_attempts", message);
    },
  });
}

/** A password sign-in worked when its answer sets a session cookie (a refused one answers with an error address instead). */
function startedSession(_req: express.Request, res: express.Response): boolean {
  const cookies = res.getHeader("set-cookie");
  return ([] as (string | number)[]).concat(cookies ?? []).some((c) => /^(__Secure-)?authjs\.session-token=[^;]/.test(String(c)));
}

/** API answers carry one member's data: no cache (browser or proxy) may keep them. */
const privateResponses: express.RequestHandler = (_req, res, next) => {
  res.setHeader("Cache-Control", "no-store");
  next();
};

/** Builds the Express app; `listen` lives in server/index.ts so tests drive this same app. */
export function createApp(ctx: AppContext) {
  const { config } = ctx;
  const app = express();
  app.disable("x-powered-by");
  app.set("trust proxy", 1);

  // API bodies are private and sent with no-store, so an ETag (a hash of every body) buys nothing.
  // The web build's files keep validators: express.static its ETags and Last-Modified, the app
  // shell its Last-Modified, the service worker an ETag of its own (server/web.ts).
  app.set("etag", false);
  // The error handler logs failures here, with the request's id.
  app.locals.logger = ctx.logger;

  app.use(requestLog(ctx.logger, (url) => url.startsWith("/api")));
  app.use(securityHeaders(config.publicOrigin));
  app.use(pinHost(config.publicOrigin));

  const authConfig = createAuthConfig(ctx, ctx.mailer);
  // Wrong passwords count against the address; sign-ins that work do not, so a team behind one office
  // connection is not locked out by signing in. Every e-mailed link counts (each one sends mail).
  const tooMany = "Too many sign-in attempts from this address. Wait 15 minutes and try again.";
  app.post("/auth/callback/credentials", limiter(config.authRateLimit, tooMany, { skipSuccessfulRequests: true, requestWasSuccessful: startedSession }));
  app.post("/auth/signin/nodemailer", limiter(config.authRateLimit, tooMany));
  app.use("/auth", ExpressAuth(authConfig));

  // Signed webhooks need the raw body: before the JSON parser.
  app.use(paymentsWebhookRouter(ctx));

  // Each route file adds its routes to one flat router per kind of caller (its function's second
  // argument), so a request is matched against routes rather than entering a router per file.
  // Public API: no session needed.
  const publicApi = express.Router();
  healthRouter(ctx, publicApi);
  sessionRouter(ctx, publicApi);
  // Only the invitation routes are limited here (guessing tokens); the rest of the API is not.
  publicApi.use("/invites", limiter(config.authRateLimit * 3, "Too many attempts with invitation links. Wait 15 minutes and try again."));
  invitesRouter(ctx, publicApi);

  // Everything else needs a signed-in member; each route then asks survey/policy.ts.
  const memberApi = express.Router();
  memberApi.use(requireSignedIn);
  memberApi.use(writesRefreshSiteLists(ctx.siteLists));
  for (const addRoutes of [meRouter, sitesRouter, teamRouter, outboxRouter, syncRouter, photosRouter, rulesRouter, planRouter, closetRouter, deskRouter, reportsRouter]) {
    addRoutes(ctx, memberApi);
  }

  const api = express.Router();
  api.use(privateResponses);
  api.use(express.json({ limit: "4mb" }));
  api.use(rejectNulCharacters);
  api.use(sameOriginWrites(config.publicOrigin));
  api.use(loadActor(ctx, authConfig));
  api.use(publicApi);
  api.use(memberApi);
  api.use(apiNotFound);
  app.use("/api", api);
  app.locals.apiRouters = { publicApi, memberApi };

  app.use(webRouter(config.webDist));
  app.use(errorHandler);
  return app;
}
