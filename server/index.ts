import type { Server } from "node:http";
import { createDb } from "../db/client";
import { runMigrations } from "../db/migrate";
import { createApp } from "./app";
import { membershipLookup } from "./auth/auth-config";
import { startMemberDirectory } from "./auth/member-directory";
import { startSiteLists } from "./services/site-lists";
import type { ServerConfig } from "./config";
import type { AppContext } from "./context";
import { createLogger, type Logger } from "./logger";
import { createMailer } from "./mail/mailer";
import { startSmtpSink, type CapturedMail, type SmtpSink } from "./mail/smtp-sink";
import { startLocalObjectStore } from "./storage/local-object-store";
import { createObjectStore } from "./storage/object-store";
import { startFakePaymentProvider } from "./payments/fake-payment-provider";
import { createPayments } from "./payments/payments";

export interface RunningServer {
  server: Server;
  url: string;
  ctx: AppContext;
  sink?: SmtpSink;
  close(): Promise<void>;
}

export interface StartOptions {
  logger?: Logger;
  /** Called for every message the local SMTP sink captures (the start command prints a line). */
  onMail?: (mail: CapturedMail) => void;
}

/** Migrates, starts the local mail sink when no SMTP provider is set, then listens. */
export async function startServer(config: ServerConfig, { logger = createLogger(), onMail }: StartOptions = {}): Promise<RunningServer> {
  if (!config.authSecret) throw new Error("AUTH_SECRET is not set. `npm start` generates one into .env.local; in production set it in the environment.");
  const db = createDb(config.databaseUrl);
  await runMigrations(db);
  const sink = config.mailSink ? await startSmtpSink(db, { port: config.sinkPort ?? 0, onMail }) : undefined;
  const mailer = createMailer({ smtpUrl: config.smtpUrl, sinkPort: sink?.port, from: config.mailFrom });
  const localObjects = config.s3.endpoint ? undefined : await startLocalObjectStore(config.objectsDir);
  const objects = createObjectStore(localObjects ? { ...config.s3, ...localObjects.credentials, endpoint: localObjects.endpoint } : { ...config.s3, endpoint: config.s3.endpoint! });
  await objects.ensureBucket();
  let publicUrl = config.publicOrigin;
  const fakePayments = config.payments.secretKey ? undefined : await startFakePaymentProvider({ webhookUrl: () => `${publicUrl}/api/payments/webhook` });
  const payments = fakePayments
    ? createPayments({ secretKey: fakePayments.secretKey, webhookSecret: fakePayments.webhookSecret, apiOrigin: fakePayments.origin })
    : createPayments({ secretKey: config.payments.secretKey!, webhookSecret: config.payments.webhookSecret ?? "", apiOrigin: config.payments.apiOrigin });
  const [members, siteLists] = await Promise.all([
    startMemberDirectory({ connectionString: config.databaseUrl, pool: db.$client, lookup: membershipLookup(db), logger }),
    startSiteLists({ connectionString: config.databaseUrl, db, pool: db.$client, logger }),
  ]);
  /** Everything started above, closed whatever fails: the stand-ins and the remembered members and site lists, then the pool. */
  const closeServices = async () => {
    await Promise.allSettled([members.close(), siteLists.close(), sink?.close(), localObjects?.close(), fakePayments?.close()]);
    await db.$client.end();
  };
  const ctx: AppContext = { db, config, logger, mailer, objects, payments, members, siteLists };
  const server = await new Promise<Server>((resolve, reject) => {
    const s = createApp(ctx).listen(config.port, config.host);
    s.once("listening", () => resolve(s));
    s.once("error", (err: NodeJS.ErrnoException) => {
      if (err.code === "EADDRINUSE") {
        reject(new Error(`Port ${config.port} on ${config.host} is already in use. Stop the other program or set PORT to a free port.`));
      } else reject(err);
    });
  }).catch(async (err) => {
    await closeServices();
    throw err;
  });
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : config.port;
  // The fake provider posts its webhooks to where this server really listens.
  publicUrl = `http://${config.host}:${port}`;
  let closing: Promise<void> | undefined;
  return {
    server,
    url: `http://${config.host}:${port}`,
    ctx,
    sink,
    close() {
      // Stop accepting, let in-flight requests finish, then close the services and the pool.
      closing ??= new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      }).then(closeServices);
      return closing;
    },
  };
}
