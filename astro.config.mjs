// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';

// Host names the app may be reached under. Astro's node adapter ignores the Host header
// unless it is listed here, and then refuses same-origin form posts (see DEVELOPERS.md).
const extraHosts = (process.env.PUBLIC_HOSTNAMES ?? '').split(',').map((h) => h.trim()).filter(Boolean);

export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'standalone' }),
  integrations: [react()],
  security: {
    checkOrigin: true,
    allowedDomains: [{ hostname: '127.0.0.1' }, { hostname: 'localhost' }, ...extraHosts.map((hostname) => ({ hostname }))],
  },
  server: { host: '127.0.0.1', port: 4321 },
  vite: {
    plugins: [tailwindcss()],
    server: { strictPort: true, watch: { ignored: ['**/.data/**', '**/screenshots/**'] } },
  },
});
