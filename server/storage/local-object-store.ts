// The local stand-in for a hosted object store: s3rver on loopback, data in a folder of ours.
// s3rver is a development dependency (it carries old dependencies); production sets S3_ENDPOINT.
import fs from "node:fs";
import type { AddressInfo } from "node:net";

export interface LocalObjectStore {
  endpoint: string;
  /** The fake's own fixed credentials (not secrets). */
  credentials: { accessKeyId: string; secretAccessKey: string };
  close(): Promise<void>;
}

export async function startLocalObjectStore(directory: string, port = 0): Promise<LocalObjectStore> {
  fs.mkdirSync(directory, { recursive: true });
  const { default: S3rver } = await import("s3rver");
  const server = new S3rver({ address: "127.0.0.1", port, directory, silent: true });
  const address = (await server.run()) as AddressInfo;
  return {
    endpoint: `http://127.0.0.1:${address.port}`,
    credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
    close: () => server.close(),
  };
}
