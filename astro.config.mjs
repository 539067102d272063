// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import { cspHashOf, ZOD_JITLESS_SCRIPT } from './src/lib/inline-scripts.mjs';

// Host names the app may be reached under. Astro's node adapter ignores the Host header
// unless it is listed here, and then refuses same-origin form posts (see DEVELOPERS.md).
const extraHosts = (process.env.PUBLIC_HOSTNAMES ?? '')
  .split(',')
  .map((h) => h.trim())
  .filter(Boolean);

export default defineConfig({
  output: 'server',
  // A second build folder lets two people test different builds on one machine (see DEVELOPERS.md).
  outDir: process.env.SWARDKEEP_DIST ?? './dist',
  // Middleware mode: scripts/serve.mjs serves the static files itself, so an API request costs no file look-up.
  adapter: node({ mode: 'middleware' }),
  integrations: [react()],
  security: {
    checkOrigin: true,
    allowedDomains: [
      { hostname: '127.0.0.1' },
      { hostname: 'localhost' },
      ...extraHosts.map((hostname) => ({ hostname })),
    ],
  },
  // Content-Security-Policy as a response header on every page: Astro adds script-src and
  // style-src with the SHA-256 hashes of the scripts and styles it emits (island hydration
  // included), so no 'unsafe-inline' is needed. The map page adds a configured basemap's origin.
  experimental: {
    csp: {
      algorithm: 'SHA-256',
      directives: [
        "default-src 'self'",
        "img-src 'self' data: blob:",
        "connect-src 'self'",
        "font-src 'self'",
        "worker-src 'self' blob:",
        "object-src 'none'",
        "base-uri 'self'",
        "form-action 'self'",
        "frame-ancestors 'none'",
      ],
      scriptDirective: { hashes: [/** @type {`sha256-${string}`} */ (cspHashOf(ZOD_JITLESS_SCRIPT))] },
    },
  },
  server: { host: '127.0.0.1', port: 4321 },
  vite: {
    plugins: [tailwindcss()],
    server: { strictPort: true, watch: { ignored: ['**/.data/**', '**/screenshots/**', '**/dist*/**'] } },
    build: {
      rollupOptions: {
        output: {
          // zod in a chunk of its own, so an island that does not validate never fetches it
          // with a shared chunk (script budgets, DEVELOPERS.md).
          manualChunks(id) {
            if (/node_modules\/zod\//.test(id)) return 'zod';
          },
        },
        // zod 4 ships comments rollup cannot place; harmless, and they bury real warnings.
        onwarn(warning, warn) {
          if (warning.message.includes('contains an annotation that Rollup cannot interpret')) return;
          warn(warning);
        },
      },
    },
  },
});
