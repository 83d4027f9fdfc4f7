// The local stand-in for a hosted mail service: an SMTP server on loopback that keeps every message
// it receives in Postgres (so any server instance can show it), for the outbox page and the tests.
import { randomUUID } from "node:crypto";
import type { AddressInfo } from "node:net";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";
import type { Db } from "../../db/client";
import { capturedMail } from "../../db/schema";

export interface CapturedMail {
  id: string;
  to: string;
  from: string;
  subject: string;
  text: string;
  links: string[];
}

export interface SmtpSink {
  port: number;
  close(): Promise<void>;
}

const LINK = /https?:\/\/[^\s<>"')\]]+/g;

export function extractLinks(text: string): string[] {
  return [...new Set(text.match(LINK) ?? [])];
}

export async function startSmtpSink(db: Db, { port = 0, onMail }: { port?: number; onMail?: (mail: CapturedMail) => void } = {}): Promise<SmtpSink> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    banner: "Dropwise local mail sink",
    logger: false,
    size: 2 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const to = [parsed.to].flat().flatMap((a) => (a ? a.value.map((v) => v.address ?? "") : [])).join(", ");
          const text = parsed.text ?? "";
          const mail: CapturedMail = {
            id: randomUUID(),
            to,
            from: parsed.from?.value[0]?.address ?? "",
            subject: parsed.subject ?? "",
            text,
            links: extractLinks(text),
          };
          await db.insert(capturedMail).values({ ...mail, html: typeof parsed.html === "string" ? parsed.html : null });
          onMail?.(mail);
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", () => resolve());
  });
  const address = (server as unknown as { server: { address(): AddressInfo } }).server.address();
  return {
    port: address.port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
