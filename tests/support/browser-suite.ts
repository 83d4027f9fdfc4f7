// The setup every browser test file shares: one server (with the demo site) and one Chromium for
// the file, closed after it. Read `suite.server` and `suite.browser` inside the tests.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll } from "vitest";
import { launchBrowser } from "./browser";
import { startTestServer, type TestServer } from "./test-server";

export interface BrowserSuite {
  server: TestServer;
  browser: Browser;
}

export function serverAndBrowser(): BrowserSuite {
  const suite = {} as BrowserSuite;
  beforeAll(async () => {
    suite.server = await startTestServer();
    suite.browser = await launchBrowser();
  });
  afterAll(async () => {
    await suite.browser?.close();
    await suite.server?.stop();
  });
  return suite;
}
