// Metro for the web build: expo-sqlite ships a .wasm engine, and its synchronous API
// needs SharedArrayBuffer, so the dev server sends the same isolation headers as server/.
const { getDefaultConfig } = require("expo/metro-config");

const config = getDefaultConfig(__dirname);
config.resolver.assetExts.push("wasm");

// expo-sqlite reaches its developer-tools client with a require() that only runs in development,
// but the bundler still follows it: in a production export it resolves to nothing (about 15 KB
// of unused code otherwise). NODE_ENV is read per request: `expo export` sets it after this file loads.
const devtoolsOnlyImports = [{ from: /[\\/]expo-sqlite[\\/]build[\\/]SQLiteDevToolsClient\.js$/, module: "expo/devtools" }];
const upstreamResolve = config.resolver.resolveRequest;
config.resolver.resolveRequest = (context, moduleName, platform) => {
  if (process.env.NODE_ENV === "production" && devtoolsOnlyImports.some((d) => d.module === moduleName && d.from.test(context.originModulePath))) {
    return { type: "empty" };
  }
  return upstreamResolve ? upstreamResolve(context, moduleName, platform) : context.resolveRequest(context, moduleName, platform);
};

const isolationHeaders = {
  "Cross-Origin-Opener-Policy": "same-origin",
  "Cross-Origin-Embedder-Policy": "require-corp",
};

config.server.enhanceMiddleware = (middleware) => (req, res, next) => {
  for (const [name, value] of Object.entries(isolationHeaders)) res.setHeader(name, value);
  return middleware(req, res, next);
};

module.exports = config;
