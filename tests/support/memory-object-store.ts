import { Readable } from "node:stream";
import type { ObjectStore } from "../../server/storage/object-store";

/** An object store in memory, for tests that drive createApp() without a running server. */
export function memoryObjectStore(): ObjectStore & { objects: Map<string, { body: Buffer; contentType: string }> } {
  const objects = new Map<string, { body: Buffer; contentType: string }>();
  return {
    objects,
    async ensureBucket() {},
    async put(key, body, contentType) {
      objects.set(key, { body, contentType });
    },
    async *list() {
      yield* objects.keys();
    },
    async get(key) {
      const o = objects.get(key);
      return o ? { body: Readable.from(o.body), contentType: o.contentType, size: o.body.byteLength } : undefined;
    },
  };
}
