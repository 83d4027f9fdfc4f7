import type { Db } from "../db/client";
import type { ServerConfig } from "./config";
import type { MemberDirectory } from "./auth/member-directory";
import type { Logger } from "./logger";
import type { Mailer } from "./mail/mailer";
import type { Payments } from "./payments/payments";
import type { SiteLists } from "./services/site-lists";
import type { ObjectStore } from "./storage/object-store";

/** What every router gets: built once at start-up, no global state. */
export interface AppContext {
  db: Db;
  config: ServerConfig;
  logger: Logger;
  mailer: Mailer;
  objects: ObjectStore;
  /** Deposits; absent when no provider is configured (tests that drive the app directly). */
  payments?: Payments;
  /** Memberships remembered between requests (a running server); without it every request reads them. */
  members?: MemberDirectory;
  /** Each team's site list remembered between requests (a running server); without it every request reads it. */
  siteLists?: SiteLists;
}
