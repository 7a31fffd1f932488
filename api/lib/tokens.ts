import { createHash, randomBytes } from 'node:crypto';

/** 256 random bits, URL-safe; only its hash is ever stored. */
export function newSecretToken(): string {
  return randomBytes(32).toString('base64url');
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
