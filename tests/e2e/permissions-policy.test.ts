import { describe, expect, it } from 'vitest';
import { browserSuite } from '../setup/browser-suite';

// The Permissions-Policy header as Chromium reads it: every feature it names is one the browser knows
// (no "unrecognized feature" complaint), the denied ones are off for our own pages, and the one the app
// uses (clipboard writing, for the calculators' copy button) stays on.
const suite = browserSuite({ seed: false, catcher: false });

describe('Permissions-Policy in Chromium', () => {
  it('GET /calculators: denied features are off, clipboard writing is on, and Chromium understands every entry', async () => {
    const page = await suite.browser.newPage();
    const messages: string[] = [];
    page.on('console', (m) => messages.push(`${m.type()}: ${m.text()}`));
    const res = await page.goto(`${suite.server.baseUrl}/calculators`);
    expect(res?.status()).toBe(200);
    await page.locator('main li a').first().waitFor();
    const allowed = await page.evaluate(() => {
      const policy = (document as unknown as { featurePolicy?: { allowsFeature: (f: string) => boolean; features: () => string[] } }).featurePolicy;
      if (!policy) return null;
      const names = [
        'camera',
        'microphone',
        'geolocation',
        'payment',
        'usb',
        'serial',
        'hid',
        'midi',
        'display-capture',
        'fullscreen',
        'clipboard-read',
        'clipboard-write',
      ];
      return { byFeature: Object.fromEntries(names.map((f) => [f, policy.allowsFeature(f)])), known: policy.features() };
    });
    expect(allowed, 'document.featurePolicy is available in this Chromium').not.toBeNull();
    for (const f of ['camera', 'microphone', 'geolocation', 'payment', 'usb', 'serial', 'hid', 'midi', 'display-capture', 'fullscreen', 'clipboard-read']) {
      expect(allowed!.byFeature[f], f).toBe(false);
    }
    expect(allowed!.byFeature['clipboard-write']).toBe(true);
    // Chromium names what it knows; each feature the header lists must be one of them.
    const header = String(res?.headers()['permissions-policy']);
    const listed = header.split(',').map((item) => item.trim().split('=')[0]);
    expect(listed.filter((f) => !allowed!.known.includes(f))).toEqual([]);
    expect(messages.filter((m) => /permissions.policy|feature policy/i.test(m))).toEqual([]);
    await page.close();
  });
});
