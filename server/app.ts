import { randomUUID } from "node:crypto";
import express from "express";
import { pinoHttp } from "pino-http";
import type { AppContext } from "./context";
import { apiNotFound, errorHandler } from "./errors";
import { crossOriginIsolation } from "./middleware/cross-origin-isolation";
import { healthRouter } from "./routes/health";
import { webRouter } from "./web";

/** Builds the Express app; `listen` lives in server/index.ts so tests drive this same app. */
export function createApp(ctx: AppContext) {
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
    }),
  );
  app.use(crossOriginIsolation);

  const api = express.Router();
  api.use(express.json({ limit: "1mb" }));
  api.use(healthRouter(ctx));
  api.use(apiNotFound);
  app.use("/api", api);

  app.use(webRouter(ctx.config.webDist));
  app.use(errorHandler);
  return app;
}
