import { createHash, randomBytes } from 'node:crypto';
import { hash, verify } from '@node-rs/argon2';

/** 256 random bits, URL-safe; only its hash is ever stored. */
export function newOpaqueToken(): string {
  return randomBytes(32).toString('base64url');
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

// A real Argon2 hash of a random string: verifying against it costs what a real check costs,
// so an unknown e-mail cannot be told apart from a wrong password by timing.
const decoyHash = hash(randomBytes(16).toString('hex'));

export async function verifyPassword(
  storedHash: string | null,
  password: string,
): Promise<boolean> {
  if (!storedHash) {
    await verify(await decoyHash, password);
    return false;
  }
  return verify(storedHash, password);
}
