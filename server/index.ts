import type { Server } from "node:http";
import { createDb } from "../db/client";
import { runMigrations } from "../db/migrate";
import { createApp } from "./app";
import type { ServerConfig } from "./config";
import type { AppContext } from "./context";
import { createLogger, type Logger } from "./logger";

export interface RunningServer {
  server: Server;
  url: string;
  ctx: AppContext;
  close(): Promise<void>;
}

/** Migrates, then listens. Resolves once the port is bound; rejects with a clear message if it is taken. */
export async function startServer(config: ServerConfig, logger: Logger = createLogger()): Promise<RunningServer> {
  const db = createDb(config.databaseUrl);
  await runMigrations(db);
  const ctx: AppContext = { db, config, logger };
  const app = createApp(ctx);
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host);
    s.once("listening", () => resolve(s));
    s.once("error", (err: NodeJS.ErrnoException) => {
      if (err.code === "EADDRINUSE") {
        reject(new Error(`Port ${config.port} on ${config.host} is already in use. Stop the other program or set PORT to a free port.`));
      } else reject(err);
    });
  });
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : config.port;
  let closing: Promise<void> | undefined;
  return {
    server,
    url: `http://${config.host}:${port}`,
    ctx,
    close() {
      // Stop accepting, let in-flight requests finish, then close the pool.
      closing ??= new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      }).then(() => db.$client.end());
      return closing;
    },
  };
}
