import { PAGE_PATTERNS } from './paths';

/** Where sign-in goes when there is no usable `next`. */
export const DEFAULT_AFTER_SIGN_IN = '/account';

/** Pages about signing in itself: going back to one after signing in (a spent confirmation or reset link, the sign-in form) makes no sense. */
const AUTH_PAGES: readonly string[] = [
  PAGE_PATTERNS.signIn,
  PAGE_PATTERNS.signUp,
  PAGE_PATTERNS.verify,
  PAGE_PATTERNS.forgotPassword,
  PAGE_PATTERNS.resetPassword,
];

/** True for the sign-in, sign-up, confirmation and password-reset pages (with or without a trailing slash). */
export function isAuthPath(pathname: string): boolean {
  const p = pathname.length > 1 ? pathname.replace(/\/+$/, '') : pathname;
  return AUTH_PAGES.includes(p.toLowerCase());
}

// Anything a browser could read as another host: `//host`, `/\host` (backslashes are slashes to a URL
// parser), and control characters, which the URL parser strips (so `/\t/host` would become `//host`).
// eslint-disable-next-line no-control-regex -- control characters are exactly what it looks for
const UNSAFE = /[\\\u0000-\u001f\u007f]/;

/**
 * The path sign-in returns to, if `next` is a path on this site and not one of the sign-in pages; the
 * account page otherwise. Judged here,
 * not left to the router, so every place that follows `next` follows only our own pages.
 */
export function safeNext(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || UNSAFE.test(next)) return DEFAULT_AFTER_SIGN_IN;
  const origin = 'https://tunewright.invalid';
  let url: URL;
  try {
    url = new URL(next, origin);
  } catch {
    return DEFAULT_AFTER_SIGN_IN;
  }
  if (url.origin !== origin) return DEFAULT_AFTER_SIGN_IN;
  if (isAuthPath(url.pathname)) return DEFAULT_AFTER_SIGN_IN;
  return `${url.pathname}${url.search}${url.hash}`;
}
