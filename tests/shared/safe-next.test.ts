import { describe, expect, it } from 'vitest';
import { DEFAULT_AFTER_SIGN_IN, safeNext } from '../../shared/safe-next';

describe('safeNext (where sign-in returns to)', () => {
  it('keeps a path on this site with its query and fragment', () => {
    expect(safeNext('/guides/stock-buggy?tab=history#baseline')).toBe('/guides/stock-buggy?tab=history#baseline');
    expect(safeNext('/')).toBe('/');
  });

  it('refuses anything a browser could read as another host', () => {
    const hostile = [
      '//evil.example/path',
      '/\\evil.example',
      '/\\/evil.example',
      '\\\\evil.example',
      '/\t/evil.example',
      '/\n/evil.example',
      '/\r\n/evil.example',
      '/\u0000/evil.example',
      '/\u007f',
      'https://evil.example/',
      'javascript:alert(1)',
      'evil.example',
      '',
      null,
      undefined,
    ];
    for (const next of hostile) expect(safeNext(next), JSON.stringify(next)).toBe(DEFAULT_AFTER_SIGN_IN);
  });

  it('never returns to a sign-in page: sign-in, sign-up, a spent confirmation or reset link, forgot-password', () => {
    const auth = [
      '/sign-in',
      '/sign-in?next=/guides',
      '/sign-up',
      '/verify?token=spent-token-0123456789abcdef',
      '/reset-password?token=spent-token-0123456789abcdef',
      '/forgot-password',
      '/Sign-In/',
      '/a/../verify?token=x',
    ];
    for (const next of auth) expect(safeNext(next), next).toBe(DEFAULT_AFTER_SIGN_IN);
    // Pages whose names merely start like one are fine.
    expect(safeNext('/sign-ins-explained')).toBe('/sign-ins-explained');
    expect(safeNext('/me/revisions')).toBe('/me/revisions');
  });

  it('never returns something that resolves off the site, whatever the input (URL parser as the judge)', () => {
    const samples = ['/a/../../b', '/%2f%2fevil.example', '/./\u2028', '/a?next=//evil.example', '/%5cevil.example'];
    for (const next of samples) {
      const out = safeNext(next);
      expect(new URL(out, 'https://tunewright.test').origin, next).toBe('https://tunewright.test');
    }
  });
});
