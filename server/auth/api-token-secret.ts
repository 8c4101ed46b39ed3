import "server-only";
import { createHash, randomBytes } from "node:crypto";

// A token is "eco_" and 32 random bytes in base64url (256 bits: never guessed). Only its
// SHA-256 is stored; a plain hash is enough because the secret is random and long (no
// dictionary to try, unlike a password). The first 12 characters are kept in the clear so an
// organiser can tell tokens apart in the list.
export const API_TOKEN_PREFIX_LENGTH = 12;

export function hashApiToken(secret: string): string {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}

export function makeApiToken(): { secret: string; prefix: string; hash: string } {
  const secret = `eco_${randomBytes(32).toString("base64url")}`;
  return { secret, prefix: secret.slice(0, API_TOKEN_PREFIX_LENGTH), hash: hashApiToken(secret) };
}
