// Metro for the web build: expo-sqlite ships a .wasm engine, and its synchronous API
// needs SharedArrayBuffer, so the dev server sends the same isolation headers as server/.
const { getDefaultConfig } = require("expo/metro-config");

const config = getDefaultConfig(__dirname);
config.resolver.assetExts.push("wasm");

const isolationHeaders = {
  "Cross-Origin-Opener-Policy": "same-origin",
  "Cross-Origin-Embedder-Policy": "require-corp",
};

config.server.enhanceMiddleware = (middleware) => (req, res, next) => {
  for (const [name, value] of Object.entries(isolationHeaders)) res.setHeader(name, value);
  return middleware(req, res, next);
};

module.exports = config;
