import { hash, verify } from "@node-rs/argon2";

export const hashPassword = (password: string) => hash(password);

export async function verifyPassword(passwordHash: string | null | undefined, password: string): Promise<boolean> {
  if (!passwordHash) return false;
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}
