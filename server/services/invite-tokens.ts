import { createHash, randomBytes } from "node:crypto";

export const INVITE_DAYS = 7;

export function newInviteToken() {
  const token = randomBytes(24).toString("base64url");
  return { token, tokenHash: hashInviteToken(token) };
}

export const hashInviteToken = (token: string) => createHash("sha256").update(token).digest("hex");
