import { createHash, randomBytes } from 'node:crypto';

/**
 * API tokens are 32 random bytes. A plain SHA-256 of such a secret is enough
 * at rest: slow password hashes exist to stop guessing of low-entropy
 * passwords, and 256 random bits cannot be guessed; a fast hash also lets a
 * bearer request find its token with one indexed lookup.
 */
const PREFIX = 'bwt_';

export function newTokenSecret(): string {
  return PREFIX + randomBytes(32).toString('base64url');
}

export function hashTokenSecret(secret: string): string {
  return createHash('sha256').update(secret, 'utf8').digest('hex');
}

/** The part of a token safe to show in lists: enough to tell tokens apart, useless to an attacker. */
export function tokenPrefix(secret: string): string {
  return secret.slice(0, PREFIX.length + 6);
}

export const TOKEN_SHAPE = /^bwt_[A-Za-z0-9_-]{43}$/;
