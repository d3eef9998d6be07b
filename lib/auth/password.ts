import "server-only";
import { hash, verify } from "@node-rs/argon2";

/**
 * argon2id with OWASP's second recommended configuration (19 MiB, t=2, p=1).
 * `algorithm: 2` is Algorithm.Argon2id: the package exports it as an ambient const enum, which
 * isolatedModules cannot read.
 */
const OPTIONS = { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false; // malformed hash: treat as a mismatch, never as a server error
  }
}

/** A real hash of a random string, verified against when the email is unknown so timing does not tell. */
let dummyHash: Promise<string> | undefined;
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword(`no-such-user-${Math.random()}`);
  return dummyHash;
}
