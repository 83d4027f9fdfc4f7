import helmet from "helmet";

/**
 * Security headers, with a Content-Security-Policy the web build works under (tested in Chromium):
 * scripts and workers only from our origin, WebAssembly compilation for the phone's SQLite,
 * inline styles (React Native Web writes its styles at run time), images from our origin, data:
 * and blob: (photos kept on the phone). Cross-origin isolation (COOP + COEP) gives expo-sqlite
 * the SharedArrayBuffer it needs.
 */
export function securityHeaders(publicOrigin: string) {
  const https = publicOrigin.startsWith("https:");
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        "default-src": ["'self'"],
        "script-src": ["'self'", "'wasm-unsafe-eval'"],
        "worker-src": ["'self'", "blob:"],
        "style-src": ["'self'", "'unsafe-inline'"],
        "img-src": ["'self'", "data:", "blob:"],
        "font-src": ["'self'", "data:"],
        "connect-src": ["'self'"],
        "object-src": ["'none'"],
        "base-uri": ["'self'"],
        "frame-ancestors": ["'none'"],
        "form-action": ["'self'"],
        ...(https ? { "upgrade-insecure-requests": [] } : {}),
      },
    },
    crossOriginOpenerPolicy: { policy: "same-origin" },
    crossOriginEmbedderPolicy: { policy: "require-corp" },
    crossOriginResourcePolicy: { policy: "same-origin" },
    strictTransportSecurity: https ? { maxAge: 15552000, includeSubDomains: true } : false,
    referrerPolicy: { policy: "same-origin" },
  });
}
