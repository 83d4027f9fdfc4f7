import { randomUUID } from "node:crypto";
import { ExpressAuth } from "@auth/express";
import express from "express";
import { rateLimit } from "express-rate-limit";
import { pinoHttp } from "pino-http";
import { loadActor } from "./auth/actor";
import { createAuthConfig } from "./auth/auth-config";
import { pinHost } from "./auth/host-pin";
import type { AppContext } from "./context";
import { HttpError, apiNotFound, errorHandler } from "./errors";
import { securityHeaders } from "./middleware/security-headers";
import { rejectNulCharacters } from "./middleware/reject-nul";
import { sameOriginWrites } from "./middleware/same-origin-writes";
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
import { httpLogSerializers } from "./logger";
import { webRouter } from "./web";

function limiter(limit: number, message: string) {
  return rateLimit({
    windowMs: 15 * 60 * 1000,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    handler: () => {
      throw new HttpError(429, "too_many_attempts", message);
    },
  });
}

/** Builds the Express app; `listen` lives in server/index.ts so tests drive this same app. */
export function createApp(ctx: AppContext) {
  const { config } = ctx;
  const app = express();
  app.disable("x-powered-by");
  app.set("trust proxy", 1);

  app.use(
    pinoHttp({
      logger: ctx.logger,
      genReqId: (req, res) => {
        const incoming = req.headers["x-request-id"];
        const id = typeof incoming === "string" && /^[\w-]{8,64}$/.test(incoming) ? incoming : randomUUID();
        res.setHeader("X-Request-Id", id);
        return id;
      },
      autoLogging: { ignore: (req) => !req.url?.startsWith("/api") },
      wrapSerializers: false,
      serializers: httpLogSerializers,
    }),
  );
  app.use(securityHeaders(config.publicOrigin));
  app.use(pinHost(config.publicOrigin));

  const authConfig = createAuthConfig(ctx, ctx.mailer);
  const signInLimiter = limiter(config.authRateLimit, "Too many sign-in attempts from this address. Wait 15 minutes and try again.");
  app.post(["/auth/callback/credentials", "/auth/signin/nodemailer"], signInLimiter);
  app.use("/auth", ExpressAuth(authConfig));

  // Signed webhooks need the raw body: before the JSON parser.
  app.use(paymentsWebhookRouter(ctx));

  // Public API: no session needed.
  const publicApi = express.Router();
  publicApi.use(healthRouter(ctx));
  publicApi.use(sessionRouter(ctx));
  // Only the invitation routes are limited here (guessing tokens); the rest of the API is not.
  publicApi.use("/invites", limiter(config.authRateLimit * 3, "Too many attempts with invitation links. Wait 15 minutes and try again."));
  publicApi.use(invitesRouter(ctx));

  // Everything else needs a signed-in member; each route then asks survey/policy.ts.
  const memberApi = express.Router();
  memberApi.use(requireSignedIn);
  memberApi.use(meRouter(ctx));
  memberApi.use(sitesRouter(ctx));
  memberApi.use(teamRouter(ctx));
  memberApi.use(outboxRouter(ctx));
  memberApi.use(syncRouter(ctx));
  memberApi.use(photosRouter(ctx));
  memberApi.use(rulesRouter(ctx));
  memberApi.use(planRouter(ctx));
  memberApi.use(closetRouter(ctx));
  memberApi.use(deskRouter(ctx));
  memberApi.use(reportsRouter(ctx));

  const api = express.Router();
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
