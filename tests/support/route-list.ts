import type { Router } from "express";

interface Layer {
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/** Every "METHOD /path" registered on the given routers (nested routers mounted without a path). */
export function listRoutes(...routers: Router[]): string[] {
  const out = new Set<string>();
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const path of ([] as string[]).concat(layer.route.path))
          for (const [method, on] of Object.entries(layer.route.methods)) if (on && method !== "_all") out.add(`${method.toUpperCase()} ${path}`);
      } else if (layer.handle?.stack) walk(layer.handle.stack);
    }
  };
  for (const r of routers) walk((r as unknown as { stack: Layer[] }).stack);
  return [...out].sort();
}
