// The security headers every answer carries, and the Content-Security-Policy checked against the
// HTML the built app really serves: every inline script in it must be allowed by its own hash
// (computed here from the page), and nothing else inline.
import { beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { api, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';

const storageOrigin = new URL(process.env.S3_ENDPOINT ?? 'http://127.0.0.1:4579').origin;

/** The policy as a map of directive name → its sources. */
function parsePolicy(header: string | null): Map<string, string[]> {
  const policy = new Map<string, string[]>();
  for (const part of (header ?? '').split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) policy.set(name.toLowerCase(), sources);
  }
  return policy;
}

/** The text of every inline <script> (no src attribute) in a page. */
function inlineScripts(html: string): string[] {
  return [...html.matchAll(/<script(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/gi)].map((match) => match[1]);
}

// Source: CSP Level 3 §8.4 — a hash source is the base64 of the digest of the script's text as is.
const sha256Source = (text: string) => `'sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}'`;

let member: Jar;
let admin: Jar;
let couponWithPhotos: number;
beforeAll(async () => {
  member = await signedIn(demo.member);
  admin = await signedIn(demo.admin);
  const { coupons } = (await (await api('/api/coupons?mine=1&limit=100', { jar: member })).json()) as { coupons: { id: number }[] };
  for (const coupon of coupons) {
    const { photos } = (await (await api(`/api/coupons/${coupon.id}/photos`, { jar: member })).json()) as { photos: unknown[] };
    if (photos.length) {
      couponWithPhotos = coupon.id;
      break;
    }
  }
});

const visitorPages = ['/', '/safety', '/tint-ladder', '/heat-planner', '/sign-in', '/sign-up', '/forgot-password', '/no-such-page'];
const memberPages = ['/coupons', '/coupons/new', '/account'];

describe('Content-Security-Policy', () => {
  it('allows scripts, styles, fonts and connections from our own origin, and images and uploads from storage too', async () => {
    const policy = parsePolicy((await api('/')).headers.get('content-security-policy'));
    expect(policy.get('default-src')).toEqual(["'self'"]);
    expect(policy.get('img-src')).toEqual(["'self'", storageOrigin]);
    expect(policy.get('connect-src')).toEqual(["'self'", storageOrigin]);
    expect(policy.get('font-src')).toEqual(["'self'"]);
    expect(policy.get('object-src')).toEqual(["'none'"]);
    expect(policy.get('base-uri')).toEqual(["'self'"]);
    expect(policy.get('form-action')).toEqual(["'self'"]);
    expect(policy.get('frame-ancestors')).toEqual(["'none'"]);
    const scripts = policy.get('script-src')!;
    expect(scripts[0]).toBe("'self'");
    // Nothing but our origin and hashes: no 'unsafe-inline', 'unsafe-eval', nonces or hosts.
    for (const source of scripts.slice(1)) expect(source).toMatch(/^'sha256-[A-Za-z0-9+/]+=*'$/);
  });

  it.each([
    ...visitorPages.map((path) => ({ path, who: 'visitor' })),
    ...memberPages.map((path) => ({ path, who: 'member' })),
    { path: '/admin/users', who: 'admin' },
  ])('allows every inline script of $path (as $who) by its hash, and it has no inline event handlers', async ({ path, who }) => {
    const jar = who === 'member' ? member : who === 'admin' ? admin : undefined;
    const response = await api(path, { jar });
    const html = await response.text();
    const allowed = parsePolicy(response.headers.get('content-security-policy')).get('script-src')!;
    for (const script of inlineScripts(html)) expect(allowed, script.slice(0, 80)).toContain(sha256Source(script));
    expect(html).not.toMatch(/<[^>]+\son[a-z]+\s*=/i);
    expect(html).not.toMatch(/javascript:/i);
  });

  it('a coupon page with photos shows them from storage, which the policy allows', async () => {
    const response = await api(`/coupons/${couponWithPhotos}`, { jar: member });
    const html = await response.text();
    const images = [...html.matchAll(/<img[^>]+src="([^"]+)"/g)].map((match) => new URL(match[1].replace(/&amp;/g, '&'), 'http://x').origin);
    const allowed = parsePolicy(response.headers.get('content-security-policy')).get('img-src')!;
    for (const origin of images.filter((origin) => origin !== 'http://x')) expect(allowed).toContain(origin);
    for (const script of inlineScripts(html))
      expect(parsePolicy(response.headers.get('content-security-policy')).get('script-src')).toContain(sha256Source(script));
    expect(html).not.toMatch(/<[^>]+\son[a-z]+\s*=/i);
  });
});

describe('other security headers', () => {
  it('every answer carries them, API and pages alike', async () => {
    for (const path of ['/', '/api/alloys', '/api/no-such-route', '/no-such-page']) {
      const headers = (await api(path)).headers;
      expect(headers.get('x-content-type-options'), path).toBe('nosniff');
      expect(headers.get('cross-origin-opener-policy'), path).toBe('same-origin');
      expect(headers.get('content-security-policy'), path).toContain("frame-ancestors 'none'");
      const permissions = headers.get('permissions-policy') ?? '';
      for (const feature of ['camera', 'microphone', 'geolocation', 'payment', 'usb']) expect(permissions, path).toContain(`${feature}=()`);
    }
  });

  it('sends Strict-Transport-Security only over https', async () => {
    expect((await api('/')).headers.get('strict-transport-security')).toBeNull();
    // Behind a TLS-terminating proxy Astro takes the scheme from X-Forwarded-Proto.
    const secure = await api('/', { headers: { 'x-forwarded-proto': 'https' } });
    expect(secure.headers.get('strict-transport-security')).toMatch(/^max-age=\d{7,}; includeSubDomains$/);
  });
});

describe('Cache-Control: no-store', () => {
  it.each(['/', '/coupons', '/account', '/api/account', '/api/coupons', '/api/alloys', `/api/account/export`])('on %s when signed in', async (path) => {
    expect((await api(path, { jar: member })).headers.get('cache-control')).toBe('no-store');
  });

  it.each(['/sign-in', '/sign-up', '/forgot-password', '/reset-password?token=abc', '/confirm-email?token=abc', '/api/auth/session', '/api/auth/csrf'])(
    'on the account page %s when signed out',
    async (path) => {
      expect((await api(path)).headers.get('cache-control')).toBe('no-store');
    },
  );

  it('a public answer to a visitor may still be cached', async () => {
    expect((await api('/api/alloys')).headers.get('cache-control')).toBe('public, max-age=300');
  });
});
