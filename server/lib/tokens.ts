import crypto from 'node:crypto';

/** A fresh URL-safe random token and the hash we store for it. */
export function newToken() {
  const token = crypto.randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string) {
  return crypto.createHash('sha256').update(token).digest('hex');
}
