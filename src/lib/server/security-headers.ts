import { createHash } from 'node:crypto';
import astroIslandScript from 'astro/runtime/server/astro-island.prebuilt.js';
import loadDirectiveScript from 'astro/runtime/client/load.prebuilt.js';

/**
 * The security headers of every answer. The Content-Security-Policy allows our own origin, plus the
 * photo store for images and for the browser's upload PUT; the only inline scripts are the two
 * Astro writes into pages with islands (the <astro-island> element and the `client:load`
 * directive), allowed by their SHA-256 hashes. Our own page scripts are bundled as files
 * (astro.config.mjs never inlines them) and there are no inline event handlers.
 */

// Source: CSP Level 3 §2.3.1 hash-source: base64 of the digest of the script text, exactly as in the page.
const hashSource = (script: string) => `'sha256-${createHash('sha256').update(script, 'utf8').digest('base64')}'`;

/** A page using another client directive (client:idle, client:visible …) must add its prebuilt script here. */
export const inlineScriptHashes = [astroIslandScript, loadDirectiveScript].map(hashSource);

export function contentSecurityPolicy(storageOrigin: string): string {
  return [
    "default-src 'self'",
    `script-src 'self' ${inlineScriptHashes.join(' ')}`,
    // React and Astro set style attributes (swatch colours, island display), which hashes can't cover.
    "style-src 'self' 'unsafe-inline'",
    `img-src 'self' ${storageOrigin}`,
    `connect-src 'self' ${storageOrigin}`,
    "font-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}

/** Powerful browser features the app never uses, switched off for every page and frame. */
const PERMISSIONS_POLICY = ['accelerometer', 'camera', 'geolocation', 'gyroscope', 'magnetometer', 'microphone', 'midi', 'payment', 'serial', 'usb']
  .map((feature) => `${feature}=()`)
  .join(', ');

/** Two years, the preload list's recommendation (hstspreload.org). */
const HSTS = 'max-age=63072000; includeSubDomains';

/**
 * The headers for one answer. Astro's dev server (`npm start -- --dev`) injects inline scripts and
 * a live-reload socket of its own, so it gets no Content-Security-Policy.
 */
export function securityHeaders(options: { storageOrigin: string; https: boolean; dev?: boolean }): Record<string, string> {
  return {
    ...(options.dev ? {} : { 'content-security-policy': contentSecurityPolicy(options.storageOrigin) }),
    'permissions-policy': PERMISSIONS_POLICY,
    'cross-origin-opener-policy': 'same-origin',
    'x-content-type-options': 'nosniff',
    'referrer-policy': 'same-origin',
    'x-frame-options': 'DENY',
    ...(options.https ? { 'strict-transport-security': HSTS } : {}),
  };
}
