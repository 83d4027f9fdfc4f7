import pino from "pino";

export function createLogger(level = process.env.LOG_LEVEL ?? "info") {
  return pino({ level, base: { service: "dropwise" }, redact: ["req.headers.cookie", "req.headers.authorization"] });
}

export type Logger = ReturnType<typeof createLogger>;
