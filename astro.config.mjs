// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import auth from 'auth-astro';

const port = Number(process.env.PORT ?? 4321);

export default defineConfig({
  output: 'server',
  outDir: process.env.OXBLOOM_OUT_DIR ?? './dist',
  // scripts/serve.mjs serves the build: static files itself, everything else through the adapter's handler.
  adapter: node({ mode: 'middleware' }),
  integrations: [react(), auth({ configFile: './src/auth.config.ts' })],
  server: { host: '127.0.0.1', port },
  security: {
    // The middleware's own Origin check covers every non-GET request (forms, JSON, no body) and
    // answers in our error shape; Astro's covers form posts only.
    checkOrigin: false,
    allowedDomains: [{ hostname: 'localhost' }, { hostname: '127.0.0.1' }],
  },
  vite: {
    plugins: [tailwindcss()],
    // Page scripts are always files, never inlined into the HTML, so the Content-Security-Policy
    // needs no hash for them (src/lib/server/security-headers.ts). Other assets keep Vite's rule.
    build: { assetsInlineLimit: (file) => (/\.[cm]?js$/.test(file) ? false : undefined) },
  },
});
