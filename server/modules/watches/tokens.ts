import crypto from 'node:crypto';

/**
 * Unsubscribe links carry who and what, signed with the server's secret (HMAC-SHA-256), so they work
 * without signing in and cannot be made for someone else. They do not expire: a mail read a year later
 * must still stop the mails. `d` is a document id, or absent for "every watch mail".
 */
export type UnsubscribePayload = { u: string; d?: string };

const PURPOSE = 'tunewright.unsubscribe.v1';

function mac(secret: string, body: string) {
  return crypto.createHmac('sha256', secret).update(`${PURPOSE}.${body}`).digest('base64url');
}

export function signUnsubscribe(secret: string, payload: UnsubscribePayload): string {
  const body = Buffer.from(JSON.stringify(payload)).toString('base64url');
  return `${body}.${mac(secret, body)}`;
}

/** The payload, or null for anything not signed by us (altered, truncated, another purpose). */
export function verifyUnsubscribe(secret: string, token: string): UnsubscribePayload | null {
  const [body, sig, extra] = token.split('.');
  if (!body || !sig || extra !== undefined) return null;
  const want = Buffer.from(mac(secret, body));
  const got = Buffer.from(sig);
  if (want.length !== got.length || !crypto.timingSafeEqual(want, got)) return null;
  try {
    const p = JSON.parse(Buffer.from(body, 'base64url').toString('utf8')) as UnsubscribePayload;
    const uuid = /^[0-9a-f-]{36}$/i;
    if (typeof p.u !== 'string' || !uuid.test(p.u) || (p.d !== undefined && (typeof p.d !== 'string' || !uuid.test(p.d)))) return null;
    return p;
  } catch {
    return null;
  }
}
